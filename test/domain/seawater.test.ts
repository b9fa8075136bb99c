import { describe, expect, it } from 'vitest';
import { freezingPointC } from '../../src/domain/seawater.ts';

describe('freezing point of sea water (UNESCO 1983, Fofonoff and Millard)', () => {
  it('matches the published check value Tf(S=40, p=500 dbar) = -2.588567 °C', () => {
    // UNESCO Technical Papers in Marine Science 44 (1983), check value for the freezing point.
    expect(freezingPointC(40, 500)).toBeCloseTo(-2.588567, 6);
  });

  it('is about -1.9 °C at S = 35 at the surface (UNESCO 1983)', () => {
    expect(freezingPointC(35)).toBeCloseTo(-1.922, 3);
  });

  it('falls with salinity and with pressure (0.753 mK per dbar, UNESCO 1983 coefficient)', () => {
    expect(freezingPointC(30)).toBeGreaterThan(freezingPointC(34));
    expect(freezingPointC(34, 100) - freezingPointC(34, 0)).toBeCloseTo(-0.0753, 10);
    expect(freezingPointC(0)).toBe(0);
  });
});

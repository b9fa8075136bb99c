// Initial view: projection choice and the globe camera. Checked with spherical geometry
// (great-circle angles on the unit sphere) and the globe scale MapLibre 5 uses (its
// getGlobeRadiusPixels: worldSize / (2 pi cos(lat))).
import { describe, expect, it } from 'vitest';
import { angleBetween, globeCamera, MAX_CENTRE_LAT, isPolarCruise, lonLatBounds, sample, sphericalCentre, type LonLat } from '../../../src/features/map/view';

function ring(lat: number, n = 36): LonLat[] {
  return Array.from({ length: n }, (_, i) => [-180 + (360 * i) / n, lat] as const);
}

describe('projection choice', () => {
  it('takes the globe when at least half the cruise is poleward of 60 degrees', () => {
    expect(isPolarCruise([[10, 61], [10, 59]])).toBe(true);
    expect(isPolarCruise([[10, -75], [10, 50], [10, 40]])).toBe(false);
    expect(isPolarCruise([])).toBe(false);
  });
});

describe('spherical geometry', () => {
  it('measures great-circle angles', () => {
    expect(angleBetween([0, 0], [90, 0])).toBeCloseTo(90, 9);
    expect(angleBetween([0, 85], [180, 85])).toBeCloseTo(10, 9);
    expect(angleBetween([179, 0], [-179, 0])).toBeCloseTo(2, 9);
  });

  it('centres a circle of latitude on its pole', () => {
    expect(sphericalCentre(ring(85))[1]).toBeCloseTo(90, 6);
    expect(sphericalCentre(ring(-75))[1]).toBeCloseTo(-90, 6);
    const c = sphericalCentre([[179, 70], [-179, 70]]);
    expect(Math.abs(c[0])).toBeCloseTo(180, 6);
  });
});

describe('globe camera', () => {
  const viewport = { width: 1000, height: 600 };
  it('puts the farthest point at the wanted share of the viewport at 85 N', () => {
    const pts: LonLat[] = [[0, 83], [90, 85], [180, 84], [-90, 86], [30, 87]];
    const cam = globeCamera(pts, viewport, 0.8);
    const r = Math.max(...pts.map((p) => angleBetween(cam.center, p)));
    const radiusPx = (512 * 2 ** cam.zoom) / (2 * Math.PI * Math.cos((cam.center[1] * Math.PI) / 180));
    expect(radiusPx * Math.sin((r * Math.PI) / 180)).toBeCloseTo(240, 6);
  });

  it('frames a cruise round the South Pole at 75 S from the centre MapLibre allows', () => {
    const cam = globeCamera(ring(-75), viewport);
    // The spherical centre is the pole; the map keeps its centre at the Mercator limit.
    expect(cam.center[1]).toBeCloseTo(-MAX_CENTRE_LAT, 9);
    expect(Number.isFinite(cam.zoom)).toBe(true);
  });
});

describe('bounds', () => {
  it('takes the narrow box across the antimeridian', () => {
    expect(lonLatBounds([[170, 60], [-170, 62], [178, 61]])).toEqual([170, 60, 190, 62]);
    expect(lonLatBounds([[10, 60], [20, 62]])).toEqual([10, 60, 20, 62]);
    expect(lonLatBounds([])).toBeNull();
  });

  it('samples evenly with both ends', () => {
    expect(sample([1, 2, 3, 4, 5, 6, 7, 8, 9], 3)).toEqual([1, 5, 9]);
  });
});

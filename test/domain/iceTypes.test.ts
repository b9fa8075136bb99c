import { describe, expect, it } from 'vitest';
import { deformationOf, groupFromList, groupToList, iceTypeName, snowOf, strayLetters } from '../../src/domain/iceTypes.ts';
import { LEGACY_SNOW_KINDS, liftLegacyObservation, snowFromLegacyKind } from '../../src/domain/legacyIceTypes.ts';

describe('ice types and their groups', () => {
  it('names the ice types a, b, c as the egg code names its columns (WMO-No. 259)', () => {
    expect([0, 1, 2].map(iceTypeName)).toEqual(['Ice type a', 'Ice type b', 'Ice type c']);
    expect(iceTypeName(3)).toBe('Ice type 4');
  });

  it('keys entries by letter, leaves empty ones out, and reads them back by index', () => {
    const g = groupFromList([{ ridgedTenths: 2 }, {}, { sailHeightM: 1 }]);
    expect(g).toEqual({ a: { ridgedTenths: 2 }, c: { sailHeightM: 1 } });
    expect(groupFromList([{}, { ridgedTenths: undefined }])).toBeUndefined();
    expect(groupToList(g, 3)).toEqual([{ ridgedTenths: 2 }, undefined, { sailHeightM: 1 }]);
    expect(deformationOf({ deformation: g }, 2)).toEqual({ sailHeightM: 1 });
    expect(snowOf({}, 0)).toBeUndefined();
    expect(strayLetters(g, 2)).toEqual(['c']);
    expect(strayLetters({ a: {}, d: {} } as never, 3)).toEqual(['d']);
  });
});

describe('the lift of format-1 records', () => {
  it('maps an old snow kind only where the meaning is the same (our own kinds of format 1; common practice)', () => {
    expect(LEGACY_SNOW_KINDS.map((k) => [k, snowFromLegacyKind(k)])).toEqual([
      ['none', { cover: 'none' }],
      ['fresh-loose', null],
      ['wind-packed', null],
      ['drifted', { drifts: true }],
      // "Wet" is the class of that name in Fierz et al. 2009.
      ['wet', { wetness: 'wet' }],
      ['icy-crust', { crust: true }],
      ['patchy', { cover: 'partial' }],
    ]);
  });

  it('puts the groups before the surface fields and each ice type in the egg-code order', () => {
    const lifted = liftLegacyObservation({
      id: 'x', categories: [{ partialConcentration: 5, stage: 'grey', thicknessCm: 12, floeSize: 'pancake', ridgedTenths: 1, snowKind: 'wind-packed' }],
      traceStage: 'multi-year', weather: {}, notes: 'n',
    });
    expect(Object.keys(lifted)).toEqual(['id', 'categories', 'traceStage', 'deformation', 'weather', 'notes']);
    expect(Object.keys(lifted.categories[0] as object)).toEqual(['partialConcentration', 'stage', 'floeSize', 'thicknessCm']);
    expect(lifted.notes).toBe('n\n[kept from format 1] ice type a snow: wind-packed');
  });
});

// Checks that a record of log format 1 (or database schema 2) came through the lift to format 2
// with no value lost and nothing invented, field by field. Written from the rules of the change
// (docs/format.md, "Versions and migration"), not from the code that does it, so that a slip in
// src/domain/legacyIceTypes.ts fails here.
import { expect } from 'vitest';
import type { Observation } from '../../src/domain/model';

const LETTERS = ['a', 'b', 'c'];
const DEFORMATION_FIELDS = new Set(['ridgedTenths', 'raftedTenths', 'sailHeightM']);
/** What each old snow kind must become; null: kept word for word in the notes. */
const SNOW_KIND_MEANS: Record<string, Record<string, unknown> | null> = {
  none: { cover: 'none' },
  patchy: { cover: 'partial' },
  wet: { wetness: 'wet' },
  'icy-crust': { crust: true },
  drifted: { drifts: true },
  'fresh-loose': null,
  'wind-packed': null,
};
export const MARKER = '[kept from format 1]';
const EGG_ORDER = ['partialConcentration', 'stage', 'floeSize', 'thicknessCm'];

type Rec = Record<string, unknown>;

/** `old`: one version as format 1 wrote it (codes may be there); `lifted`: the model object after the lift. */
export function expectLiftedWithoutLoss(old: Rec, lifted: Observation, where: string): void {
  const now = lifted as unknown as Rec;
  const kept: string[] = [];
  const wantDeformation: Record<string, Rec> = {};
  const wantSnow: Record<string, Rec> = {};
  const oldCats = old.categories as Rec[];
  expect(lifted.categories, `${where}.categories`).toHaveLength(oldCats.length);
  oldCats.forEach((c, i) => {
    const l = LETTERS[i] as string;
    const cat = lifted.categories[i] as unknown as Rec;
    const wantCat: Rec = {};
    for (const [k, v] of Object.entries(c)) {
      if (k.endsWith('Sigrid3')) continue;
      if (DEFORMATION_FIELDS.has(k)) (wantDeformation[l] ??= {})[k] = v;
      else if (k === 'snowDepthCm') (wantSnow[l] ??= {}).depthCm = v;
      else if (k === 'snowKind') {
        const means = SNOW_KIND_MEANS[v as string];
        expect(means, `${where}: old snow kind ${String(v)} is one of format 1`).not.toBeUndefined();
        if (means) Object.assign((wantSnow[l] ??= {}), means);
        else kept.push(`ice type ${l} snow: ${String(v)}`);
      } else wantCat[k] = v;
    }
    expect(cat, `${where}.categories[${i}]`).toEqual(wantCat);
    // The egg code's order: concentration, stage, form, then thickness.
    expect(Object.keys(cat), `${where}.categories[${i}] key order`).toEqual(EGG_ORDER.filter((k) => k in wantCat));
  });
  expect(now.deformation ?? {}, `${where}.deformation`).toEqual(wantDeformation);
  expect(now.snow ?? {}, `${where}.snow`).toEqual(wantSnow);
  const oldNotes = old.notes as string;
  const wantNotes = kept.length === 0 ? oldNotes : `${oldNotes}${oldNotes === '' ? '' : '\n'}${MARKER} ${kept.join('; ')}`;
  expect(lifted.notes, `${where}.notes`).toBe(wantNotes);
  for (const [k, v] of Object.entries(old)) {
    if (k.endsWith('Sigrid3') || k === 'categories' || k === 'notes' || k === 'history' || k === 'conflicts') continue;
    expect(now[k], `${where}.${k}`).toEqual(v);
  }
  for (const k of Object.keys(now)) {
    if (k === 'deformation' || k === 'snow') continue;
    expect(k in old, `${where}: field ${k} was not in the old record`).toBe(true);
  }
}

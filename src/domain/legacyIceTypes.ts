// Observations recorded before log format 2 (database schema 3) kept deformation and snow inside
// each ice type, with snow as one of seven plain-language kinds. This module lifts such a record
// into the current shape: deformation and snow become groups of their own keyed by the ice
// type's letter, and the old snow kinds map to the new snow fields where they mean the same.
// A kind that has no equal among the new fields is kept word for word at the end of the notes,
// after a marker, so nothing an observer recorded is lost. The format migration (files) and the
// database upgrade (stored rows) both use it, so the same record lifts the same way everywhere.
import { groupFromList, iceTypeLetter } from './iceTypes.ts';
import type { Deformation, PerIceType, SnowCover } from './model.ts';

/** The snow kinds of format 1 (our own plain-language kinds of that version). */
export const LEGACY_SNOW_KINDS = ['none', 'fresh-loose', 'wind-packed', 'drifted', 'wet', 'icy-crust', 'patchy'] as const;
export type LegacySnowKind = (typeof LEGACY_SNOW_KINDS)[number];

/** The per-ice-type fields of format 1 that moved into the deformation and snow groups. */
export interface LegacyIceTypeFields {
  ridgedTenths?: number;
  raftedTenths?: number;
  sailHeightM?: number;
  snowKind?: string;
  snowDepthCm?: number;
}

const LEGACY_KEYS = new Set(['ridgedTenths', 'raftedTenths', 'sailHeightM', 'snowKind', 'snowDepthCm']);

/** Keys of an ice type in the egg code's order (codes beside their terms), then anything else. */
const ICE_TYPE_KEY_ORDER = [
  'partialConcentration', 'partialConcentrationSigrid3', 'stage', 'stageSigrid3', 'floeSize', 'floeSizeSigrid3', 'thicknessCm',
];

/** Where the notes start to keep what could not be mapped; text after it is the old value, verbatim. */
export const LEGACY_NOTE_MARKER = '[kept from format 1]';

/**
 * The new snow fields an old kind means, or null when none means the same. "fresh-loose" and
 * "wind-packed" describe the grains and their bond, which the new fields do not record.
 */
export function snowFromLegacyKind(kind: string): SnowCover | null {
  switch (kind) {
    case 'none': return { cover: 'none' };
    case 'patchy': return { cover: 'partial' };
    case 'wet': return { wetness: 'wet' };
    case 'icy-crust': return { crust: true };
    case 'drifted': return { drifts: true };
    default: return null;
  }
}

export interface LiftedIceTypes<C> {
  categories: C[];
  deformation?: PerIceType<Deformation>;
  snow?: PerIceType<SnowCover>;
  /** Old values with no place in the new fields, as `ice type a snow: wind-packed`. */
  kept: string[];
}

function reorderKeys<C extends object>(c: C): C {
  const src = c as Record<string, unknown>;
  const out: Record<string, unknown> = {};
  for (const k of ICE_TYPE_KEY_ORDER) if (k in src) out[k] = src[k];
  for (const [k, v] of Object.entries(src)) if (!(k in out) && !LEGACY_KEYS.has(k)) out[k] = v;
  return out as C;
}

/** Splits format-1 ice types into ice types, deformation and snow. `C` is the ice type without the old fields. */
export function liftLegacyIceTypes<C extends object>(categories: readonly (C & LegacyIceTypeFields)[]): LiftedIceTypes<C> {
  const kept: string[] = [];
  const deformation: (Deformation | undefined)[] = [];
  const snow: (SnowCover | undefined)[] = [];
  const out = categories.map((c, i) => {
    const d: Deformation = {};
    if (c.ridgedTenths !== undefined) d.ridgedTenths = c.ridgedTenths;
    if (c.raftedTenths !== undefined) d.raftedTenths = c.raftedTenths;
    if (c.sailHeightM !== undefined) d.sailHeightM = c.sailHeightM;
    deformation.push(d);
    let s: SnowCover = {};
    if (c.snowKind !== undefined) {
      const mapped = snowFromLegacyKind(c.snowKind);
      if (mapped) s = { ...mapped };
      else kept.push(`ice type ${iceTypeLetter(i)} snow: ${c.snowKind}`);
    }
    if (c.snowDepthCm !== undefined) s.depthCm = c.snowDepthCm;
    snow.push(s);
    return reorderKeys(c) as C;
  });
  const result: LiftedIceTypes<C> = { categories: out, kept };
  const dg = groupFromList(deformation);
  const sg = groupFromList(snow);
  if (dg) result.deformation = dg;
  if (sg) result.snow = sg;
  return result;
}

/** The notes with the kept values appended after the marker (unchanged when nothing was kept). */
export function notesWithKept(notes: string, kept: readonly string[]): string {
  if (kept.length === 0) return notes;
  const line = `${LEGACY_NOTE_MARKER} ${kept.join('; ')}`;
  return notes === '' ? line : `${notes}\n${line}`;
}

/** Keys before which the groups go, so a lifted record reads in the same order as a new one. */
const AFTER_GROUPS = new Set(['openWater', 'meltPonds', 'icebergs', 'weather', 'notes']);

/**
 * A whole format-1 observation (file version or stored row) in the current shape. Only
 * `categories` and `notes` change; deformation and snow are added before the surface fields.
 */
export function liftLegacyObservation<O extends { categories: readonly object[]; notes: string }>(o: O): O & { deformation?: PerIceType<Deformation>; snow?: PerIceType<SnowCover> } {
  const lifted = liftLegacyIceTypes(o.categories as readonly (object & LegacyIceTypeFields)[]);
  const out: Record<string, unknown> = {};
  let placed = false;
  const place = () => {
    if (placed) return;
    placed = true;
    if (lifted.deformation) out.deformation = lifted.deformation;
    if (lifted.snow) out.snow = lifted.snow;
  };
  for (const [k, v] of Object.entries(o)) {
    if (k === 'deformation' || k === 'snow') continue;
    if (AFTER_GROUPS.has(k)) place();
    if (k === 'categories') out[k] = lifted.categories;
    else if (k === 'notes') out[k] = notesWithKept(o.notes, lifted.kept);
    else out[k] = v;
  }
  place();
  return out as O & { deformation?: PerIceType<Deformation>; snow?: PerIceType<SnowCover> };
}

// The ice types of an observation and the groups that describe them (deformation, snow). The
// groups are keyed by the ice type's letter (a, b, c: thickest first, as the egg code names its
// columns), so whatever reorders or removes ice types must carry the groups along (the form
// keeps each ice type's rows in its draft row for that reason).
import {
  ICE_TYPE_LETTERS,
  type Deformation,
  type IceTypeLetter,
  type Observation,
  type PerIceType,
  type SnowCover,
} from './model.ts';

/** The letter of the ice type at `index` (0 is "a"); past "c" the number, for messages only. */
export function iceTypeLetter(index: number): string {
  return ICE_TYPE_LETTERS[index] ?? String(index + 1);
}

/** "Ice type a": the one name the form, the map and the rule messages use. */
export function iceTypeName(index: number): string {
  return `Ice type ${iceTypeLetter(index)}`;
}

export function deformationOf(o: Pick<Observation, 'deformation'>, index: number): Deformation | undefined {
  const l = ICE_TYPE_LETTERS[index];
  return l === undefined ? undefined : o.deformation?.[l];
}

export function snowOf(o: Pick<Observation, 'snow'>, index: number): SnowCover | undefined {
  const l = ICE_TYPE_LETTERS[index];
  return l === undefined ? undefined : o.snow?.[l];
}

/** True when a group entry holds no value at all (it is then left out of the observation). */
export function isEmptyEntry(entry: object | undefined): boolean {
  return entry === undefined || Object.values(entry).every((v) => v === undefined);
}

/**
 * A group keyed by letter from entries listed by ice-type index; empty entries are left out and
 * an empty group is undefined, so an observation never carries `{}`.
 */
export function groupFromList<T extends object>(entries: readonly (T | undefined)[]): PerIceType<T> | undefined {
  const out: PerIceType<T> = {};
  let any = false;
  entries.forEach((e, i) => {
    const l = ICE_TYPE_LETTERS[i];
    if (l !== undefined && e !== undefined && !isEmptyEntry(e)) {
      out[l] = e;
      any = true;
    }
  });
  return any ? out : undefined;
}

/** The entries of a group listed by ice-type index (length = ice-type count). */
export function groupToList<T>(group: PerIceType<T> | undefined, count: number): (T | undefined)[] {
  return Array.from({ length: count }, (_, i) => {
    const l = ICE_TYPE_LETTERS[i];
    return l === undefined ? undefined : group?.[l];
  });
}

/** Letters of a group that name no ice type of the observation (a rule reports them). */
export function strayLetters(group: PerIceType<unknown> | undefined, count: number): string[] {
  if (!group) return [];
  return Object.keys(group).filter((k) => {
    const i = (ICE_TYPE_LETTERS as readonly string[]).indexOf(k);
    return i < 0 || i >= count;
  });
}

export type { IceTypeLetter };

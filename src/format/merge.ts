// Merge planning, a pure function shared by the app's import and the command line's `merge`.
// Every incoming saved version of an observation is compared with what is stored:
//   new        the observation is not stored: it is added with all its versions;
//   identical  the same revision with the same content is already stored: nothing to do;
//   newer      a higher revision than the stored current one: it becomes current, the stored
//              current one goes to the history;
//   older      a lower revision that is not stored yet, when the file shows it precedes a
//              stored version (the file also holds a later version the store has): kept in the
//              history;
//   conflict   the same revision as a stored version but different content (two laptops edited
//              the same revision), or a version whose place the history does not show: a
//              higher revision from a file that does not hold the stored current version (a
//              deletion at revision 2 here, an edit at revision 3 made apart there), or a lower
//              one from a file that holds none of the stored later versions. Both are kept, the
//              incoming copy is flagged for review; the stored current version stays.
// Because "identical" compares against every stored version (history and conflict copies
// included), importing the same file twice adds nothing.
import type { Cruise, Observation, Observer, TrackPoint } from '../domain/model';
import type { LogBundle, PhotoMeta } from './types';

export type MergeKind = 'new' | 'identical' | 'newer' | 'older' | 'conflict';
export const MERGE_KINDS: readonly MergeKind[] = ['new', 'identical', 'newer', 'older', 'conflict'];

export interface StoredVersions {
  current: Observation;
  /** Earlier revisions and conflicting copies already stored. */
  others: readonly Observation[];
}

/** What is stored for the incoming file's cruise. */
export interface MergeTarget {
  cruise: Cruise | null;
  versions: (id: string) => StoredVersions | undefined;
  hasTrackTime: (time: string) => boolean;
  hasPhoto: (id: string) => boolean;
}

export interface MergeItem {
  id: string;
  time: string;
  /** The most telling kind over all the observation's incoming versions. */
  kind: MergeKind;
  incomingRevision: number;
  storedRevision: number | null;
}

export interface MergeCounts {
  new: number;
  identical: number;
  newer: number;
  older: number;
  conflict: number;
  /** Saved versions that will be written (current, history and conflict copies). */
  versionsWritten: number;
  trackNew: number;
  trackDuplicate: number;
  photosNew: number;
  photosDuplicate: number;
}

export interface MergePlan {
  cruise: { action: 'create' | 'update' | 'unchanged'; value: Cruise };
  /** New current versions: new observations and newer revisions. */
  putCurrent: Observation[];
  /** Versions added to the history: older revisions and the stored ones newer ones replaced. */
  addHistory: Observation[];
  /** Conflicting copies, kept for review. */
  addConflicts: Observation[];
  addTrack: TrackPoint[];
  addPhotos: PhotoMeta[];
  items: MergeItem[];
  counts: MergeCounts;
}

export class MergeRefused extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'MergeRefused';
  }
}

/** Stable text of a value with sorted keys and no undefined fields: equal content, equal text. */
export function canonicalJson(v: unknown): string {
  if (v === null || typeof v !== 'object') return JSON.stringify(v) ?? 'null';
  if (Array.isArray(v)) return `[${v.map(canonicalJson).join(',')}]`;
  const o = v as Record<string, unknown>;
  const keys = Object.keys(o).filter((k) => o[k] !== undefined).sort();
  return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson(o[k])}`).join(',')}}`;
}

const KIND_WEIGHT: Record<MergeKind, number> = { identical: 0, older: 1, new: 2, newer: 3, conflict: 4 };

function mergeObservers(a: Observer[], b: Observer[]): Observer[] {
  const out = [...a];
  const ids = new Set(a.map((o) => o.id));
  for (const o of b) if (!ids.has(o.id)) out.push(o);
  return out;
}

/** The cruise's decision (a reader in pieces knows the cruise before the rest). */
export function planCruise(stored: Cruise | null, incoming: Cruise): MergePlan['cruise'] {
  if (!stored) return { action: 'create', value: incoming };
  if (stored.id !== incoming.id) throw new MergeRefused(`the file is of cruise "${incoming.name}" (${incoming.id}), not of "${stored.name}" (${stored.id})`);
  // The settings saved last win; observers are never dropped.
  const base = incoming.updatedAt > stored.updatedAt ? incoming : stored;
  const value: Cruise = { ...base, observers: mergeObservers(stored.observers, incoming.observers) };
  // The end time is a local watch setting the log format does not carry: a file never clears it.
  if (value.endTime === undefined && stored.endTime !== undefined) value.endTime = stored.endTime;
  return { action: canonicalJson(value) === canonicalJson(stored) ? 'unchanged' : 'update', value };
}

type Role = 0 | 1 | 2; // current, history, conflict copy: the order versions of one revision are taken in

/** A plan with nothing in it yet, for the cruise's decision. */
export function emptyPlan(cruise: MergePlan['cruise']): MergePlan {
  return {
    cruise,
    putCurrent: [],
    addHistory: [],
    addConflicts: [],
    addTrack: [],
    addPhotos: [],
    items: [],
    counts: emptyCounts(),
  };
}

/** Counts of a plan with nothing in it. */
export function emptyCounts(): MergeCounts {
  return { new: 0, identical: 0, newer: 0, older: 0, conflict: 0, versionsWritten: 0, trackNew: 0, trackDuplicate: 0, photosNew: 0, photosDuplicate: 0 };
}

/**
 * Plans incoming observations with their earlier revisions and conflict copies (each
 * observation's versions must all be in the lists given): adds to `plan`. Observations are
 * planned one by one, so a file can be planned a run of observations at a time.
 */
export function planObservations(plan: MergePlan, target: MergeTarget, incoming: Pick<LogBundle, 'observations' | 'history' | 'conflicts'>): void {
  const extra = new Map<string, { v: Observation; role: Role }[]>();
  const addExtra = (v: Observation, role: Role) => {
    const list = extra.get(v.id);
    if (list) list.push({ v, role });
    else extra.set(v.id, [{ v, role }]);
  };
  for (const h of incoming.history) addExtra(h, 1);
  for (const c of incoming.conflicts) addExtra(c, 2);
  const before = plan.putCurrent.length + plan.addHistory.length + plan.addConflicts.length;
  for (const current of incoming.observations) {
    const stored = target.versions(current.id);
    const more = extra.get(current.id);
    if (!stored && !more) {
      // New, with no other version in the file: nothing to compare (the common case of a first
      // import, and the costly one if every version were turned into canonical text).
      plan.putCurrent.push(current);
      plan.items.push({ id: current.id, time: current.time, kind: 'new', incomingRevision: current.revision, storedRevision: null });
      plan.counts.new++;
      continue;
    }
    const versions = [{ v: current, role: 0 as Role }, ...(more ?? [])];
    versions.sort((a, b) => a.v.revision - b.v.revision || a.role - b.role);
    const known: { revision: number; key: string }[] = [];
    if (stored) for (const s of [stored.current, ...stored.others]) known.push({ revision: s.revision, key: canonicalJson(s) });
    let cur: Observation | undefined = stored?.current;
    let kind: MergeKind = 'identical';
    let currentKind: MergeKind = 'identical';
    // What the file itself holds of this observation: its lineage shows descent.
    const incomingKeys = new Set(versions.map((x) => canonicalJson(x.v)));
    const storedList = [...known];
    const fileHoldsLaterStored = (revision: number) => storedList.some((x) => x.revision > revision && incomingKeys.has(x.key));
    for (const { v, role } of versions) {
      const key = canonicalJson(v);
      let k: MergeKind;
      if (known.some((x) => x.key === key)) {
        k = 'identical';
      } else if (!cur) {
        cur = v;
        k = 'new';
      } else if (v.revision > cur.revision && (!stored || incomingKeys.has(canonicalJson(cur)))) {
        plan.addHistory.push(cur);
        cur = v;
        k = stored ? 'newer' : 'new';
      } else if (stored && (v.revision > cur.revision || known.some((x) => x.revision === v.revision) || !fileHoldsLaterStored(v.revision))) {
        plan.addConflicts.push(v);
        k = 'conflict';
      } else if (!stored && known.some((x) => x.revision === v.revision)) {
        plan.addConflicts.push(v);
        k = 'conflict';
      } else {
        plan.addHistory.push(v);
        k = stored ? 'older' : 'new';
      }
      if (k !== 'identical') known.push({ revision: v.revision, key });
      if (KIND_WEIGHT[k] > KIND_WEIGHT[kind]) kind = k;
      if (role === 0) currentKind = k;
    }
    if (cur && cur !== stored?.current) plan.putCurrent.push(cur);
    // A conflict anywhere flags the observation; otherwise its current version decides.
    let itemKind: MergeKind = 'new';
    if (stored) itemKind = kind === 'conflict' ? 'conflict' : currentKind !== 'identical' ? currentKind : kind;
    plan.items.push({ id: current.id, time: current.time, kind: itemKind, incomingRevision: current.revision, storedRevision: stored?.current.revision ?? null });
    plan.counts[itemKind]++;
  }
  plan.counts.versionsWritten += plan.putCurrent.length + plan.addHistory.length + plan.addConflicts.length - before;
}

/** Anything with `has` and `add` for times: a Set, or the last time only for a track in time order. */
export interface TimeSeen {
  has: (time: string) => boolean;
  add: (time: string) => void;
}

/** Plans incoming track points; `seen` holds the times planned before (repeats in the file). */
export function planTrack(plan: MergePlan, target: MergeTarget, points: readonly TrackPoint[], seen: TimeSeen): void {
  const before = plan.addTrack.length;
  for (const p of points) {
    if (target.hasTrackTime(p.time) || seen.has(p.time)) {
      plan.counts.trackDuplicate++;
      continue;
    }
    seen.add(p.time);
    plan.addTrack.push(p);
  }
  plan.counts.trackNew += plan.addTrack.length - before;
}

export function planPhotos(plan: MergePlan, target: MergeTarget, photos: readonly PhotoMeta[]): void {
  for (const p of photos) {
    if (target.hasPhoto(p.id)) plan.counts.photosDuplicate++;
    else {
      plan.addPhotos.push(p);
      plan.counts.photosNew++;
    }
  }
}

export function planMerge(target: MergeTarget, incoming: LogBundle): MergePlan {
  const plan = emptyPlan(planCruise(target.cruise, incoming.cruise));
  planObservations(plan, target, incoming);
  planTrack(plan, target, incoming.track, new Set<string>());
  planPhotos(plan, target, incoming.photos);
  return plan;
}

/** True when applying the plan would change nothing. */
/** True when applying the plan would change nothing (also of an import's summary, which has the same counts). */
export function planIsEmpty(plan: Pick<MergePlan, 'cruise' | 'counts'>): boolean {
  return plan.cruise.action === 'unchanged' && plan.counts.versionsWritten === 0 && plan.counts.trackNew === 0 && plan.counts.photosNew === 0;
}

/** A merge target over a bundle held in memory (the command line's merge, tests). */
export function bundleTarget(bundle: LogBundle | null): MergeTarget {
  if (!bundle) return { cruise: null, versions: () => undefined, hasTrackTime: () => false, hasPhoto: () => false };
  const current = new Map(bundle.observations.map((o) => [o.id, o]));
  const others = new Map<string, Observation[]>();
  for (const v of [...bundle.history, ...bundle.conflicts]) {
    const l = others.get(v.id);
    if (l) l.push(v);
    else others.set(v.id, [v]);
  }
  const times = new Set(bundle.track.map((p) => p.time));
  const photos = new Set(bundle.photos.map((p) => p.id));
  return {
    cruise: bundle.cruise,
    versions: (id) => {
      const c = current.get(id);
      return c ? { current: c, others: others.get(id) ?? [] } : undefined;
    },
    hasTrackTime: (t) => times.has(t),
    hasPhoto: (id) => photos.has(id),
  };
}

/** The bundle after the plan, for merges held in memory. */
export function applyPlanToBundle(bundle: LogBundle | null, plan: MergePlan): LogBundle {
  const replaced = new Set(plan.putCurrent.map((o) => o.id));
  const keep = (bundle?.observations ?? []).filter((o) => !replaced.has(o.id));
  const byTime = (a: { time: string }, b: { time: string }) => (a.time < b.time ? -1 : a.time > b.time ? 1 : 0);
  return {
    cruise: plan.cruise.value,
    observations: [...keep, ...plan.putCurrent].sort(byTime),
    history: [...(bundle?.history ?? []), ...plan.addHistory],
    conflicts: [...(bundle?.conflicts ?? []), ...plan.addConflicts],
    track: [...(bundle?.track ?? []), ...plan.addTrack].sort(byTime),
    photos: [...(bundle?.photos ?? []), ...plan.addPhotos],
  };
}

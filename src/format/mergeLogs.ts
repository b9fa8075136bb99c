// Merging several log files of one cruise into one (the command line's `merge`). The result
// depends only on the files' content, never on the order they are given in: it is commutative,
// associative and idempotent on content (test/format/merge-order.test.ts checks it with
// fast-check). Every disagreement between the files is reported; nothing is dropped.
//
// The rule, per observation:
//   - A file's *lineage* of an observation is its current version plus its earlier revisions
//     (history); its conflicting copies are not part of it.
//   - The merged current version is, among the versions that are in some file's lineage, one of
//     the highest revision; if several differ there, the preferred one (below) and the others
//     become conflicting copies.
//   - An earlier revision stays in the history only when a file shows it descends into the
//     current version: it is in the lineage of a file whose lineage also holds the current
//     version. Otherwise (a deletion at revision 2 against an edit at revision 3 made apart, an
//     edit at the same revision) it is kept as a conflicting copy and reported.
//   - Preferred, wherever two different things compete for one place: the later `savedAt`
//     (`updatedAt` for cruise settings and observers), then the greater canonical JSON text, an
//     arbitrary but fixed order so that every machine and every argument order agree.
// Track points are keyed by time; two different points at one time keep the preferred one and
// report the other. Photos are keyed by id; observers by id; both keep the preferred
// description and report a difference.
import type { Cruise, Observation, Observer, TrackPoint } from '../domain/model';
import { canonicalJson, MergeRefused } from './merge';
import type { LogBundle, PhotoBytes, PhotoMeta } from './types';

export interface MergeSource {
  /** Names the source in reports (a file name). */
  name: string;
  bundle: LogBundle;
  photos?: PhotoBytes;
}

export interface Disagreement {
  /** What disagrees: an observation, a track time, a photo, an observer, the cruise settings. */
  subject: 'observation' | 'track' | 'photo' | 'observer' | 'cruise';
  /** Its id (observation, photo, observer, cruise) or time (track point). */
  key: string;
  message: string;
}

export interface MergedLogs {
  bundle: LogBundle;
  photos: PhotoBytes;
  disagreements: Disagreement[];
}

interface Candidate<T> {
  value: T;
  key: string;
  /** The sources holding it, by index. */
  in: Set<number>;
}

/** A time stamp as a number, so that `...:00Z` and `...:00.500Z` compare as instants. */
const instant = (t: string | undefined) => (t === undefined ? -Infinity : Date.parse(t));

/** The later stamp wins, then the greater canonical text. */
function better<T>(a: Candidate<T>, b: Candidate<T>, stamp: (c: Candidate<T>) => number): Candidate<T> {
  const sa = stamp(a);
  const sb = stamp(b);
  if (sa !== sb) return sa > sb ? a : b;
  return a.key >= b.key ? a : b;
}

function best<T>(list: Iterable<Candidate<T>>, stamp: (c: Candidate<T>) => number): Candidate<T> | undefined {
  let out: Candidate<T> | undefined;
  for (const c of list) out = out ? better(out, c, stamp) : c;
  return out;
}

function collect<T>(into: Map<string, Map<string, Candidate<T>>>, group: string, value: T, source: number): Candidate<T> {
  let byKey = into.get(group);
  if (!byKey) into.set(group, (byKey = new Map()));
  const key = canonicalJson(value);
  let c = byKey.get(key);
  if (!c) byKey.set(key, (c = { value, key, in: new Set() }));
  c.in.add(source);
  return c;
}

const savedAt = (c: Candidate<Observation>) => instant(c.value.savedAt);
const noStamp = () => 0;
const byTimeThenId = (a: Observation, b: Observation) => (a.time < b.time ? -1 : a.time > b.time ? 1 : a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
const byIdRevisionKey = (a: Candidate<Observation>, b: Candidate<Observation>) =>
  a.value.id < b.value.id ? -1 : a.value.id > b.value.id ? 1 : a.value.revision - b.value.revision || (a.key < b.key ? -1 : a.key > b.key ? 1 : 0);

function names(sources: readonly MergeSource[], set: Set<number>): string {
  // Sorted and once each, so that the report reads the same whatever the argument order.
  return [...new Set([...set].map((i) => sources[i]?.name ?? `#${i}`))].sort().join(', ');
}

function mergeObservation(id: string, versions: Map<string, Candidate<Observation>>, lineages: Map<number, Set<string>>, sources: readonly MergeSource[], report: Disagreement[]) {
  const inLineage = [...versions.values()].filter((c) => [...lineages.values()].some((l) => l.has(c.key)));
  const top = Math.max(...inLineage.map((c) => c.value.revision));
  const current = best(inLineage.filter((c) => c.value.revision === top), savedAt) as Candidate<Observation>;
  // The current version's ancestors: the lineages of every file whose lineage holds it.
  const ancestors = new Set<string>();
  for (const l of lineages.values()) if (l.has(current.key)) for (const k of l) ancestors.add(k);
  const history: Candidate<Observation>[] = [];
  const byRevision = new Map<number, Candidate<Observation>[]>();
  for (const c of versions.values()) {
    if (c === current || !ancestors.has(c.key)) continue;
    const list = byRevision.get(c.value.revision);
    if (list) list.push(c);
    else byRevision.set(c.value.revision, [c]);
  }
  for (const list of byRevision.values()) history.push(best(list, savedAt) as Candidate<Observation>);
  const kept = new Set<Candidate<Observation>>([current, ...history]);
  const conflicts = [...versions.values()].filter((c) => !kept.has(c)).sort(byIdRevisionKey);
  for (const c of conflicts) {
    const sameRevision = [...kept].find((k) => k.value.revision === c.value.revision);
    const why = sameRevision
      ? `revision ${c.value.revision} in ${names(sources, c.in)} differs from revision ${c.value.revision} in ${names(sources, sameRevision.in)}`
      : `revision ${c.value.revision}${c.value.deleted ? ' (a deletion)' : ''} in ${names(sources, c.in)} is not shown to precede the current revision ${current.value.revision} of ${names(sources, current.in)}`;
    report.push({ subject: 'observation', key: id, message: `${why}; kept as a conflicting copy for review` });
  }
  return { current: current.value, history: history.map((c) => c.value), conflicts: conflicts.map((c) => c.value) };
}

function mergeCruise(sources: readonly MergeSource[], report: Disagreement[]): Cruise {
  type Settings = Omit<Cruise, 'observers'>;
  const cruises = new Map<string, Map<string, Candidate<Settings>>>();
  const observers = new Map<string, Map<string, Candidate<Observer>>>();
  sources.forEach((s, i) => {
    const { observers: list, ...settings } = s.bundle.cruise;
    collect(cruises, '', settings, i);
    for (const o of list) collect(observers, o.id, o, i);
  });
  const settings = [...(cruises.get('') as Map<string, Candidate<Settings>>).values()];
  const updated = (c: Candidate<Settings>) => instant(c.value.updatedAt);
  const chosen = best(settings, updated) as Candidate<Settings>;
  for (const c of settings) {
    if (c !== chosen) report.push({ subject: 'cruise', key: chosen.value.id, message: `the cruise settings of ${names(sources, c.in)} differ from those of ${names(sources, chosen.in)}, which are kept (updated ${chosen.value.updatedAt})` });
  }
  // An observer's description comes from the preferred cruise settings among the files that
  // list it (a rename is saved with the settings). Observers are never removed from a cruise, so
  // every file normally lists every observer; the result is associative when they do.
  const rank = new Map<number, number>();
  [...settings].sort((a, b) => (better(a, b, updated) === a ? 1 : -1)).forEach((c, r) => {
    for (const i of c.in) rank.set(i, r);
  });
  const merged: Observer[] = [];
  for (const [id, byKey] of [...observers].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))) {
    const list = [...byKey.values()];
    const pick = best(list, (c) => Math.max(...[...c.in].map((i) => rank.get(i) ?? -1))) as Candidate<Observer>;
    for (const c of list) {
      if (c !== pick) report.push({ subject: 'observer', key: id, message: `observer "${id}" is ${JSON.stringify(c.value.name)} (${c.value.initials}) in ${names(sources, c.in)} but ${JSON.stringify(pick.value.name)} (${pick.value.initials}) in ${names(sources, pick.in)}, which is kept` });
    }
    merged.push(pick.value);
  }
  return { ...chosen.value, observers: merged };
}

function compareBytes(a: Uint8Array, b: Uint8Array): number {
  for (let i = 0; i < Math.min(a.length, b.length); i++) if (a[i] !== b[i]) return (a[i] as number) - (b[i] as number);
  return a.length - b.length;
}

/** Merges the sources, which must all be logs of one cruise; throws MergeRefused otherwise. */
export function mergeLogs(sources: readonly MergeSource[]): MergedLogs {
  if (sources.length === 0) throw new MergeRefused('nothing to merge');
  const ids = new Map<string, number[]>();
  sources.forEach((s, i) => ids.set(s.bundle.cruise.id, [...(ids.get(s.bundle.cruise.id) ?? []), i]));
  if (ids.size > 1) {
    const list = [...ids]
      .sort(([a], [b]) => (a < b ? -1 : 1))
      .map(([id, at]) => `${names(sources, new Set(at))} ${at.length === 1 ? 'is' : 'are'} of cruise "${sources[at[0] as number]?.bundle.cruise.name ?? ''}" (${id})`)
      .join('; ');
    throw new MergeRefused(`the files are of different cruises: ${list}`);
  }
  const report: Disagreement[] = [];
  const cruise = mergeCruise(sources, report);

  const versions = new Map<string, Map<string, Candidate<Observation>>>();
  const lineages = new Map<string, Map<number, Set<string>>>();
  const lineageOf = (id: string, source: number) => {
    let bySource = lineages.get(id);
    if (!bySource) lineages.set(id, (bySource = new Map()));
    let set = bySource.get(source);
    if (!set) bySource.set(source, (set = new Set()));
    return set;
  };
  sources.forEach((s, i) => {
    for (const o of [...s.bundle.observations, ...s.bundle.history]) lineageOf(o.id, i).add(collect(versions, o.id, o, i).key);
    for (const o of s.bundle.conflicts) collect(versions, o.id, o, i);
  });
  const observations: Observation[] = [];
  const history: Observation[] = [];
  const conflicts: Observation[] = [];
  for (const id of [...versions.keys()].sort()) {
    const bySource = lineages.get(id);
    if (!bySource) {
      // Only conflicting copies, no file holds it as current: a broken file; keep them as copies.
      report.push({ subject: 'observation', key: id, message: 'only conflicting copies and no current version; kept as conflicting copies' });
      conflicts.push(...[...(versions.get(id) as Map<string, Candidate<Observation>>).values()].sort(byIdRevisionKey).map((c) => c.value));
      continue;
    }
    const m = mergeObservation(id, versions.get(id) as Map<string, Candidate<Observation>>, bySource, sources, report);
    observations.push(m.current);
    history.push(...m.history.sort((a, b) => a.revision - b.revision));
    conflicts.push(...m.conflicts);
  }
  observations.sort(byTimeThenId);

  const points = new Map<string, Map<string, Candidate<TrackPoint>>>();
  sources.forEach((s, i) => {
    for (const p of s.bundle.track) collect(points, p.time, p, i);
  });
  const track: TrackPoint[] = [];
  for (const time of [...points.keys()].sort()) {
    const list = [...(points.get(time) as Map<string, Candidate<TrackPoint>>).values()];
    const pick = best(list, noStamp) as Candidate<TrackPoint>;
    for (const c of list) {
      if (c !== pick) report.push({ subject: 'track', key: time, message: `the track point at ${time} is ${c.value.lat}, ${c.value.lon} (${c.value.source}) in ${names(sources, c.in)} but ${pick.value.lat}, ${pick.value.lon} (${pick.value.source}) in ${names(sources, pick.in)}, which is kept` });
    }
    track.push(pick.value);
  }

  const photoMetas = new Map<string, Map<string, Candidate<PhotoMeta>>>();
  sources.forEach((s, i) => {
    for (const p of s.bundle.photos) collect(photoMetas, p.id, p, i);
  });
  const photos: PhotoMeta[] = [];
  const bytes: PhotoBytes = new Map();
  for (const id of [...photoMetas.keys()].sort()) {
    const list = [...(photoMetas.get(id) as Map<string, Candidate<PhotoMeta>>).values()];
    const pick = best(list, (c) => instant(c.value.addedAt)) as Candidate<PhotoMeta>;
    for (const c of list) if (c !== pick) report.push({ subject: 'photo', key: id, message: `photo "${id}" is described differently in ${names(sources, c.in)} and ${names(sources, pick.in)}; the description of ${names(sources, pick.in)} is kept` });
    photos.push(pick.value);
    // The bytes that match the kept description; should two files hold different bytes, the
    // greater in byte order, so that the argument order does not decide.
    let kept: Uint8Array | undefined;
    for (const i of pick.in) {
      const b = sources[i]?.photos?.get(id);
      if (!b || b.length !== pick.value.byteLength) continue;
      if (kept && compareBytes(kept, b) !== 0) report.push({ subject: 'photo', key: id, message: `photo "${id}" has different bytes in ${names(sources, pick.in)}; one copy is kept` });
      if (!kept || compareBytes(b, kept) > 0) kept = b;
    }
    if (kept) bytes.set(id, kept);
  }
  return { bundle: { cruise, observations, history, conflicts, track, photos }, photos: bytes, disagreements: report };
}

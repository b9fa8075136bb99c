// Schema version 4's upgrade: the one-row-per-point `trackPoints` table becomes `trackChunks`
// (one row per cruise and UTC hour). Runs inside the upgrade transaction, so a crash half-way
// leaves the database at version 3 or lower with every point still in `trackPoints`.
import type { Transaction } from 'dexie';
import type { TrackPoint } from '../domain/model';
import { compareTimed, encodeChunk, hourOf, mergeIntoChunk, toTimed, type TimedPoint, type TrackChunkRow } from './trackChunk';

/** Rows read per request: bounds the memory of the upgrade, whatever the track's length. */
const PAGE = 20_000;

export async function convertTrackPointsToChunks(tx: Transaction): Promise<void> {
  const from = tx.table<TrackPoint, [string, string]>('trackPoints');
  const to = tx.table<TrackChunkRow, [string, string]>('trackChunks');
  const written = new Set<string>();
  let group: TimedPoint[] = [];
  let groupCruise = '';
  let groupHour = '';

  const flush = async () => {
    if (group.length === 0) return;
    const key = `${groupCruise}\u0000${groupHour}`;
    group.sort(compareTimed);
    // Keys sort by cruise then time text, so an hour's rows are contiguous and each chunk is
    // written once; should an hour come round again, it is merged with what was written.
    const row = written.has(key)
      ? mergeIntoChunk(groupCruise, groupHour, await to.get([groupCruise, groupHour]), group)
      : encodeChunk(groupCruise, groupHour, group);
    await to.put(row);
    written.add(key);
    group = [];
  };

  let last: [string, string] | undefined;
  for (;;) {
    const page = await (last === undefined ? from.orderBy(':id') : from.where(':id').above(last)).limit(PAGE).toArray();
    if (page.length === 0) break;
    for (const p of page) {
      const x = toTimed(p);
      const hour = hourOf(x.ms);
      if (p.cruiseId !== groupCruise || hour !== groupHour) {
        await flush();
        groupCruise = p.cruiseId;
        groupHour = hour;
      }
      group.push(x);
    }
    const tail = page[page.length - 1] as TrackPoint;
    last = [tail.cruiseId, tail.time];
  }
  await flush();
}

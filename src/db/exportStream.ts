// A cruise's log file read out of the store piece by piece (observations in batches, the track
// a few hour chunks at a time), so exporting a season needs memory for one piece, not for the
// log. Each piece is read in its own short read transaction: an observation and its history and
// conflict copies always come from the same snapshot; a save made while the export runs lands in
// it whole or not at all.
import { Dexie } from 'dexie';
import type { Observation } from '../domain/model';
import { encodeTrackPoint, groupById, type EncodeOptions } from '../format/encode';
import { LogTextStream } from '../format/logStream';
import type { TrackRow } from '../format/types';
import { getDb } from './connection';
import { RecordNotFoundError } from './errors';
import { photoMetaOf } from './exportBundle';
import { decodeChunk, HOUR_MS } from './trackChunk';

export interface ExportStreamOptions extends EncodeOptions {
  /** Observations per read (default 2,000). */
  observationBatch?: number;
  /** Hour chunks per read (default 24). */
  chunkBatch?: number;
}

/** The log file's text in pieces, in order; join them (or hand them to a Blob or a file). */
export async function* exportLogPieces(cruiseId: string, opts: ExportStreamOptions = {}): AsyncGenerator<string> {
  const db = getDb();
  const obsBatch = Math.max(1, opts.observationBatch ?? 2_000);
  const chunkBatch = Math.max(1, opts.chunkBatch ?? 24);
  const { cruise, photos } = await db.transaction('r', [db.cruises, db.photos], async () => {
    const c = await db.cruises.get(cruiseId);
    if (!c) throw new RecordNotFoundError('cruise', cruiseId);
    return { cruise: c, photos: (await db.photos.where('cruiseId').equals(cruiseId).toArray()).map(photoMetaOf) };
  });
  const out = new LogTextStream(cruise, photos, opts);
  yield out.head();

  // Observations in file order, time then id: the [cruiseId+time] index lists equal times by
  // primary key, so the next batch starts after the last (time, id) read.
  let after: { time: string; id: string } | null = null;
  for (;;) {
    const from: { time: string; id: string } | null = after;
    const piece = await db.transaction('r', [db.observations, db.revisions, db.conflicts], async () => {
      const range = db.observations.where('[cruiseId+time]').between([cruiseId, from?.time ?? Dexie.minKey], [cruiseId, Dexie.maxKey], true, true);
      const batch = from === null ? await range.limit(obsBatch).toArray() : await range.filter((o) => o.time > from.time || o.id > from.id).limit(obsBatch).toArray();
      if (batch.length === 0) return null;
      const ids = batch.map((o) => o.id);
      const revisions = await db.revisions.where('observationId').anyOf(ids).toArray();
      const conflicts = (await db.conflicts.where('observationId').anyOf(ids).toArray()).filter((c) => c.cruiseId === cruiseId);
      return { batch, history: groupById(revisions.map((r) => r.observation)), conflicts: groupById(conflicts.map((c) => c.observation)) };
    });
    if (!piece) break;
    yield out.observations(piece.batch, piece.history, piece.conflicts);
    const last = piece.batch[piece.batch.length - 1] as Observation;
    after = { time: last.time, id: last.id };
    if (piece.batch.length < obsBatch) break;
  }

  yield out.startTrack();
  let nextHour: string | null = null;
  for (;;) {
    const lo: unknown = nextHour ?? Dexie.minKey;
    const chunks = await db.trackChunks.where('[cruiseId+hour]').between([cruiseId, lo], [cruiseId, Dexie.maxKey], true, true).limit(chunkBatch).toArray();
    if (chunks.length === 0) break;
    const rows: TrackRow[] = [];
    for (const c of chunks) for (const p of decodeChunk(c)) rows.push(encodeTrackPoint(p));
    yield out.trackRows(rows);
    const last = chunks[chunks.length - 1];
    if (!last || chunks.length < chunkBatch) break;
    nextHour = new Date(Date.parse(last.hour) + HOUR_MS).toISOString().slice(0, 13) + ':00:00Z';
  }
  yield out.end();
}

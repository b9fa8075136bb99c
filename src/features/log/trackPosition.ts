// The position from the imported (or recorded) track at the observation time.
import { useLiveQuery } from 'dexie-react-hooks';
import { listTrackPoints, trackPointAtOrBefore } from '../../db';
import type { IsoUtc, Position, TrackPoint } from '../../domain/model';

/** Track points further than this from the observation time give no position. */
const MAX_GAP_MS = 2 * 60_000;

export function positionFromTrack(before: TrackPoint | undefined, after: TrackPoint | undefined, time: IsoUtc): Position | null {
  const t = Date.parse(time);
  const near = [before, after]
    .filter((p): p is TrackPoint => p !== undefined && Math.abs(Date.parse(p.time) - t) <= MAX_GAP_MS)
    .sort((a, b) => Math.abs(Date.parse(a.time) - t) - Math.abs(Date.parse(b.time) - t))[0];
  return near ? { lat: near.lat, lon: near.lon, source: 'track-interpolated', fixTime: near.time } : null;
}

export function useTrackPosition(cruiseId: string | null, time: IsoUtc): Position | null {
  return useLiveQuery(
    async () => {
      if (!cruiseId) return null;
      const before = await trackPointAtOrBefore(cruiseId, time);
      const after = (await listTrackPoints(cruiseId, { from: time, limit: 1 }))[0];
      return positionFromTrack(before, after, time);
    },
    [cruiseId, time],
    null,
  );
}

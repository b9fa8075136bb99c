// The position from the imported (or recorded) track at the observation time: the fixes either
// side of it from the store, interpolated along the geodesic by src/gps (domain geodesy).
import { useLiveQuery } from 'dexie-react-hooks';
import { listTrackPoints, trackPointAtOrBefore } from '../../db';
import type { IsoUtc, TrackPoint } from '../../domain/model';
import { positionFromTrack, type TrackPositionResult } from '../../gps/trackPosition';

export function useTrackPosition(cruiseId: string | null, time: IsoUtc): TrackPositionResult | null {
  return useLiveQuery(
    async () => {
      if (!cruiseId) return null;
      const before = await trackPointAtOrBefore(cruiseId, time);
      const after = (await listTrackPoints(cruiseId, { from: time, limit: 1 }))[0];
      const bracket = [before, after].filter((p): p is TrackPoint => p !== undefined);
      if (bracket.length === 0) return { ok: false as const, reason: 'no track for this cruise yet' };
      // One point on each side (or the exact one): positionFromTrack refuses outside them.
      const unique = bracket.length === 2 && bracket[0]?.time === bracket[1]?.time ? [bracket[0] as TrackPoint] : bracket;
      return positionFromTrack(unique, time);
    },
    [cruiseId, time],
    null,
  );
}

// Where the map's data comes from: the active cruise in the local store, its observations (a
// live query: the map follows every save) and its track. The track can hold a million points
// and the GPS adds one every few seconds, so it is re-read at most every TRACK_REFRESH_MS
// rather than on every new point.
import { useEffect, useRef, useState } from 'react';
import { useLiveQuery } from 'dexie-react-hooks';
import { countTrackPoints, getActiveCruise, listObservations, listTrackPoints } from '../../db';
import type { Cruise, Observation, TrackPoint } from '../../domain/model';

export const TRACK_REFRESH_MS = 30_000;

export interface MapDataState {
  /** `loading` until the store has answered; `none` when no cruise is active. */
  status: 'loading' | 'none' | 'ready';
  cruise: Cruise | null;
  observations: Observation[];
  track: TrackPoint[];
}

const NO_OBSERVATIONS: Observation[] = [];
const NO_TRACK: TrackPoint[] = [];

export function useMapData(): MapDataState {
  const cruise = useLiveQuery(async () => (await getActiveCruise()) ?? null, []);
  const cruiseId = cruise?.id ?? null;
  const observations = useLiveQuery(() => (cruiseId ? listObservations(cruiseId) : NO_OBSERVATIONS), [cruiseId]);
  const trackCount = useLiveQuery(() => (cruiseId ? countTrackPoints(cruiseId) : 0), [cruiseId]);
  const [track, setTrack] = useState<{ cruiseId: string | null; points: TrackPoint[] }>({ cruiseId: null, points: NO_TRACK });
  const lastRead = useRef(0);

  useEffect(() => {
    if (!cruiseId || trackCount === undefined) return;
    let cancelled = false;
    const read = () => {
      lastRead.current = Date.now();
      void listTrackPoints(cruiseId).then((points) => {
        if (!cancelled) setTrack({ cruiseId, points });
      });
    };
    const fresh = track.cruiseId !== cruiseId;
    const wait = fresh ? 0 : Math.max(0, lastRead.current + TRACK_REFRESH_MS - Date.now());
    const timer = setTimeout(read, wait);
    return () => {
      cancelled = true;
      clearTimeout(timer);
    };
    // Re-read when the count changes or the cruise does; `track` itself must not retrigger.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [cruiseId, trackCount]);

  if (cruise === undefined) return { status: 'loading', cruise: null, observations: NO_OBSERVATIONS, track: NO_TRACK };
  if (cruise === null) return { status: 'none', cruise: null, observations: NO_OBSERVATIONS, track: NO_TRACK };
  return {
    status: 'ready',
    cruise,
    observations: observations ?? NO_OBSERVATIONS,
    track: track.cruiseId === cruise.id ? track.points : NO_TRACK,
  };
}

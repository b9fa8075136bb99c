// The review's view of the store: live queries over the db's list functions, so the review
// follows every save (including its own "reviewed" marks) without a reload.
import { useLiveQuery } from 'dexie-react-hooks';
import { getActiveCruise, listObservations, listTrackPoints } from '../../db';
import type { Cruise, Observation, TrackPoint } from '../../domain/model';

/** The active cruise; undefined while loading, null when there is none. */
export function useReviewCruise(): Cruise | null | undefined {
  return useLiveQuery(async () => (await getActiveCruise()) ?? null, [], undefined);
}

export function useReviewObservations(cruiseId: string): Observation[] | undefined {
  return useLiveQuery(() => listObservations(cruiseId), [cruiseId], undefined);
}

export function useReviewTrack(cruiseId: string): TrackPoint[] | undefined {
  return useLiveQuery(() => listTrackPoints(cruiseId), [cruiseId], undefined);
}

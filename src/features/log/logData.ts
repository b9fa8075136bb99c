// The log screen's view of the store: live queries (they re-run when the tables change) and
// the writes the screen makes. Components use these, never Dexie.
import { useLiveQuery } from 'dexie-react-hooks';
import {
  getActiveCruise, getSetting, listCruises, listObservations, listTrackPoints, observationHistory,
} from '../../db';
import type { Cruise, Observation, TrackPoint } from '../../domain/model';

/** The active cruise; `undefined` while loading, `null` when there is none. */
export function useActiveCruise(): Cruise | null | undefined {
  return useLiveQuery(async () => (await getActiveCruise()) ?? null, [], undefined);
}

export function useCruises(): Cruise[] | undefined {
  return useLiveQuery(() => listCruises(), [], undefined);
}

/** Observations of the cruise in time order (oldest first), without deleted ones. */
export function useObservations(cruiseId: string | null): Observation[] | undefined {
  return useLiveQuery(() => (cruiseId ? listObservations(cruiseId) : Promise.resolve([])), [cruiseId], undefined);
}

export function useHistory(id: string | null): Observation[] | undefined {
  return useLiveQuery(() => (id ? observationHistory(id) : Promise.resolve([])), [id], undefined);
}

export function useTrack(cruiseId: string | null): TrackPoint[] | undefined {
  return useLiveQuery(() => (cruiseId ? listTrackPoints(cruiseId) : Promise.resolve([])), [cruiseId], undefined);
}

export function useSettingValue<K extends 'currentObserverId' | 'reminderLeadMinutes'>(key: K) {
  return useLiveQuery(() => getSetting(key), [key], undefined);
}

/** The form name of the observation draft in the drafts table. */
export const OBSERVATION_DRAFT_FORM = 'observation';

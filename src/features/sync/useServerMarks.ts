// For the observation list: the highest revision of each observation the ship server holds,
// or null when sync is off.
import { useLiveQuery } from 'dexie-react-hooks';
import { revisionsOnServer } from '../../db';
import { useSyncKey } from './runtime';

export function useServerMarks(cruiseId: string | null | undefined): ReadonlyMap<string, number> | null {
  const key = useSyncKey();
  return useLiveQuery(async () => (key && cruiseId ? revisionsOnServer(key, cruiseId) : null), [key, cruiseId]) ?? null;
}

// The observations of one cruise as a Dexie collection, through the [cruiseId+time] index (in
// time order). Since schema version 7 there is no index on cruiseId alone: the compound index
// answers every query by cruise, and each saved observation writes one index entry fewer.
import Dexie from 'dexie';
import type { FloeDatabase } from './database';

export function cruiseObservations(db: FloeDatabase, cruiseId: string) {
  return db.observations.where('[cruiseId+time]').between([cruiseId, Dexie.minKey], [cruiseId, Dexie.maxKey], true, true);
}

// Drafts of forms in progress, one per cruise and form, written as the observer types.
import { getDb, writableDb } from './connection';
import { mapWriteError } from './errors';
import type { DraftRecord } from './rows';
import { nowIso } from './validate';

export async function saveDraft<T>(cruiseId: string, form: string, data: T): Promise<DraftRecord<T>> {
  const db = await writableDb();
  const row: DraftRecord<T> = { cruiseId, form, data, savedAt: nowIso() };
  try {
    await db.drafts.put(row);
  } catch (err) {
    throw mapWriteError(err, 'the draft');
  }
  return row;
}

/** The caller names the type it saved; the store keeps whatever structured data it was given. */
export async function loadDraft<T>(cruiseId: string, form: string): Promise<DraftRecord<T> | undefined> {
  return (await getDb().drafts.get([cruiseId, form])) as DraftRecord<T> | undefined;
}

export async function clearDraft(cruiseId: string, form: string): Promise<void> {
  const db = await writableDb();
  try {
    await db.drafts.delete([cruiseId, form]);
  } catch (err) {
    throw mapWriteError(err, 'removing the draft');
  }
}

/** Every draft of a cruise, newest first (e.g. to offer "continue where you left off"). */
export async function listDrafts(cruiseId: string): Promise<DraftRecord[]> {
  const rows = await getDb().drafts.where('cruiseId').equals(cruiseId).toArray();
  return rows.sort((a, b) => (a.savedAt < b.savedAt ? 1 : a.savedAt > b.savedAt ? -1 : 0));
}

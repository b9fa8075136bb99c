// Typed settings (user preferences) and meta facts (device id, persistence request).
import { getDb, writableDb } from './connection';
import { mapWriteError } from './errors';
import type { MetaKey, MetaRow, MetaValues, SettingKey, SettingValues } from './rows';

type KeyedTable = 'settings' | 'meta';

async function readKey(table: KeyedTable, key: string): Promise<unknown> {
  const row = (await getDb().table(table).get(key)) as { value: unknown } | undefined;
  return row?.value;
}

async function writeKey(table: KeyedTable, key: string, value: unknown, what: string): Promise<void> {
  const db = await writableDb();
  try {
    await db.table(table).put({ key, value });
  } catch (err) {
    throw mapWriteError(err, what);
  }
}

export async function getSetting<K extends SettingKey>(key: K): Promise<SettingValues[K] | undefined> {
  return (await readKey('settings', key)) as SettingValues[K] | undefined;
}

export function setSetting<K extends SettingKey>(key: K, value: SettingValues[K]): Promise<void> {
  return writeKey('settings', key, value, `the setting "${key}"`);
}

export async function getMeta<K extends MetaKey>(key: K): Promise<MetaValues[K] | undefined> {
  return (await readKey('meta', key)) as MetaValues[K] | undefined;
}

export function setMeta<K extends MetaKey>(key: K, value: MetaValues[K]): Promise<void> {
  return writeKey('meta', key, value, `the store's "${key}" record`);
}

const deviceIds = new WeakMap<object, Promise<string>>();

/**
 * The random id of this browser profile, created the first time it is asked for and kept in
 * the database. Two tabs asking at once get the same id: the read and the write share one
 * transaction, and IndexedDB runs read-write transactions on a table one at a time.
 */
export async function deviceId(): Promise<string> {
  const db = await writableDb();
  let pending = deviceIds.get(db);
  if (!pending) {
    pending = db.transaction('rw', db.meta, async () => {
      const row = (await db.meta.get('deviceId')) as MetaRow<'deviceId'> | undefined;
      if (row) return row.value;
      const id = crypto.randomUUID();
      await db.meta.put({ key: 'deviceId', value: id });
      return id;
    });
    pending.catch(() => deviceIds.delete(db));
    deviceIds.set(db, pending);
  }
  try {
    return await pending;
  } catch (err) {
    throw mapWriteError(err, 'the device id');
  }
}

// Automatic backup: the active cruise written as a log file into a folder the observer chose,
// through the File System Access API (Chromium). The browser keeps the folder handle in the
// store; after a reload it may ask again for permission, which needs a click.
import { exportLogPieces, getCruise, getSetting, RecordNotFoundError, setSetting } from '../../db';
import { slug } from './download';

/** The parts of the API that TypeScript's DOM library does not describe (Chromium only). */
interface PermissionHandle {
  queryPermission?: (d: { mode: 'readwrite' }) => Promise<PermissionState>;
  requestPermission?: (d: { mode: 'readwrite' }) => Promise<PermissionState>;
}
type DirectoryPicker = (opts?: { id?: string; mode?: 'readwrite' }) => Promise<FileSystemDirectoryHandle>;

export const BACKUP_INTERVAL_MS = 5 * 60_000;
/** Wait after a change before writing, so a burst of saves gives one backup. */
export const BACKUP_DEBOUNCE_MS = 2_000;

export function backupSupported(): boolean {
  return typeof (window as unknown as { showDirectoryPicker?: DirectoryPicker }).showDirectoryPicker === 'function';
}

export async function chooseBackupFolder(): Promise<FileSystemDirectoryHandle> {
  const pick = (window as unknown as { showDirectoryPicker: DirectoryPicker }).showDirectoryPicker;
  const dir = await pick({ id: 'floe-ledger-backup', mode: 'readwrite' });
  await setSetting('backupFolder', dir);
  return dir;
}

export async function forgetBackupFolder(): Promise<void> {
  await setSetting('backupFolder', null);
}

export async function storedBackupFolder(): Promise<FileSystemDirectoryHandle | null> {
  return (await getSetting('backupFolder')) ?? null;
}

/** 'granted', or 'prompt' when a click must grant access again, or 'denied'. */
export async function folderPermission(dir: FileSystemDirectoryHandle, ask: boolean): Promise<PermissionState> {
  const h = dir as unknown as PermissionHandle;
  if (!h.queryPermission) return 'granted';
  const now = await h.queryPermission({ mode: 'readwrite' });
  if (now === 'granted' || !ask || !h.requestPermission) return now;
  return h.requestPermission({ mode: 'readwrite' });
}

export function backupFileName(cruiseName: string): string {
  return `${slug(cruiseName)}.floe-backup.json`;
}

/** Writes the backup file (replaced as a whole: the browser swaps it in when the write closes). */
export async function writeBackup(dir: FileSystemDirectoryHandle, cruiseId: string): Promise<{ at: string; fileName: string }> {
  const cruise = await getCruise(cruiseId);
  if (!cruise) throw new RecordNotFoundError('cruise', cruiseId);
  const fileName = backupFileName(cruise.name);
  const file = await dir.getFileHandle(fileName, { create: true });
  const writable = await file.createWritable();
  try {
    // Piece by piece from the store: the backup of a season never sits whole in memory.
    for await (const piece of exportLogPieces(cruiseId)) await writable.write(piece);
    await writable.close();
  } catch (err) {
    await writable.abort().catch(() => undefined);
    throw err;
  }
  const at = new Date().toISOString();
  await setSetting('lastBackupAt', at);
  return { at, fileName };
}

// Automatic backup of the active cruise into a folder the observer chose: after every change
// (a few seconds later) and every few minutes, with the last backup time on screen. Where the
// browser has no folder access, a reminder to export.
import { useLiveQuery } from 'dexie-react-hooks';
import { useCallback, useEffect, useRef, useState } from 'react';
import { cruiseChangeStamp, getSetting } from '../../db';
import {
  BACKUP_DEBOUNCE_MS,
  BACKUP_INTERVAL_MS,
  backupFileName,
  backupSupported,
  chooseBackupFolder,
  folderPermission,
  forgetBackupFolder,
  storedBackupFolder,
  writeBackup,
} from './backup';

function ago(iso: string | null | undefined, now: number): string {
  if (!iso) return 'never';
  const min = Math.round((now - Date.parse(iso)) / 60_000);
  return `${iso.replace('T', ' ').slice(0, 19)} UTC (${min < 1 ? 'just now' : min < 120 ? `${min} min ago` : `${Math.round(min / 60)} h ago`})`;
}

export function BackupPanel({ cruiseId, cruiseName }: { cruiseId: string | null; cruiseName: string | null }) {
  const supported = backupSupported();
  const [folder, setFolder] = useState<FileSystemDirectoryHandle | null>(null);
  const [permission, setPermission] = useState<PermissionState | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [now, setNow] = useState(() => Date.now());
  const lastBackupAt = useLiveQuery(() => getSetting('lastBackupAt'), []);
  const lastExportAt = useLiveQuery(() => getSetting('lastExportAt'), []);
  const stamp = useLiveQuery(() => (cruiseId ? cruiseChangeStamp(cruiseId) : Promise.resolve(null)), [cruiseId]);
  const written = useRef<string | null>(null);
  const writing = useRef(false);

  useEffect(() => {
    if (!supported) return;
    void storedBackupFolder().then(async (dir) => {
      setFolder(dir);
      if (dir) setPermission(await folderPermission(dir, false));
    });
  }, [supported]);

  useEffect(() => {
    const t = setInterval(() => setNow(Date.now()), 30_000);
    return () => clearInterval(t);
  }, []);

  const backupNow = useCallback(
    async (force: boolean) => {
      if (!folder || !cruiseId || permission !== 'granted' || writing.current) return;
      if (!force && stamp !== undefined && stamp === written.current) return;
      writing.current = true;
      try {
        await writeBackup(folder, cruiseId);
        written.current = stamp ?? null;
        setError(null);
      } catch (err) {
        setError(`The backup could not be written: ${err instanceof Error ? err.message : String(err)}. Export the log by hand until this is fixed.`);
      } finally {
        writing.current = false;
        setNow(Date.now());
      }
    },
    [folder, cruiseId, permission, stamp],
  );

  // After each change, a little later; and every few minutes if anything changed since.
  useEffect(() => {
    if (stamp === undefined || stamp === null) return;
    const t = setTimeout(() => void backupNow(false), BACKUP_DEBOUNCE_MS);
    return () => clearTimeout(t);
  }, [stamp, backupNow]);
  useEffect(() => {
    const t = setInterval(() => void backupNow(false), BACKUP_INTERVAL_MS);
    return () => clearInterval(t);
  }, [backupNow]);

  async function choose() {
    setError(null);
    try {
      const dir = await chooseBackupFolder();
      setFolder(dir);
      setPermission(await folderPermission(dir, true));
      written.current = null;
    } catch (err) {
      if (err instanceof DOMException && err.name === 'AbortError') return;
      setError(err instanceof Error ? err.message : String(err));
    }
  }

  async function resume() {
    if (!folder) return;
    setPermission(await folderPermission(folder, true));
  }

  if (!supported) {
    const stale = !lastExportAt || now - Date.parse(lastExportAt) > 4 * 3_600_000;
    return (
      <section className="exchange-panel" aria-labelledby="backup-title">
        <h3 id="backup-title">Backup</h3>
        <p className={stale ? 'reminder' : ''} role={stale ? 'alert' : undefined} data-testid="backup-reminder">
          This browser cannot write backups to a folder by itself. Export the full log regularly (at least every watch) and keep the file off this laptop. Last export:{' '}
          {ago(lastExportAt, now)}.
        </p>
      </section>
    );
  }

  return (
    <section className="exchange-panel" aria-labelledby="backup-title">
      <h3 id="backup-title">Automatic backup</h3>
      {folder ? (
        <p>
          Backing up {cruiseName ? <strong>{cruiseName}</strong> : 'the active cruise'} to the folder <strong>{folder.name}</strong>
          {cruiseName ? (
            <>
              {' '}
              as <code>{backupFileName(cruiseName)}</code>
            </>
          ) : null}
          , after every change and every {BACKUP_INTERVAL_MS / 60_000} minutes.
        </p>
      ) : (
        <p>Choose a folder (best on a USB stick or a network share) and the active cruise is written there as a log file after every change.</p>
      )}
      <p data-testid="last-backup">Last backup: {ago(lastBackupAt, now)}</p>
      {folder && permission !== 'granted' && (
        <p role="alert" className="reminder">
          The browser needs your permission again to write to {folder.name}.{' '}
          <button type="button" className="button" onClick={() => void resume()}>
            Allow backups to {folder.name}
          </button>
        </p>
      )}
      <div className="button-row">
        <button type="button" className="button" onClick={() => void choose()}>
          {folder ? 'Choose another folder' : 'Choose backup folder'}
        </button>
        {folder && (
          <>
            <button type="button" className="button" disabled={!cruiseId || permission !== 'granted'} onClick={() => void backupNow(true)}>
              Back up now
            </button>
            <button
              type="button"
              className="button"
              onClick={() =>
                void forgetBackupFolder().then(() => {
                  setFolder(null);
                  setPermission(null);
                })
              }
            >
              Stop backups
            </button>
          </>
        )}
      </div>
      {error && (
        <p role="alert" className="error">
          {error}
        </p>
      )}
    </section>
  );
}

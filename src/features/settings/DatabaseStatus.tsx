// Opens the local store at start and says at once when it cannot be used: no IndexedDB, data
// from a newer version, or another tab that upgraded it (reload needed; drafts are kept).
import { useEffect, useState } from 'react';
import { onDatabaseEvent, openFloeDb, requestPersistence, writeBlockReason, type DatabaseEvent } from '../../db';
import './storage.css';

function eventMessage(ev: DatabaseEvent): string | null {
  switch (ev.type) {
    case 'versionchange':
      return ev.newVersion === null
        ? 'The data of this site is being deleted in another tab. Reload this page.'
        : 'Floe Ledger was updated in another tab. Reload this page to continue; your draft is kept.';
    case 'blocked':
      return 'Floe Ledger is waiting for other tabs to close or reload before it can update its database.';
    case 'too-new':
      return writeBlockReason()?.message ?? 'The data here was saved by a newer version of Floe Ledger. Reload this page.';
  }
}

export function DatabaseStatus() {
  const [message, setMessage] = useState<string | null>(null);

  useEffect(() => {
    let live = true;
    const off = onDatabaseEvent((ev) => {
      const m = eventMessage(ev);
      if (live && m) setMessage(m);
    });
    openFloeDb()
      .then(() => {
        const blocked = writeBlockReason();
        if (live && blocked) setMessage(blocked.message);
        // Asked once per profile at first use; the settings screen shows the answer.
        if (!blocked) return requestPersistence();
      })
      .catch((err: unknown) => {
        if (live) setMessage(err instanceof Error ? err.message : String(err));
      });
    return () => {
      live = false;
      off();
    };
  }, []);

  if (!message) return null;
  return (
    <p className="database-alert" role="alert" data-testid="database-alert">
      {message}
      <button type="button" className="button" onClick={() => window.location.reload()}>
        Reload
      </button>
    </p>
  );
}

// Settings > Ship server: the address, this laptop's user and password (a CouchDB session
// cookie; the password is sent once and never kept), on/off, and what the server sent that the
// checks refused.
import { useLiveQuery } from 'dexie-react-hooks';
import { useId, useState, type FormEvent } from 'react';
import { getSetting, setSetting } from '../../db';
import { CouchError } from '../../sync/couch';
import { syncText } from './SyncBadge';
import { allowedByPolicy, logIn, logOut, policyOrigins, useSyncStatus } from './runtime';

export function SyncPanel() {
  const saved = useLiveQuery(() => getSetting('syncServer'), []);
  const status = useSyncStatus();
  const [url, setUrl] = useState<string | null>(null);
  const [user, setUser] = useState<string | null>(null);
  const [password, setPassword] = useState('');
  const [join, setJoin] = useState<string | null>(null);
  const activeId = useLiveQuery(() => getSetting('activeCruiseId'), []);
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const ids = { url: useId(), user: useId(), password: useId(), join: useId() };
  const allowed = policyOrigins() ?? [];
  const urlValue = url ?? saved?.url ?? allowed[0] ?? '';
  const userValue = user ?? saved?.user ?? '';
  const permitted = allowedByPolicy(urlValue);

  const connect = async (e: FormEvent) => {
    e.preventDefault();
    setBusy(true);
    setMessage(null);
    try {
      const name = await logIn(urlValue, userValue, password);
      const joinCruiseId = (join ?? saved?.joinCruiseId ?? '').trim();
      await setSetting('syncServer', { url: urlValue, user: name, enabled: true, ...(joinCruiseId ? { joinCruiseId } : {}) });
      setMessage(`Signed in as ${name}. Sync is on.`);
    } catch (err) {
      setMessage(err instanceof CouchError && err.kind === 'unauthorized' ? 'The server does not accept this user and password.' : `Could not sign in: ${err instanceof Error ? err.message : String(err)}`);
    } finally {
      setPassword('');
      setBusy(false);
    }
  };

  const switchOff = async () => {
    if (!saved) return;
    await setSetting('syncServer', { ...saved, enabled: false });
    await logOut(saved.url).catch(() => undefined);
    setMessage('Sync is off; this laptop keeps logging on its own.');
  };

  return (
    <section className="panel" aria-labelledby="sync-title">
      <h3 id="sync-title">Ship server</h3>
      <p>
        With a ship server (Apache CouchDB, or <code>npm run ship-server</code> on one laptop), every saved observation, the cruise, the track and the photos go to the
        server and come to the other laptops. Without it, or offline, this laptop logs exactly as before and sends later.
      </p>
      {policyOrigins() === null ? null : allowed.length === 0 ? (
        <p className="finding-warning">
          This build of the app may not connect to any ship server: its security policy names none. Build it with the server's address, e.g.{' '}
          <code>FLOE_SHIP_SERVER=http://192.168.1.10:5984 npm start</code>.
        </p>
      ) : (
        <p className="muted">This build may connect to: {allowed.join(', ')}.</p>
      )}
      <form onSubmit={(e) => void connect(e)} className="sync-form">
        <label htmlFor={ids.url}>Server address</label>
        <input id={ids.url} type="url" value={urlValue} onChange={(e) => setUrl(e.target.value)} placeholder="http://192.168.1.10:5984" required />
        {urlValue !== '' && !permitted && <p className="finding-warning">This address is not in this build's security policy; the browser would block it.</p>}
        <label htmlFor={ids.user}>User (this laptop's or the observer's)</label>
        <input id={ids.user} value={userValue} onChange={(e) => setUser(e.target.value)} autoComplete="username" required />
        <label htmlFor={ids.password}>Password (sent once to sign in, never kept)</label>
        <input id={ids.password} type="password" value={password} onChange={(e) => setPassword(e.target.value)} autoComplete="current-password" required />
        {!activeId && (
          <>
            <label htmlFor={ids.join}>Cruise to receive (its id; this laptop has no cruise yet)</label>
            <input id={ids.join} value={join ?? saved?.joinCruiseId ?? ''} onChange={(e) => setJoin(e.target.value)} placeholder="the cruise id the chief scientist gives" />
          </>
        )}
        <div className="inline">
          <button type="submit" className="button" disabled={busy || !permitted}>
            Sign in and switch sync on
          </button>
          <button type="button" className="button" disabled={!saved?.enabled} onClick={() => void switchOff()}>
            Switch sync off
          </button>
        </div>
      </form>
      {activeId && (
        <p className="muted">
          This laptop syncs the cruise <code data-testid="sync-cruise-id">{activeId}</code>; a laptop that joins gives this id.
        </p>
      )}
      {message && <p role="status">{message}</p>}
      {status && <p data-testid="sync-state">{syncText(status).text}{status.reason ? `: ${status.reason}` : ''}</p>}
      {status && status.refusedDocs.length > 0 && (
        <details>
          <summary>{status.refusedDocs.length} document(s) from the server refused by the checks</summary>
          <ul className="sync-refused">
            {status.refusedDocs.slice(-50).map((r) => (
              <li key={`${r.docId}-${r.at}`}>
                <code>{r.docId}</code>: {r.reason}
              </li>
            ))}
          </ul>
        </details>
      )}
    </section>
  );
}

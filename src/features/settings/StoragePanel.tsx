// Whether the browser keeps this log for good, and how much room is left.
import { useEffect, useState } from 'react';
import { requestPersistence, storageStatus, type StorageStatus } from '../../db';
import './storage.css';

export function formatBytes(n: number): string {
  if (n < 1024) return `${n} B`;
  const units = ['KB', 'MB', 'GB', 'TB'];
  let v = n / 1024;
  let i = 0;
  while (v >= 1024 && i < units.length - 1) {
    v /= 1024;
    i++;
  }
  return `${v >= 100 ? v.toFixed(0) : v.toFixed(1)} ${units[i]}`;
}

type Load = { state: 'loading' } | { state: 'ready'; status: StorageStatus } | { state: 'failed'; message: string };

async function loadStatus(askAgain: boolean): Promise<Load> {
  try {
    await requestPersistence({ askAgain });
    return { state: 'ready', status: await storageStatus() };
  } catch (err) {
    return { state: 'failed', message: err instanceof Error ? err.message : String(err) };
  }
}

export function StoragePanel() {
  const [load, setLoad] = useState<Load>({ state: 'loading' });

  useEffect(() => {
    let live = true;
    void loadStatus(false).then((l) => {
      if (live) setLoad(l);
    });
    return () => {
      live = false;
    };
  }, []);

  return (
    <section className="storage-panel" aria-labelledby="storage-title" data-testid="storage-panel">
      <h3 id="storage-title">Storage on this laptop</h3>
      {load.state === 'loading' && <p>Checking storage…</p>}
      {load.state === 'failed' && (
        <p role="alert" className="storage-warning">
          {load.message}
        </p>
      )}
      {load.state === 'ready' && <StatusBody status={load.status} onAskAgain={() => void loadStatus(true).then(setLoad)} />}
    </section>
  );
}

function StatusBody({ status, onAskAgain }: { status: StorageStatus; onAskAgain: () => void }) {
  const { usageBytes, quotaBytes } = status;
  const share = usageBytes !== undefined && quotaBytes ? usageBytes / quotaBytes : undefined;
  return (
    <>
      <dl>
        <dt>Persistent storage</dt>
        <dd data-testid="storage-persisted">{status.supported ? (status.persisted ? 'granted' : 'not granted') : 'not offered by this browser'}</dd>
        <dt>Used</dt>
        <dd data-testid="storage-usage">{usageBytes === undefined ? 'unknown' : formatBytes(usageBytes)}</dd>
        <dt>Available to this app</dt>
        <dd data-testid="storage-quota">
          {quotaBytes === undefined ? 'unknown' : formatBytes(quotaBytes)}
          {share !== undefined && ` (${(share * 100).toFixed(share < 0.01 ? 2 : 0)} % used)`}
        </dd>
        {status.request && (
          <>
            <dt>Asked</dt>
            <dd>
              {status.request.askedAt.slice(0, 16).replace('T', ' ')} UTC: {status.request.granted ? 'granted' : 'refused'}
            </dd>
          </>
        )}
      </dl>
      {status.persisted ? (
        <p className="storage-ok">The browser keeps this log until you delete it yourself.</p>
      ) : (
        <div className="storage-warning" role="alert" data-testid="storage-warning">
          <p>
            <strong>The browser may delete this log when the disk runs low.</strong> It has not promised to keep this site&apos;s data.
            Export the cruise regularly (at least once a watch) and keep the file on another disk.
          </p>
          {status.supported && (
            <button type="button" className="button" onClick={onAskAgain}>
              Ask the browser again
            </button>
          )}
        </div>
      )}
      {share !== undefined && share > 0.8 && (
        <p className="storage-warning" role="alert">
          Storage is {Math.round(share * 100)} % full. Export and free space before it runs out: a save on a full disk is refused.
        </p>
      )}
    </>
  );
}

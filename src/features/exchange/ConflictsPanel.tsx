// Conflicting copies an import kept (same revision, other content), for a reviewer to settle:
// keep the stored version, or make the copy the next revision. The copy stays stored either way.
import { useLiveQuery } from 'dexie-react-hooks';
import { useState } from 'react';
import { getObservation, getSetting, listConflicts, markConflictResolved, saveObservation, type ConflictRecord } from '../../db';
import { differences } from './conflictDiff';

function ConflictItem({ row }: { row: ConflictRecord }) {
  const stored = useLiveQuery(() => getObservation(row.observationId), [row.observationId]);
  const [error, setError] = useState<string | null>(null);
  if (!stored) return null;
  const diffs = differences(stored, row.observation);

  async function decide(kept: 'stored' | 'copy') {
    setError(null);
    try {
      const by = (await getSetting('currentObserverId')) ?? 'review';
      if (kept === 'copy' && stored) {
        const { revision: _r, savedAt: _s, savedBy: _b, deviceId: _d, deleted: _x, ...content } = row.observation;
        await saveObservation(content, { expectedRevision: stored.revision, savedBy: 'review' });
      }
      await markConflictResolved(row.id, kept, by);
    } catch (err) {
      setError(err instanceof Error ? err.message : String(err));
    }
  }

  return (
    <li className="conflict-item" data-testid="conflict-item">
      <p>
        Observation of <strong>{row.observation.time}</strong>, revision {row.revision}: the copy from <em>{row.source}</em> (device {row.observation.deviceId}) differs from the
        stored one (device {stored.deviceId}, now at revision {stored.revision}).
      </p>
      <table className="conflict-diff">
        <thead>
          <tr>
            <th scope="col">Field</th>
            <th scope="col">Stored</th>
            <th scope="col">Copy</th>
          </tr>
        </thead>
        <tbody>
          {diffs.map((d) => (
            <tr key={d.path}>
              <th scope="row">
                <code>{d.path}</code>
              </th>
              <td>{d.stored}</td>
              <td>{d.copy}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {row.resolution ? (
        <p className="muted">
          Settled {row.resolution.at} by {row.resolution.by}: kept the {row.resolution.kept === 'copy' ? 'copy (saved as a new revision)' : 'stored version'}.
        </p>
      ) : (
        <div className="button-row">
          <button type="button" className="button" onClick={() => void decide('stored')}>
            Keep the stored version
          </button>
          <button type="button" className="button" onClick={() => void decide('copy')}>
            Use the copy as a new revision
          </button>
        </div>
      )}
      {error && (
        <p role="alert" className="error">
          {error}
        </p>
      )}
    </li>
  );
}

export function ConflictsPanel({ cruiseId }: { cruiseId: string | null }) {
  const rows = useLiveQuery(() => (cruiseId ? listConflicts(cruiseId) : Promise.resolve([])), [cruiseId]);
  if (!rows || rows.length === 0) return null;
  const open = rows.filter((r) => !r.resolution).length;
  return (
    <section className="exchange-panel" aria-labelledby="conflicts-title">
      <h3 id="conflicts-title">Flagged for review: {open} open conflict{open === 1 ? '' : 's'}</h3>
      <p className="muted small">Two laptops saved different content under the same revision. Both versions are kept; decide which one stands.</p>
      <ul className="conflict-list">
        {rows.map((r) => (
          <ConflictItem key={r.id} row={r} />
        ))}
      </ul>
    </section>
  );
}

// The history of one observation: every saved revision side by side, changes marked.
import type { Cruise } from '../../domain/model';
import { useHistory } from './logData';
import { VersionTable } from './VersionTable';

export function HistoryPanel({ cruise, observationId, onClose }: { cruise: Cruise; observationId: string; onClose: () => void }) {
  const versions = useHistory(observationId);
  return (
    <section className="history-panel" aria-labelledby="history-title">
      <div className="inline">
        <h3 id="history-title">History of the observation</h3>
        <button type="button" className="button small" onClick={onClose}>
          Close
        </button>
      </div>
      {!versions && <p>Loading…</p>}
      {versions && versions.length === 0 && <p>No saved version of this observation.</p>}
      {versions && versions.length > 0 && (
        <>
          <p className="muted">
            {versions.length === 1 ? 'Saved once, never edited.' : `${versions.length} revisions, oldest on the left; changed lines are marked.`}
          </p>
          <VersionTable
            versions={versions}
            headings={versions.map((v) => `Revision ${v.revision}`)}
            observers={cruise.observers}
            caption={`Revisions of the ${versions[0]?.time.slice(0, 16).replace('T', ' ') ?? ''} UTC observation`}
          />
        </>
      )}
    </section>
  );
}

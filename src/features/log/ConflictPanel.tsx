// An edit saved over a revision that changed elsewhere: both versions side by side and an
// explicit choice. Nothing is overwritten unless the observer asks for it here.
import type { ObservationConflictError } from '../../db';
import type { Observer } from '../../domain/model';
import { VersionTable } from './VersionTable';

interface Props {
  conflict: ObservationConflictError;
  onKeepMine: () => void;
  onTakeTheirs: () => void;
  observers: readonly Observer[];
}

export function ConflictPanel({ conflict, onKeepMine, onTakeTheirs, observers }: Props) {
  return (
    <section className="conflict-panel" role="alertdialog" aria-labelledby="conflict-title">
      <h4 id="conflict-title">This observation changed elsewhere while you edited it</h4>
      <p>{conflict.message}</p>
      <VersionTable
        versions={[conflict.theirs, conflict.mine]}
        headings={[`Stored now (revision ${conflict.theirs.revision})`, 'Your edit (not saved)']}
        observers={observers}
        caption="Stored version and your edit"
      />
      <div className="inline">
        <button type="button" className="button primary" onClick={onKeepMine}>
          Save my edit as revision {conflict.theirs.revision + 1}
        </button>
        <button type="button" className="button" onClick={onTakeTheirs}>
          Drop my edit, open the stored version
        </button>
      </div>
    </section>
  );
}

// All findings of the entry in one place beside the save button: errors say why saving is
// blocked; each warning can carry a note, stored with the observation as its explanation.
import type { Finding } from '../../domain/model';
import { useObservationForm } from '../../state/observationForm';
import { findingKey } from './formModel';

export function FindingsSummary({ findings, pristine = false }: { findings: readonly Finding[]; pristine?: boolean }) {
  const notes = useObservationForm((s) => s.draft.warningNotes);
  const setField = useObservationForm((s) => s.setField);
  const errors = findings.filter((f) => f.severity === 'error');
  const warnings = findings.filter((f) => f.severity === 'warning');
  const infos = findings.filter((f) => f.severity === 'info');
  if (pristine) {
    return (
      <section className="findings-summary" aria-label="Checks" aria-live="polite">
        <p className="muted">The entry is checked as you type. Start with the total concentration, or from the previous observation (Alt+P).</p>
      </section>
    );
  }
  if (findings.length === 0) {
    return (
      <section className="findings-summary ok" aria-label="Checks" aria-live="polite">
        <p>No findings: the entry passes every check.</p>
      </section>
    );
  }
  return (
    <section className="findings-summary" aria-label="Checks" aria-live="polite">
      {errors.length > 0 && (
        <>
          <h4 className="finding-error">
            {errors.length === 1 ? '1 error blocks saving' : `${errors.length} errors block saving`}
          </h4>
          <ul>
            {errors.map((f, i) => (
              <li key={`e${i}`} className="finding finding-error" data-severity="error">
                {f.message}
              </li>
            ))}
          </ul>
        </>
      )}
      {warnings.length > 0 && (
        <>
          <h4 className="finding-warning">
            {warnings.length === 1 ? '1 warning' : `${warnings.length} warnings`}: can be saved; a note explains it
          </h4>
          <ul>
            {warnings.map((f) => {
              const key = findingKey(f);
              return (
                <li key={key} className="finding finding-warning" data-severity="warning">
                  <span>{f.message}</span>
                  <input
                    type="text"
                    className="warning-note"
                    aria-label={`Note on the warning: ${f.message}`}
                    placeholder="Note (optional): why this is right"
                    value={notes[key] ?? ''}
                    onChange={(e) => setField('warningNotes', { ...notes, [key]: e.currentTarget.value })}
                  />
                </li>
              );
            })}
          </ul>
        </>
      )}
      {infos.length > 0 && (
        <ul>
          {infos.map((f, i) => (
            <li key={`i${i}`} className="finding finding-info" data-severity="info">
              {f.message}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}

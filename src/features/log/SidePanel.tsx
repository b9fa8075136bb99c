// Beside the form: the entry's egg code and its POLARIS risk index outcome for the vessel's ice
// class, with the circular's cautions. Both are computed by the domain core as the observer types.
import { deriveEggCode, eggCodeText } from '../../domain/eggCode';
import type { Cruise } from '../../domain/model';
import { POLARIS_ICE_TYPE_LABELS, polarisForObservation, VESSEL_ICE_CLASS_LABELS } from '../../domain/polaris';
import { EggCodeView } from './EggCodeView';
import type { ObservationFields } from './formModel';

export function SidePanel({ cruise, observation }: { cruise: Cruise; observation: ObservationFields }) {
  const code = deriveEggCode(observation);
  const polaris = polarisForObservation(observation, cruise.iceClass);
  return (
    <aside className="side-panel" aria-label="Egg code and POLARIS">
      <section>
        <h4>Egg code</h4>
        <EggCodeView code={code} size={130} />
        <p className="egg-text" data-testid="egg-text">{eggCodeText(code)}</p>
      </section>
      <section className="polaris" aria-live="polite">
        <h4>POLARIS, {VESSEL_ICE_CLASS_LABELS[cruise.iceClass]}</h4>
        {polaris.ok ? (
          <>
            <p className={`rio rio-${polaris.value.outcome}`} data-testid="rio">
              RIO <strong>{polaris.value.rio}</strong>
            </p>
            <p className={`outcome outcome-${polaris.value.outcome}`} data-testid="polaris-outcome">
              {polaris.value.outcomeLabel}
              {polaris.value.speedLimitKn !== null && ` (speed limit ${polaris.value.speedLimitKn} kn)`}
            </p>
            <table className="polaris-regime">
              <thead>
                <tr>
                  <th scope="col">Ice type</th>
                  <th scope="col">Tenths</th>
                  <th scope="col">RIV</th>
                </tr>
              </thead>
              <tbody>
                {polaris.value.regime.map((t) => (
                  <tr key={t.iceType}>
                    <td>{POLARIS_ICE_TYPE_LABELS[t.iceType]}</td>
                    <td>{t.tenths}</td>
                    <td>{t.riv}</td>
                  </tr>
                ))}
              </tbody>
            </table>
            {polaris.value.notes.map((n) => (
              <p key={n} className="muted small">
                {n}
              </p>
            ))}
            {polaris.value.cautions.map((c) => (
              <p key={c} className="caution small">
                {c}
              </p>
            ))}
          </>
        ) : (
          <p className="muted">Enter a concentration to see the risk index outcome ({polaris.error}).</p>
        )}
      </section>
    </aside>
  );
}

// Watch handovers: how differently observers read the same ice.
import type { Observer } from '../../domain/model';
import type { DifferenceStats, HandoverTable as Table } from '../../domain/stats';
import { fmtNumber, fmtSigned, observerLabel } from './format';

const diff = (d: DifferenceStats, digits: number): string => (d.count === 0 ? '–' : `${fmtSigned(d.meanDiff, digits)} (mean |Δ| ${fmtNumber(d.meanAbsDiff, digits)})`);

export function HandoverTable({ table, observers, highlight }: { table: Table; observers: readonly Observer[]; highlight: string | null }) {
  return (
    <section aria-labelledby="review-handover-title" className="review-section">
      <h3 id="review-handover-title">Watch handovers</h3>
      <p className="muted small">
        For consecutive observations by different observers (no gap between them): the mean difference, incoming minus
        outgoing. The same figure between consecutive observations of one observer shows how much the ice changes in one
        interval anyway: {diff(table.sameObserver.concentration, 2)} tenths, {diff(table.sameObserver.thicknessCm, 1)} cm over{' '}
        {table.sameObserver.pairs} pairs.
      </p>
      {table.pairs.length === 0 ? (
        <p>No handover between observers in this log.</p>
      ) : (
        <>
          <table className="review-table" data-testid="handover-table">
            <caption>By observer pair</caption>
            <thead>
              <tr>
                <th scope="col">Outgoing</th><th scope="col">Incoming</th><th scope="col">Handovers</th>
                <th scope="col">Δ total concentration (tenths)</th><th scope="col">Δ level thickness (cm)</th>
              </tr>
            </thead>
            <tbody>
              {table.pairs.map((p) => (
                <tr key={`${p.fromObserverId}>${p.toObserverId}`} className={highlight && (highlight === p.fromObserverId || highlight === p.toObserverId) ? 'review-row-highlight' : undefined}>
                  <td>{observerLabel(observers, p.fromObserverId)}</td>
                  <td>{observerLabel(observers, p.toObserverId)}</td>
                  <td>{p.handovers}</td>
                  <td>{diff(p.concentration, 2)}</td>
                  <td>{diff(p.thicknessCm, 1)}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <table className="review-table" data-testid="observer-offset-table">
            <caption>By observer: own reading minus the other observer’s, at every handover</caption>
            <thead>
              <tr><th scope="col">Observer</th><th scope="col">Handovers</th><th scope="col">Δ total concentration (tenths)</th><th scope="col">Δ level thickness (cm)</th></tr>
            </thead>
            <tbody>
              {table.observers.map((o) => (
                <tr key={o.observerId} className={highlight === o.observerId ? 'review-row-highlight' : undefined}>
                  <th scope="row">{observerLabel(observers, o.observerId)}</th>
                  <td>{o.handovers}</td>
                  <td>{diff(o.concentration, 2)}</td>
                  <td>{diff(o.thicknessCm, 1)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </>
      )}
    </section>
  );
}

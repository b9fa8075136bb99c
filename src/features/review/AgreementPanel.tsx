// Observed total concentration against the stored ice charts and satellite grids: the figures of
// src/domain/collocation (count, mean and RMS difference, share within 1/10 and 2/10) overall, by
// ice regime and by observer, the largest differences, the scatter and the time series, and the
// cautions beside them. useAgreement also gives the largest disagreements as findings, which the
// Review puts in its findings list.
import { useMemo } from 'react';
import { chartPairs, disagreementFindings, gridPairs, iceInfoReport, type Agreement, type AgreementFigures, type AgreementPair, type IceInfoReport } from '../../domain/collocation';
import type { Cruise, Observation } from '../../domain/model';
import type { ReviewFinding } from '../../domain/stats';
import { ICE_REGIME_LABELS, ICE_REGIMES } from '../../domain/stats/regimes';
import { productNotes, useCollocation, type IceInfoSettings } from '../iceinfo/useIceInfo';
import { AgreementCharts } from './AgreementCharts';

const num = (x: number | null, d = 2) => (x === null ? '–' : x.toFixed(d));
const pct = (x: number | null) => (x === null ? '–' : `${Math.round(x * 100)} %`);

function Row({ label, f }: { label: string; f: AgreementFigures }) {
  return (
    <tr>
      <th scope="row">{label}</th>
      <td className="num">{f.count}</td>
      <td className="num">{num(f.meanDifference)}</td>
      <td className="num">{num(f.rmsDifference)}</td>
      <td className="num">{pct(f.within1Share)}</td>
      <td className="num">{pct(f.within2Share)}</td>
    </tr>
  );
}

function AgreementTable({ title, a, cruise, testId }: { title: string; a: Agreement; cruise: Cruise; testId: string }) {
  const name = (id: string) => cruise.observers.find((o) => o.id === id)?.name ?? id;
  return (
    <div className="agreement-block" data-testid={testId}>
      <h4>{title}</h4>
      {a.overall.count === 0 ? (
        <p className="muted">No observation lies on this product within the time limit.</p>
      ) : (
        <>
          <table className="review-table">
            <thead>
              <tr>
                <th scope="col"></th>
                <th scope="col">pairs</th>
                <th scope="col">mean difference (tenths)</th>
                <th scope="col">RMS difference (tenths)</th>
                <th scope="col">within 1/10</th>
                <th scope="col">within 2/10</th>
              </tr>
            </thead>
            <tbody>
              <Row label="All observations" f={a.overall} />
              {ICE_REGIMES.filter((r) => a.byRegime[r].count > 0).map((r) => (
                <Row key={r} label={ICE_REGIME_LABELS[r]} f={a.byRegime[r]} />
              ))}
              {Object.entries(a.byObserver).map(([id, f]) => (
                <Row key={id} label={`Observer ${name(id)}`} f={f} />
              ))}
            </tbody>
          </table>
          <p className="small">Largest differences (observed minus product):</p>
          <ol className="agreement-largest">
            {a.largest.slice(0, 5).map((p) => (
              <li key={p.observationId}>
                {p.time.replace('T', ' ').replace(/:\d\d(\.\d+)?Z$/, ' UTC')}, {name(p.observerId)}: observed {p.observed}/10, product {p.product.toFixed(1)}/10, difference {p.difference > 0 ? '+' : ''}
                {p.difference.toFixed(1)}
              </li>
            ))}
          </ol>
        </>
      )}
    </div>
  );
}

export interface AgreementData {
  report: IceInfoReport;
  settings: IceInfoSettings;
  chartPairs: AgreementPair[];
  gridPairs: AgreementPair[];
  /** The pairs more than 2/10 apart among the largest differences, as findings. */
  findings: ReviewFinding[];
}

/** The agreement of a cruise with the switched-on charts and grids; null when none is. */
export function useAgreement(observations: readonly Observation[]): AgreementData | null {
  const { collocation, charts, grids, settings } = useCollocation(observations);
  return useMemo(() => {
    if (charts.length === 0 && grids.length === 0) return null;
    const report = iceInfoReport(observations, collocation, productNotes(charts, grids), settings, settings.gridMethod);
    const byId = new Map(observations.map((o) => [o.id, o]));
    return {
      report,
      settings,
      chartPairs: chartPairs(observations, collocation),
      gridPairs: gridPairs(observations, collocation, settings.gridMethod),
      findings: disagreementFindings(report, collocation, byId),
    };
  }, [observations, collocation, charts, grids, settings]);
}

export function AgreementPanel({ cruise, data, theme }: { cruise: Cruise; data: AgreementData; theme: string }) {
  const { report, settings } = data;
  return (
    <section aria-labelledby="agreement-title" className="review-section" data-testid="agreement-panel">
      <h3 id="agreement-title">Agreement with ice charts and satellite grids</h3>
      <p className="small">
        Observed total concentration minus the product's, in tenths. Charts: the middle of the chart's CT range, from the chart nearest in time within {settings.chartMaxHours} h.
        Grids: {settings.gridMethod === 'nearest' ? 'the nearest cell' : 'bilinear between the four nearest cells, flagged cells left out'}, within {settings.gridMaxHours} h.
        Differences beyond 2/10 are also listed under Quality control.
      </p>
      <ul className="small">
        {report.products.map((p) => (
          <li key={`${p.kind}${p.sourceName}${p.time}`}>
            {p.kind === 'chart' ? 'Chart' : 'Grid'} {p.sourceName}: valid {p.time}
            {p.resolutionKm === null ? '' : `, ${p.resolutionKm} km cells`}
          </li>
        ))}
      </ul>
      <AgreementTable title="Observed minus ice chart" a={report.chart} cruise={cruise} testId="agreement-chart" />
      <AgreementTable title={`Observed minus satellite grid (${report.gridMethod})`} a={report.grid} cruise={cruise} testId="agreement-grid" />
      {data.chartPairs.length + data.gridPairs.length > 0 && <AgreementCharts chart={data.chartPairs} grid={data.gridPairs} theme={theme} />}
      <ul className="agreement-cautions">
        {report.cautions.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
    </section>
  );
}

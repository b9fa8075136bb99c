// The cruise at a glance: one card per figure of the summary (src/domain/stats).
import type { Cruise } from '../../domain/model';
import { VESSEL_ICE_CLASS_LABELS } from '../../domain/polaris';
import { STAGES } from '../../domain/nomenclature';
import type { CruiseSummary, TimeAndDistance } from '../../domain/stats';
import { fmtCm, fmtHours, fmtNm, fmtNumber, fmtPercent, fmtTenths, fmtUtc } from './format';

function Card({ id, title, value, detail }: { id: string; title: string; value: string; detail?: string }) {
  return (
    <div className="review-card" data-testid={`card-${id}`}>
      <h4 className="review-card-title">{title}</h4>
      <p className="review-card-value" data-testid={`value-${id}`}>{value}</p>
      {detail && <p className="review-card-detail muted">{detail}</p>}
    </div>
  );
}

const td = (t: TimeAndDistance): string => `${fmtHours(t.hours)} · ${fmtNm(t.distanceNm)}`;

export function SummaryCards({ summary: s, cruise }: { summary: CruiseSummary; cruise: Cruise }) {
  const topStages = s.ice.stageShares
    .slice()
    .sort((a, b) => b.share - a.share)
    .slice(0, 3)
    .map((x) => `${STAGES[x.stage].shortLabel} ${fmtPercent(x.share)}`)
    .join(', ');
  const distanceFrom = s.distanceSource === 'track' ? 'along the ship’s track' : s.distanceSource === 'observations' ? 'between observation positions (no track stored)' : 'no positions';
  return (
    <section aria-labelledby="review-summary-title" className="review-section">
      <h3 id="review-summary-title">Summary</h3>
      <div className="review-cards">
        <Card id="observations" title="Observations" value={String(s.observations)} detail={`${s.gaps.length} gaps, ${fmtHours(s.unobservedHours)} unobserved`} />
        <Card id="span" title="Time span" value={fmtHours(s.spanHours)} detail={`${fmtUtc(s.firstTime)} to ${fmtUtc(s.lastTime)}`} />
        <Card id="observers" title="Observers" value={String(s.observers.length)} detail={s.observers.map((o) => `${o.initials} ${o.observations}`).join(', ')} />
        <Card id="sailed" title="Distance sailed" value={fmtNm(s.sailedNm)} detail={`Geodesic (WGS 84), ${distanceFrom}`} />
        <Card id="in-ice" title="In ice (1/10 or more)" value={td(s.inIce)} />
        <Card id="marginal" title="Marginal ice zone (2-8/10)" value={td(s.marginal)} />
        <Card id="pack" title="Pack ice (9-10/10)" value={td(s.pack)} />
        <Card id="concentration" title="Mean total concentration" value={fmtTenths(s.ice.meanConcentration)} detail={`over ${s.ice.judged} observations`} />
        <Card id="thickness" title="Mean thickness, level ice" value={fmtCm(s.ice.meanThicknessCm)} detail="weighted by concentration" />
        <Card id="thickness-ridges" title="Mean thickness with ridges (estimate)" value={fmtCm(s.ice.meanThicknessWithRidgesCm)} detail="ridged and rafted shares included" />
        <Card id="ridged" title="Ridged share of the ice" value={fmtPercent(s.ice.ridgedShare)} />
        <Card id="stages" title="Main stages of development" value={topStages || '–'} detail="share of the ice, weighted by partial concentration" />
        <Card
          id="rio-min"
          title={`Lowest RIO (${VESSEL_ICE_CLASS_LABELS[cruise.iceClass]})`}
          value={fmtNumber(s.polaris.minRio, 0)}
          detail={s.polaris.minRioTime ? `at ${fmtUtc(s.polaris.minRioTime)}` : undefined}
        />
        <Card id="rio-mean" title="Mean RIO" value={fmtNumber(s.polaris.meanRio, 1)} detail={`over ${s.polaris.assessed} observations`} />
      </div>
      <div className="review-two-tables">
        <table className="review-table" data-testid="regime-table">
          <caption>Hours and distance by ice regime (total concentration)</caption>
          <thead>
            <tr><th scope="col">Regime</th><th scope="col">Observations</th><th scope="col">Hours</th><th scope="col">Distance</th></tr>
          </thead>
          <tbody>
            {s.regimes.map((r) => (
              <tr key={r.regime} data-regime={r.regime}>
                <th scope="row">{r.label}</th><td>{r.observations}</td><td>{fmtHours(r.hours)}</td><td>{fmtNm(r.distanceNm)}</td>
              </tr>
            ))}
            <tr>
              <th scope="row">No observation (gaps)</th><td>–</td><td>{fmtHours(s.unobservedHours)}</td><td>{fmtNm(s.unobservedNm)}</td>
            </tr>
          </tbody>
        </table>
        <table className="review-table" data-testid="outcome-table">
          <caption>POLARIS outcome for {VESSEL_ICE_CLASS_LABELS[cruise.iceClass]} (decision support only)</caption>
          <thead>
            <tr><th scope="col">Outcome</th><th scope="col">Observations</th><th scope="col">Hours</th><th scope="col">Distance</th></tr>
          </thead>
          <tbody>
            {s.polaris.outcomes.map((o) => (
              <tr key={o.outcome} data-outcome={o.outcome}>
                <th scope="row">{o.label}</th><td>{o.observations}</td><td>{fmtHours(o.hours)}</td><td>{fmtNm(o.distanceNm)}</td>
              </tr>
            ))}
            <tr>
              <th scope="row">Not assessed</th><td>{s.polaris.notAssessed.observations}</td><td>{fmtHours(s.polaris.notAssessed.hours)}</td><td>{fmtNm(s.polaris.notAssessed.distanceNm)}</td>
            </tr>
          </tbody>
        </table>
      </div>
      <p className="muted small">
        Each observation stands for the time until the next one, at most 1.5 times the cruise interval
        ({cruise.intervalMinutes} min); longer stretches count as gaps, never as time in ice.
      </p>
    </section>
  );
}

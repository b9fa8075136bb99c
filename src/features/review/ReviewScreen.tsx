// The chief scientist's view of the whole cruise: summary, charts, latitude bands, watch
// handovers, the quality-control list, and a printable report. Every figure comes from
// src/domain/stats; this screen only lays them out.
import { useId, useMemo, useState } from 'react';
import type { Cruise, Observation, TrackPoint } from '../../domain/model';
import { VESSEL_ICE_CLASS_LABELS } from '../../domain/polaris';
import { REVIEW_CAUTIONS } from '../../domain/stats';
import { withDisagreements } from '../../domain/collocation/disagreement';
import { effectiveTheme, useThemeStore } from '../../state/theme';
import { AgreementPanel, useAgreement } from './AgreementPanel';
import { BandTable } from './BandTable';
import { FindingsPanel } from './FindingsPanel';
import { HandoverTable } from './HandoverTable';
import { ReviewCharts } from './ReviewCharts';
import { SummaryCards } from './SummaryCards';
import { TrackSketch } from './TrackSketch';
import { useReviewFigures } from './reviewClient';
import { useReviewCruise, useReviewObservations, useReviewTrack } from './reviewData';
import './review.css';

export function ReviewScreen() {
  const cruise = useReviewCruise();
  return (
    <section className="screen review-screen" aria-labelledby="review-title">
      <h2 id="review-title">Cruise review</h2>
      {cruise === undefined && <p role="status">Opening the store…</p>}
      {cruise === null && <p>No cruise yet. Start a cruise (or load the demo cruise) in the watch log, then come back here.</p>}
      {cruise && <CruiseReviewLoader key={cruise.id} cruise={cruise} />}
    </section>
  );
}

function CruiseReviewLoader({ cruise }: { cruise: Cruise }) {
  const observations = useReviewObservations(cruise.id);
  const track = useReviewTrack(cruise.id);
  if (observations === undefined || track === undefined) return <p role="status">Reading the log of {cruise.name}…</p>;
  if (observations.length === 0) return <p>{cruise.name} has no observations yet.</p>;
  return <CruiseReview cruise={cruise} observations={observations} track={track} />;
}

export function CruiseReview({ cruise, observations, track }: { cruise: Cruise; observations: Observation[]; track: TrackPoint[] }) {
  const id = useId();
  const [observerId, setObserverId] = useState('');
  // Computed in the review worker, a save at a time; the previous figures stay until new ones arrive.
  const { figures, updating, error } = useReviewFigures(cruise, observations, track, observerId);
  const byId = useMemo(() => new Map(observations.map((o) => [o.id, o])), [observations]);
  const observerName = cruise.observers.find((o) => o.id === observerId)?.name;
  const theme = effectiveTheme(useThemeStore());
  // Charts and grids are compared on this thread (the store's products are not in the worker).
  const agreement = useAgreement(observations);
  const findings = useMemo(() => (figures ? withDisagreements(figures.findings, agreement?.findings ?? []) : []), [figures, agreement]);
  return (
    <div className="review-body">
      <div className="review-heading">
        <p className="review-cruise-name">
          <strong>{cruise.name}</strong> · {cruise.vesselName} · ice class {VESSEL_ICE_CLASS_LABELS[cruise.iceClass]}
        </p>
        <p className="print-only muted">Report printed {new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC{observerName ? `, observations of ${observerName} only` : ''}.</p>
        <div className="review-controls no-print">
          <label htmlFor={`${id}-observer`}>Observer</label>
          <select id={`${id}-observer`} value={observerId} onChange={(e) => setObserverId(e.target.value)}>
            <option value="">All observers</option>
            {cruise.observers.map((o) => (
              <option key={o.id} value={o.id}>{o.name}</option>
            ))}
          </select>
          <button type="button" className="button primary" onClick={() => window.print()}>
            Print the report
          </button>
          {theme !== 'day' && <span className="muted small">The preview and the print keep this dark display; choose Day for black on white paper.</span>}
        </div>
        {observerName && (
          <p className="review-filter-note" role="status">
            Figures for the observations of {observerName}; distance sailed is the whole cruise’s.
          </p>
        )}
      </div>
      {error && <p role="alert" className="review-error">The figures could not be computed: {error}</p>}
      <p className="review-updating no-print muted" data-testid="review-updating" aria-live="polite">
        {updating ? (figures ? 'Updating the figures…' : 'Computing the figures…') : ''}
      </p>
      {figures && (
        <>
          <SummaryCards summary={figures.review.summary} cruise={cruise} />
          <TrackSketch observations={observations} track={track} />
          <ReviewCharts series={figures.review.series} />
          <BandTable table={figures.review.bands} />
          <HandoverTable table={figures.review.handover} observers={cruise.observers} highlight={observerId || null} />
          <FindingsPanel findings={findings} cruise={cruise} observations={byId} />
          {agreement && <AgreementPanel cruise={cruise} data={agreement} theme={theme} />}
        </>
      )}
      <section aria-labelledby="review-cautions-title" className="review-section review-cautions">
        <h3 id="review-cautions-title">Cautions</h3>
        <ul>
          {REVIEW_CAUTIONS.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      </section>
    </div>
  );
}

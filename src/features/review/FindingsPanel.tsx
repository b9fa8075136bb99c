// The quality-control list: every finding of the field and sequence rules, filterable by
// severity, rule, observer and review state; each a click from its observation on the map and in
// the form; a finding can be marked reviewed with a comment, saved in the observation's `reviews`
// through saveObservation, so the revision history keeps it.
import { useId, useMemo, useState } from 'react';
import { getObservation, saveObservation } from '../../db';
import type { Cruise, Observation, Severity } from '../../domain/model';
import { DISAGREEMENT_CODES, type DisagreementCode } from '../../domain/collocation/disagreement';
import { FINDING_CODES, type FindingCode } from '../../domain/rules';
import { withFindingReview, withoutFindingReview, type ReviewFinding } from '../../domain/stats';
import { fmtUtc, observerInitials, observerLabel } from './format';
import { openInForm, showOnMap } from './openObservation';

const SEVERITY_LABELS: Record<Severity, string> = { error: 'Error', warning: 'Warning', info: 'Note' };
const PAGE = 200;

export interface FindingFilters {
  severity: Severity | '';
  code: string;
  observerId: string;
  state: '' | 'open' | 'reviewed';
}

export function filterFindings(findings: readonly ReviewFinding[], f: FindingFilters): ReviewFinding[] {
  return findings.filter(
    (x) =>
      (f.severity === '' || x.severity === f.severity) &&
      (f.code === '' || x.code === f.code) &&
      (f.observerId === '' || x.observerId === f.observerId) &&
      (f.state === '' || (f.state === 'reviewed') === (x.review !== null)),
  );
}

const has = (o: object, k: string) => Object.prototype.hasOwnProperty.call(o, k);
const ruleSummary = (code: string): string =>
  has(FINDING_CODES, code) ? FINDING_CODES[code as FindingCode].summary : has(DISAGREEMENT_CODES, code) ? DISAGREEMENT_CODES[code as DisagreementCode].summary : code;

async function saveReview(f: ReviewFinding, comment: string | null, by: string): Promise<void> {
  const current = await getObservation(f.observationId);
  if (!current) throw new Error('the observation is no longer in the store');
  const next = comment === null ? withoutFindingReview(current, f) : withFindingReview(current, f, comment, by, new Date().toISOString().replace(/\.\d{3}Z$/, 'Z'));
  await saveObservation(next, { expectedRevision: current.revision, savedBy: 'review' });
}

function ReviewForm({ finding, onDone }: { finding: ReviewFinding; onDone: () => void }) {
  const id = useId();
  const [comment, setComment] = useState(finding.review?.comment ?? '');
  const [by, setBy] = useState(finding.review?.by ?? '');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const submit = async (): Promise<void> => {
    if (comment.trim() === '' || by.trim() === '') {
      setError('Write a comment and who reviewed it.');
      return;
    }
    setBusy(true);
    try {
      await saveReview(finding, comment, by.trim());
      onDone();
    } catch (e) {
      setError(`The review was not saved: ${e instanceof Error ? e.message : String(e)}`);
    } finally {
      setBusy(false);
    }
  };
  return (
    <form
      className="review-finding-form"
      onSubmit={(e) => {
        e.preventDefault();
        void submit();
      }}
    >
      <label htmlFor={`${id}-comment`}>Comment</label>
      <textarea id={`${id}-comment`} value={comment} onChange={(e) => setComment(e.target.value)} rows={2} />
      <label htmlFor={`${id}-by`}>Reviewed by</label>
      <input id={`${id}-by`} value={by} onChange={(e) => setBy(e.target.value)} />
      <div className="review-finding-actions">
        <button type="submit" className="button primary" disabled={busy}>Save the review</button>
        <button type="button" className="button" onClick={onDone}>Cancel</button>
      </div>
      {error && <p role="alert" className="finding-error">{error}</p>}
    </form>
  );
}

export function FindingsPanel({ findings, cruise, observations }: { findings: readonly ReviewFinding[]; cruise: Cruise; observations: ReadonlyMap<string, Observation> }) {
  const id = useId();
  const [filters, setFilters] = useState<FindingFilters>({ severity: '', code: '', observerId: '', state: '' });
  const [editing, setEditing] = useState<string | null>(null);
  const [limit, setLimit] = useState(PAGE);
  const [message, setMessage] = useState<string | null>(null);
  const shown = useMemo(() => filterFindings(findings, filters), [findings, filters]);
  const codes = useMemo(() => [...new Set(findings.map((f) => f.code))].sort(), [findings]);
  const reviewed = findings.filter((f) => f.review !== null).length;
  const set = <K extends keyof FindingFilters>(k: K, v: FindingFilters[K]): void => {
    setFilters((f) => ({ ...f, [k]: v }));
    setLimit(PAGE);
  };
  return (
    <section aria-labelledby="review-findings-title" className="review-section">
      <h3 id="review-findings-title">Quality control</h3>
      <p data-testid="findings-count">
        {findings.length} findings, {reviewed} reviewed; {shown.length} shown.
      </p>
      <div className="review-filters no-print">
        <label htmlFor={`${id}-sev`}>Severity</label>
        <select id={`${id}-sev`} value={filters.severity} onChange={(e) => set('severity', e.target.value as Severity | '')}>
          <option value="">All</option>
          {(Object.keys(SEVERITY_LABELS) as Severity[]).map((s) => <option key={s} value={s}>{SEVERITY_LABELS[s]}</option>)}
        </select>
        <label htmlFor={`${id}-rule`}>Rule</label>
        <select id={`${id}-rule`} value={filters.code} onChange={(e) => set('code', e.target.value)}>
          <option value="">All rules</option>
          {codes.map((c) => <option key={c} value={c}>{ruleSummary(c)}</option>)}
        </select>
        <label htmlFor={`${id}-obs`}>Observer</label>
        <select id={`${id}-obs`} value={filters.observerId} onChange={(e) => set('observerId', e.target.value)}>
          <option value="">All observers</option>
          {cruise.observers.map((o) => <option key={o.id} value={o.id}>{o.name}</option>)}
        </select>
        <label htmlFor={`${id}-state`}>State</label>
        <select id={`${id}-state`} value={filters.state} onChange={(e) => set('state', e.target.value as FindingFilters['state'])}>
          <option value="">Open and reviewed</option>
          <option value="open">Not reviewed</option>
          <option value="reviewed">Reviewed</option>
        </select>
      </div>
      {message && <p role="status">{message}</p>}
      <ul className="review-findings" data-testid="findings-list">
        {shown.slice(0, limit).map((f) => {
          const obs = observations.get(f.observationId);
          return (
            <li key={f.key} className={`review-finding review-finding-${f.severity}`} data-code={f.code} data-reviewed={f.review ? 'yes' : 'no'}>
              <div className="review-finding-head">
                <span className={`finding-badge finding-${f.severity}`}>{SEVERITY_LABELS[f.severity]}</span>
                <strong>{ruleSummary(f.code)}</strong>
                <span className="muted">
                  {fmtUtc(f.time)} · <abbr title={observerLabel(cruise.observers, f.observerId)}>{observerInitials(cruise.observers, f.observerId)}</abbr> · {f.path || 'observation'}
                </span>
              </div>
              <p className="review-finding-message">{f.message}</p>
              {f.review && (
                <p className="review-finding-review" data-testid="finding-review">
                  Reviewed by {f.review.by} ({fmtUtc(f.review.at)}): {f.review.comment}
                </p>
              )}
              <div className="review-finding-actions no-print">
                <button type="button" className="button" onClick={() => showOnMap(f.observationId)}>Show on the map</button>
                <button type="button" className="button" disabled={!obs} onClick={() => obs && openInForm(cruise.id, obs)}>Open in the form</button>
                <button type="button" className="button" onClick={() => setEditing(editing === f.key ? null : f.key)}>
                  {f.review ? 'Edit the review' : 'Mark reviewed'}
                </button>
                {f.review && (
                  <button
                    type="button"
                    className="button"
                    onClick={() => {
                      saveReview(f, null, '').then(
                        () => setMessage('Review taken back.'),
                        (e: unknown) => setMessage(`Could not take the review back: ${e instanceof Error ? e.message : String(e)}`),
                      );
                    }}
                  >
                    Take the review back
                  </button>
                )}
              </div>
              {editing === f.key && (
                <ReviewForm
                  finding={f}
                  onDone={() => setEditing(null)}
                />
              )}
            </li>
          );
        })}
      </ul>
      {shown.length > limit && (
        <button type="button" className="button no-print" onClick={() => setLimit((l) => l + PAGE)}>
          Show {Math.min(PAGE, shown.length - limit)} more
        </button>
      )}
    </section>
  );
}

// Import by file picker or drag and drop: parse in a worker with a progress bar, show what the
// merge would do, and write only when the observer applies it (one transaction).
import { useRef, useState, type DragEvent } from 'react';
import { applyMergePlan, getSetting, loadMergeTarget, setActiveCruise, StaleImportError, type ApplyResult } from '../../db';
import { planIsEmpty, planMerge, type MergePlan } from '../../format/merge';
import { formatProblem } from '../../format/problems';
import type { ParsedFile } from './progress';
import { parseInWorker } from './parseClient';
import { ImportPreview } from './ImportPreview';

type Phase =
  | { kind: 'idle' }
  | { kind: 'reading'; fileName: string; progress: number; stage: string }
  | { kind: 'rejected'; parsed: ParsedFile & { ok: false } }
  | { kind: 'preview'; parsed: ParsedFile & { ok: true }; plan: MergePlan }
  | { kind: 'applying'; parsed: ParsedFile & { ok: true }; plan: MergePlan }
  | { kind: 'done'; fileName: string; result: ApplyResult }
  | { kind: 'failed'; fileName: string; message: string };

const STAGE_WORDS: Record<string, string> = {
  read: 'Reading the file',
  scan: 'Checking its size and structure',
  parse: 'Parsing',
  schema: 'Checking against the format schema',
  check: 'Checking codes and references',
  rules: 'Running the quality-control rules',
};

export function ImportPanel({ onImported }: { onImported: (cruiseId: string) => void }) {
  const [phase, setPhase] = useState<Phase>({ kind: 'idle' });
  const [dragging, setDragging] = useState(false);
  const [note, setNote] = useState<string | null>(null);
  const input = useRef<HTMLInputElement>(null);
  const busy = phase.kind === 'reading' || phase.kind === 'applying';

  async function open(file: File) {
    setPhase({ kind: 'reading', fileName: file.name, progress: 0, stage: 'read' });
    try {
      const parsed = await parseInWorker(file, file.name, (progress, stage) => setPhase({ kind: 'reading', fileName: file.name, progress, stage }));
      if (!parsed.ok) {
        setPhase({ kind: 'rejected', parsed });
        return;
      }
      const plan = planMerge(await loadMergeTarget(parsed.bundle.cruise.id), parsed.bundle);
      setPhase({ kind: 'preview', parsed, plan });
    } catch (err) {
      setPhase({ kind: 'failed', fileName: file.name, message: err instanceof Error ? err.message : String(err) });
    }
  }

  async function apply(parsed: ParsedFile & { ok: true }, plan: MergePlan) {
    setPhase({ kind: 'applying', parsed, plan });
    try {
      const result = await applyMergePlan(plan, { source: parsed.fileName, photos: parsed.photos });
      if (!(await getSetting('activeCruiseId'))) await setActiveCruise(plan.cruise.value.id);
      setPhase({ kind: 'done', fileName: parsed.fileName, result });
      onImported(plan.cruise.value.id);
    } catch (err) {
      const stale = err instanceof StaleImportError;
      setPhase({ kind: 'failed', fileName: parsed.fileName, message: `${stale ? '' : 'Nothing was imported: '}${err instanceof Error ? err.message : String(err)}` });
    }
  }

  function onDrop(e: DragEvent<HTMLDivElement>) {
    e.preventDefault();
    setDragging(false);
    const file = e.dataTransfer.files[0];
    if (!file) return;
    if (e.dataTransfer.files.length > 1) setNote(`One file at a time: reading ${file.name} only.`);
    else setNote(null);
    if (busy) setNote(`Still working on the previous file; drop ${file.name} again when it is done.`);
    else void open(file);
  }

  return (
    <section className="exchange-panel" aria-labelledby="import-title">
      <h3 id="import-title">Import and merge</h3>
      <div
        className={`drop-zone${dragging ? ' dragging' : ''}`}
        data-testid="drop-zone"
        onDragOver={(e) => {
          e.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={onDrop}
      >
        <p>Drop a log file (.json or .zip) here, or</p>
        <button type="button" className="button primary" disabled={busy} onClick={() => input.current?.click()}>
          Choose a log file
        </button>
        <input
          ref={input}
          type="file"
          accept=".json,.zip,application/json,application/zip"
          hidden
          aria-label="Log file to import"
          data-testid="import-input"
          onChange={(e) => {
            const f = e.target.files?.[0];
            e.target.value = '';
            if (f) void open(f);
          }}
        />
        <p className="muted small">Nothing is written until you apply the import. Files from other laptops and older format versions are merged without losing any revision.</p>
      </div>

      {note && (
        <p role="status" className="muted">
          {note}
        </p>
      )}
      {phase.kind === 'reading' && (
        <div role="status" aria-live="polite">
          <label>
            {STAGE_WORDS[phase.stage] ?? 'Working'}: {phase.fileName}
            <progress value={phase.progress} max={1} data-testid="import-progress" />
          </label>
        </div>
      )}

      {phase.kind === 'rejected' && (
        <div role="alert" className="import-rejected" data-testid="import-rejected">
          <p>
            <strong>{phase.parsed.fileName} was not imported</strong>: nothing was changed. Problems found:
          </p>
          <ul className="problem-list">
            {phase.parsed.problems.listed.map((p, i) => (
              <li key={i}>{formatProblem(p)}</li>
            ))}
          </ul>
          {phase.parsed.problems.more > 0 && <p>... and {phase.parsed.problems.more} more problems.</p>}
        </div>
      )}

      {(phase.kind === 'preview' || phase.kind === 'applying') && (
        <div className="import-preview">
          <h4>Preview of {phase.parsed.fileName}</h4>
          <ImportPreview
            plan={phase.plan}
            warnings={phase.parsed.warnings}
            fromVersion={phase.parsed.fromVersion}
            photosWithoutBytes={phase.plan.addPhotos.filter((p) => !phase.parsed.photos.has(p.id)).length}
          />
          {planIsEmpty(phase.plan) ? (
            <p role="status" data-testid="import-nothing">Everything in this file is already stored: there is nothing to import.</p>
          ) : null}
          <div className="button-row">
            <button type="button" className="button primary" disabled={phase.kind === 'applying' || planIsEmpty(phase.plan)} onClick={() => void apply(phase.parsed, phase.plan)}>
              {phase.kind === 'applying' ? 'Importing...' : 'Apply import'}
            </button>
            <button type="button" className="button" disabled={phase.kind === 'applying'} onClick={() => setPhase({ kind: 'idle' })}>
              Cancel
            </button>
          </div>
        </div>
      )}

      {phase.kind === 'done' && (
        <p role="status" className="ok" data-testid="import-done">
          Imported {phase.fileName}: {phase.result.observations} observations written, {phase.result.history} earlier revisions kept, {phase.result.conflicts} conflicting
          copies flagged for review, {phase.result.trackPoints} track points, {phase.result.photos} photos.
        </p>
      )}
      {phase.kind === 'failed' && (
        <p role="alert" className="error" data-testid="import-failed">
          {phase.fileName}: {phase.message}
        </p>
      )}
    </section>
  );
}

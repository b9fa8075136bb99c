// Import by file picker or drag and drop: parse in a worker with a progress bar, show what the
// merge would do, and write only when the observer applies it (one transaction).
import { useEffect, useRef, useState, type DragEvent } from 'react';
import { getSetting, ImportFileChangedError, setActiveCruise, StaleImportError, type ApplyResult } from '../../db';
import { formatProblem } from '../../format/problems';
import { ImportFailed, startImport, type ImportClient } from './importClient';
import type { PreviewOutcome } from './progress';
import { planIsEmpty } from '../../format/merge';
import { ImportPreview } from './ImportPreview';

type Previewed = PreviewOutcome & { ok: true };

type Phase =
  | { kind: 'idle' }
  | { kind: 'reading'; fileName: string; progress: number; stage: string }
  | { kind: 'rejected'; parsed: PreviewOutcome & { ok: false } }
  | { kind: 'preview'; parsed: Previewed }
  | { kind: 'applying'; parsed: Previewed; progress: number }
  | { kind: 'done'; fileName: string; result: ApplyResult }
  | { kind: 'failed'; fileName: string; message: string };

const STAGE_WORDS: Record<string, string> = {
  read: 'Reading the file',
  pieces: 'Reading and checking the file',
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
  const client = useRef<ImportClient | null>(null);
  const busy = phase.kind === 'reading' || phase.kind === 'applying';

  const release = () => {
    client.current?.close();
    client.current = null;
  };
  useEffect(() => release, []);

  async function open(file: File) {
    release();
    setPhase({ kind: 'reading', fileName: file.name, progress: 0, stage: 'read' });
    const c = (client.current = startImport(file, file.name, (progress, stage) => setPhase({ kind: 'reading', fileName: file.name, progress, stage })));
    try {
      const parsed = await c.preview;
      if (client.current !== c) return;
      if (!parsed.ok) {
        release();
        setPhase({ kind: 'rejected', parsed });
        return;
      }
      setPhase({ kind: 'preview', parsed });
    } catch (err) {
      release();
      setPhase({ kind: 'failed', fileName: file.name, message: err instanceof Error ? err.message : String(err) });
    }
  }

  async function apply(parsed: Previewed) {
    const c = client.current;
    if (!c) return;
    setPhase({ kind: 'applying', parsed, progress: 0 });
    try {
      const result = await c.apply((progress) => setPhase({ kind: 'applying', parsed, progress }));
      release();
      const cruiseId = parsed.summary.cruise.value.id;
      if (!(await getSetting('activeCruiseId'))) await setActiveCruise(cruiseId);
      setPhase({ kind: 'done', fileName: parsed.fileName, result });
      onImported(cruiseId);
    } catch (err) {
      release();
      const stale = err instanceof ImportFailed ? err.stale : err instanceof StaleImportError || err instanceof ImportFileChangedError;
      setPhase({ kind: 'failed', fileName: parsed.fileName, message: `${stale ? '' : 'Nothing was imported: '}${err instanceof Error ? err.message : String(err)}` });
    }
  }

  function cancel() {
    release();
    setPhase({ kind: 'idle' });
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
          <ImportPreview summary={phase.parsed.summary} />
          {planIsEmpty(phase.parsed.summary) ? (
            <p role="status" data-testid="import-nothing">Everything in this file is already stored: there is nothing to import.</p>
          ) : null}
          {phase.kind === 'applying' && (
            <label>
              Writing into the store
              <progress value={phase.progress} max={1} data-testid="import-apply-progress" />
            </label>
          )}
          <div className="button-row">
            <button type="button" className="button primary" disabled={phase.kind === 'applying' || planIsEmpty(phase.parsed.summary)} onClick={() => void apply(phase.parsed)}>
              {phase.kind === 'applying' ? 'Importing...' : 'Apply import'}
            </button>
            <button type="button" className="button" disabled={phase.kind === 'applying'} onClick={cancel}>
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

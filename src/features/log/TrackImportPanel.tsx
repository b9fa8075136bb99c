// Importing a track file (GPX, NMEA 0183 log, CSV) into the cruise's track: the file is parsed in
// full first and stored only when that succeeded, so a file that cannot be read changes nothing.
// The stored track then feeds the "interpolated from the track" position of the form.
import { useRef, useState } from 'react';
import { addTrackPoints, countTrackPoints } from '../../db';
import { importTrackFile, TrackFormatError, type BadLine, type TrackFormat } from '../../gps/trackFiles';
import { detectTrackFormat } from '../../gps/trackImport';

const FORMAT_NAMES: Record<TrackFormat, string> = { gpx: 'GPX', nmea: 'NMEA 0183 log', csv: 'CSV' };
/** Bad lines shown on screen; all are counted. */
const SHOWN_BAD_LINES = 20;
/** Parsing takes this share of the bar, storing the rest. */
const PARSE_SHARE = 0.7;

type ImportState =
  | { kind: 'idle' }
  | { kind: 'working'; fileName: string; fraction: number; phase: string }
  | {
      kind: 'done';
      fileName: string;
      format: TrackFormat;
      imported: number;
      alreadyStored: number;
      duplicates: number;
      badCount: number;
      bad: BadLine[];
    }
  | { kind: 'failed'; message: string };

function errorText(err: unknown): string {
  return err instanceof Error ? err.message : String(err);
}

export function TrackImportPanel({ cruiseId }: { cruiseId: string }) {
  const [file, setFile] = useState<File | null>(null);
  const [format, setFormat] = useState<TrackFormat | 'auto'>('auto');
  const [state, setState] = useState<ImportState>({ kind: 'idle' });
  const abort = useRef<AbortController | null>(null);
  const busy = state.kind === 'working';
  const guessed = file ? detectTrackFormat(file.name, '') : null;

  async function run(f: File) {
    const controller = new AbortController();
    abort.current = controller;
    setState({ kind: 'working', fileName: f.name, fraction: 0, phase: 'reading the file' });
    let result;
    try {
      result = await importTrackFile(f, {
        cruiseId,
        signal: controller.signal,
        ...(format === 'auto' ? {} : { format }),
        onProgress: (fraction, phase) => setState({ kind: 'working', fileName: f.name, fraction: fraction * PARSE_SHARE, phase }),
      });
    } catch (err) {
      // TrackFormatError already names the file.
      const what = err instanceof TrackFormatError ? err.message : `${f.name} could not be read as a track: ${errorText(err)}`;
      const message = controller.signal.aborted ? `Import of ${f.name} stopped; nothing was stored.` : `${what}. Nothing was stored.`;
      setState({ kind: 'failed', message });
      return;
    } finally {
      abort.current = null;
    }
    if (result.points.length === 0) {
      const why = result.bad[0] ? ` (line ${result.bad[0].line}: ${result.bad[0].reason})` : '';
      setState({ kind: 'failed', message: `${f.name} holds no track point this program can read${why}; ${result.counts.bad} bad lines. Nothing was stored.` });
      return;
    }
    try {
      const before = await countTrackPoints(cruiseId);
      const total = result.points.length;
      await addTrackPoints(result.points, {
        onProgress: (committed) => setState({ kind: 'working', fileName: f.name, fraction: PARSE_SHARE + ((1 - PARSE_SHARE) * committed) / total, phase: `storing ${committed} of ${total} points` }),
      });
      const after = await countTrackPoints(cruiseId);
      setState({
        kind: 'done',
        fileName: f.name,
        format: result.format,
        imported: total,
        // A point at the time of a stored one replaces it, so the count grows only by the new ones.
        alreadyStored: Math.max(0, total - (after - before)),
        duplicates: result.counts.duplicates,
        badCount: result.counts.bad,
        bad: result.bad.slice(0, SHOWN_BAD_LINES),
      });
    } catch (err) {
      setState({ kind: 'failed', message: `The track of ${f.name} could not be stored: ${errorText(err)}` });
    }
  }

  return (
    <section className="gps-panel track-import" aria-labelledby="track-import-title">
      <h3 id="track-import-title">Import a track file</h3>
      <p className="muted small">GPX, NMEA 0183 log or CSV (time, latitude, longitude). Positions of observations can then be interpolated from the track.</p>
      <div className="field-row">
        <div className="field">
          <label htmlFor="track-file">Track file</label>
          <input
            id="track-file"
            type="file"
            accept=".gpx,.nmea,.txt,.log,.csv"
            disabled={busy}
            onChange={(e) => {
              setFile(e.currentTarget.files?.[0] ?? null);
              setState({ kind: 'idle' });
            }}
          />
        </div>
        <div className="field">
          <label htmlFor="track-format">Format</label>
          <select id="track-format" value={format} disabled={busy} onChange={(e) => setFormat(e.currentTarget.value as TrackFormat | 'auto')}>
            <option value="auto">{guessed ? `Detect (${FORMAT_NAMES[guessed]} by its name)` : 'Detect from the file'}</option>
            {(Object.keys(FORMAT_NAMES) as TrackFormat[]).map((k) => (
              <option key={k} value={k}>
                {FORMAT_NAMES[k]}
              </option>
            ))}
          </select>
        </div>
        <div className="field">
          <span className="label-like">Track</span>
          {busy ? (
            <button type="button" className="button" onClick={() => abort.current?.abort()}>
              Stop the import
            </button>
          ) : (
            <button type="button" className="button primary" disabled={!file} onClick={() => file && void run(file)}>
              Import the track
            </button>
          )}
        </div>
      </div>
      {state.kind === 'working' && (
        <div className="track-progress">
          <label htmlFor="track-progress">
            Importing {state.fileName}: {state.phase}
          </label>
          <progress id="track-progress" max={1} value={state.fraction} />
        </div>
      )}
      <div aria-live="polite">
        {state.kind === 'failed' && (
          <p className="finding finding-error" role="alert" data-testid="track-import-error">
            {state.message}
          </p>
        )}
        {state.kind === 'done' && (
          <div data-testid="track-import-result">
            <p role="status">
              {state.fileName} ({FORMAT_NAMES[state.format]}): <strong data-testid="track-imported">{state.imported}</strong> points imported
              {state.alreadyStored > 0 && `, ${state.alreadyStored} of them were already stored (kept once)`}
              {state.duplicates > 0 && `, ${state.duplicates} repeated times left out`}
              {`, ${state.badCount} bad ${state.badCount === 1 ? 'line' : 'lines'}`}.
            </p>
            {state.bad.length > 0 && (
              <>
                <p className="small">{state.badCount > state.bad.length ? `The first ${state.bad.length} bad lines:` : 'Bad lines:'}</p>
                <ul className="field-findings track-bad-lines" aria-label="Bad lines of the track file">
                  {state.bad.map((b) => (
                    <li key={b.line} className="finding-warning">
                      line {b.line}: {b.reason}
                    </li>
                  ))}
                </ul>
              </>
            )}
          </div>
        )}
      </div>
    </section>
  );
}

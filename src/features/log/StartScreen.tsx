// The log before any cruise exists: start a new cruise, or load the invented demo cruise.
import { useState } from 'react';
import { CruiseEditor } from '../settings/CruiseSetup';
import { loadDemoCruise, type DemoLoadProgress } from './demoLoader';

export function StartScreen() {
  const [creating, setCreating] = useState(false);
  const [progress, setProgress] = useState<DemoLoadProgress | null>(null);
  const [error, setError] = useState<string | null>(null);

  const demo = async () => {
    setError(null);
    setProgress({ done: 0, total: 1, what: 'the demo cruise' });
    try {
      await loadDemoCruise(setProgress);
    } catch (err) {
      setError(`The demo cruise could not be loaded: ${err instanceof Error ? err.message : String(err)}`);
      setProgress(null);
    }
  };

  return (
    <section className="screen start-screen" aria-labelledby="log-title">
      <h2 id="log-title">Watch log</h2>
      <p>No cruise yet on this laptop. Set up the cruise you are logging, or look around in the demo first.</p>
      <div className="start-actions">
        <button type="button" className="button primary big" onClick={() => setCreating(true)} disabled={creating}>
          New cruise
        </button>
        <button type="button" className="button big" onClick={() => void demo()} disabled={progress !== null}>
          Load the demo cruise
        </button>
      </div>
      <p className="muted small">
        The demo is an invented scenario (the fictional RV Frostwren and her observers): it is for trying the program, not real data.
      </p>
      {progress && (
        <p role="status">
          Loading {progress.what}… <progress max={progress.total} value={progress.done} aria-label={`Loading ${progress.what}`} /> {progress.done} / {progress.total}
        </p>
      )}
      {error && <p role="alert" className="finding finding-error">{error}</p>}
      {creating && <CruiseEditor cruise={null} makeActive onDone={() => setCreating(false)} />}
    </section>
  );
}

// The end of the active cruise: a time typed in UTC, or "End the cruise now" in one step. After
// the end the watch is off (domain/watch.ts): no banner, no alarm, no notification, no missed
// hours. An empty time reopens the cruise.
import { useId, useState } from 'react';
import { FloeDbError, updateCruise } from '../../db';
import type { Cruise } from '../../domain/model';
import { readUtcMinute, toIsoUtc } from '../../domain/watch';
import { useActiveCruise } from '../log/logData';
import { useNow } from '../log/useNow';

const shown = (iso: string | undefined): string => (iso ? `${iso.slice(0, 10)} ${iso.slice(11, 16)}` : '');

function EndEditor({ cruise }: { cruise: Cruise }) {
  const uid = useId();
  const [text, setText] = useState(shown(cruise.endTime));
  const [error, setError] = useState<string | null>(null);
  const [status, setStatus] = useState<string | null>(null);
  const now = useNow(1000);

  const save = async (endTime: string | undefined, done: string): Promise<void> => {
    try {
      await updateCruise(cruise.id, { endTime });
      setText(shown(endTime));
      setError(null);
      setStatus(done);
    } catch (err) {
      setStatus(null);
      setError(err instanceof FloeDbError || err instanceof Error ? err.message : String(err));
    }
  };
  const saveTyped = (): void => {
    if (text.trim() === '') {
      void save(undefined, `${cruise.name} is open again: the watch calls for observations.`);
      return;
    }
    const r = readUtcMinute(text);
    if (!r.ok) {
      setStatus(null);
      setError(`Cruise end: ${r.error}.`);
      return;
    }
    void save(r.value, `${cruise.name} ends at ${shown(r.value)} UTC.`);
  };
  const endNow = (): void => {
    const at = toIsoUtc(Math.floor(Date.now() / 60_000) * 60_000);
    void save(at, `${cruise.name} ended at ${shown(at)} UTC: the watch is off.`);
  };
  const ended = cruise.endTime !== undefined && Date.parse(cruise.endTime) <= now.getTime();

  return (
    <section className="cruise-end" aria-labelledby={`${uid}-title`}>
      <h3 id={`${uid}-title`}>End of the cruise</h3>
      <p data-testid="cruise-end-state">
        {cruise.endTime === undefined
          ? `${cruise.name} is open: the watch calls for an observation every ${cruise.intervalMinutes} min.`
          : ended
            ? `${cruise.name} ended at ${shown(cruise.endTime)} UTC: no observation is due and no alarm sounds.`
            : `${cruise.name} ends at ${shown(cruise.endTime)} UTC; the watch stops then.`}
      </p>
      <div className="field">
        <label htmlFor={`${uid}-end`}>Cruise end, UTC (YYYY-MM-DD HH:MM; empty for an open cruise)</label>
        <input
          id={`${uid}-end`}
          value={text}
          placeholder="2026-12-20 08:00"
          autoComplete="off"
          onChange={(e) => setText(e.currentTarget.value)}
          onKeyDown={(e) => {
            if (e.key === 'Enter') saveTyped();
          }}
          {...(error ? { 'aria-invalid': true, 'aria-describedby': `${uid}-err` } : {})}
        />
      </div>
      <div className="inline">
        <button type="button" className="button" onClick={saveTyped}>
          Save the end time
        </button>
        {!ended && (
          <button type="button" className="button primary" onClick={endNow}>
            End the cruise now
          </button>
        )}
      </div>
      {error && (
        <p className="finding finding-error" id={`${uid}-err`} role="alert">
          {error}
        </p>
      )}
      {status && <p role="status">{status}</p>}
    </section>
  );
}

/** The end of the active cruise, when there is one. */
export function CruiseEnd() {
  const cruise = useActiveCruise();
  return cruise ? <EndEditor key={cruise.id} cruise={cruise} /> : null;
}

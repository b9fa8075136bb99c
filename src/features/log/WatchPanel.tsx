// The watch: who is on watch (handover in one step), the countdown to the next observation,
// its due and overdue states, and the hours missed in the last day.
import { useMemo, useState } from 'react';
import { setSetting } from '../../db';
import type { Cruise, Observation } from '../../domain/model';
import { formatCountdown, groupMissed, missedRunText, watchStatus, type WatchStatus } from '../../domain/watch';
import { useObservationForm } from '../../state/observationForm';
import { useWatchStore } from '../../state/watch';
import { askNotificationPermission, notificationPermission } from './alarm';
import { useNow, zoneTime } from './useNow';

export function useWatch(cruise: Cruise, observations: readonly Observation[], now: Date): WatchStatus {
  const times = useMemo(() => observations.map((o) => o.time), [observations]);
  return watchStatus(now, times, { intervalMinutes: cruise.intervalMinutes, ...(cruise.endTime ? { endTime: cruise.endTime } : {}) });
}

const STATE_WORDS = { waiting: 'Next observation', due: 'Observation due', overdue: 'Observation overdue', ended: 'Cruise ended' } as const;

/** Hands the watch to another observer: one choice, kept across reloads. */
export function handOver(cruiseId: string, observerId: string): void {
  const at = new Date().toISOString().replace(/\.\d{3}Z$/, 'Z');
  useWatchStore.getState().setObserverOnWatch(cruiseId, observerId, at);
  void setSetting('currentObserverId', observerId).catch(() => undefined);
  // A fresh entry follows the watch; one already being typed keeps its observer.
  const form = useObservationForm.getState();
  if (!form.dirty && !form.editing) form.load(cruiseId, { ...form.draft, observerId }, null, false);
}

export function WatchPanel({ cruise, observations }: { cruise: Cruise; observations: readonly Observation[] }) {
  const now = useNow(1000);
  const status = useWatch(cruise, observations, now);
  const onWatch = useWatchStore((s) => s.observerOnWatch[cruise.id] ?? '');
  const since = useWatchStore((s) => s.handoverAt[cruise.id]);
  const soundOn = useWatchStore((s) => s.soundOn);
  const setSoundOn = useWatchStore((s) => s.setSoundOn);
  const silenced = useWatchStore((s) => s.silencedSlot);
  const silence = useWatchStore((s) => s.silence);
  const [permission, setPermission] = useState(notificationPermission());
  const runs = groupMissed(status.missed.map((t) => Date.parse(t)), cruise.intervalMinutes);
  const due = new Date(status.nextDue);

  return (
    <section className={`watch-panel watch-${status.state}`} aria-label="Watch" data-testid="watch-panel" data-state={status.state}>
      <div className="watch-observer">
        <label htmlFor="watch-observer">On watch</label>
        <select id="watch-observer" value={onWatch} onChange={(e) => handOver(cruise.id, e.currentTarget.value)}>
          <option value="" disabled>
            Choose the observer
          </option>
          {cruise.observers.map((o) => (
            <option key={o.id} value={o.id}>
              {o.name} ({o.initials})
            </option>
          ))}
        </select>
        {since && <span className="muted small">since {since.slice(11, 16)} UTC</span>}
      </div>
      {status.state === 'ended' && (
        <p className="watch-ended" data-testid="watch-ended">
          <span className="watch-state">{STATE_WORDS.ended}</span> at {cruise.endTime?.slice(11, 16)} UTC on {cruise.endTime?.slice(0, 10)}: no
          observation is due and no alarm sounds. Change the end in Settings to resume the watch.
        </p>
      )}
      {status.state !== 'ended' && (
        <div className="watch-countdown" role="timer" aria-live="off">
          <span className="watch-state">{STATE_WORDS[status.state]}</span>{' '}
          <strong>
            {status.nextDue.slice(11, 16)} UTC
          </strong>{' '}
          <span className="muted">({zoneTime(due, cruise.displayTimeZone)} {cruise.displayTimeZone})</span>{' '}
          <span className="watch-remaining" data-testid="watch-remaining">{formatCountdown(status.msToDue)}</span>
        </div>
      )}
      {(status.state === 'due' || status.state === 'overdue') && (
        <p className="watch-alert" role="alert">
          {status.state === 'due' ? 'The observation is due now.' : `The ${status.nextDue.slice(11, 16)} UTC observation is overdue.`}
          {silenced !== status.nextDue && (
            <button type="button" className="button small" onClick={() => silence(status.nextDue)}>
              Silence
            </button>
          )}
        </p>
      )}
      <div className="watch-options inline">
        <label className="check">
          <input type="checkbox" checked={soundOn} onChange={(e) => setSoundOn(e.currentTarget.checked)} /> Sound
        </label>
        {permission === 'default' && (
          <button type="button" className="button small" onClick={() => void askNotificationPermission().then(setPermission)}>
            Allow notifications
          </button>
        )}
        {permission === 'denied' && <span className="muted small">Notifications are blocked in this browser.</span>}
        {permission === 'granted' && <span className="muted small">Notifications on.</span>}
      </div>
      {runs.length > 0 && (
        <div className="watch-missed">
          <h4>Missed in the last 24 h</h4>
          <ul data-testid="missed-list">
            {runs.map((r) => (
              <li key={r.from} className="finding finding-warning">
                {missedRunText(r)}
              </li>
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}

// What the watch does whichever screen is open: keep the observer on watch across reloads,
// call the observer when an observation falls due, and switch the automatic night display
// from the sun's elevation at the ship. Renders nothing.
import { useEffect, useRef } from 'react';
import { getSetting } from '../../db';
import type { Cruise, Observation } from '../../domain/model';
import { useWatchStore } from '../../state/watch';
import { beep, notify } from './alarm';
import { useActiveCruise, useObservations } from './logData';
import { useAutoTheme } from './useAutoTheme';
import { useNow } from './useNow';
import { useWatch } from './WatchPanel';

function WatchCaller({ cruise, observations }: { cruise: Cruise; observations: readonly Observation[] }) {
  const now = useNow(5000);
  const status = useWatch(cruise, observations, now);
  const soundOn = useWatchStore((s) => s.soundOn);
  const silenced = useWatchStore((s) => s.silencedSlot);
  const called = useRef<{ slot: string; state: string; atMs: number } | null>(null);

  useEffect(() => {
    // After the cruise's end nothing is called for: no sound, no notification.
    if (status.state === 'waiting' || status.state === 'ended' || silenced === status.nextDue) return;
    const last = called.current;
    const nowMs = now.getTime();
    // Call once on entering each state; while overdue, again every five minutes.
    const fresh = !last || last.slot !== status.nextDue || last.state !== status.state;
    const repeat = last && status.state === 'overdue' && nowMs - last.atMs >= 5 * 60_000;
    if (!fresh && !repeat) return;
    called.current = { slot: status.nextDue, state: status.state, atMs: nowMs };
    if (soundOn) beep(status.state);
    const hhmm = status.nextDue.slice(11, 16);
    notify(
      status.state === 'due' ? `Ice observation due at ${hhmm} UTC` : `Ice observation overdue (${hhmm} UTC)`,
      `${cruise.vesselName}: the ${hhmm} UTC observation ${status.state === 'due' ? 'is due' : 'has not been made'}.`,
      `floe-watch-${status.nextDue}`,
    );
  }, [status.state, status.nextDue, silenced, soundOn, now, cruise.vesselName]);
  return null;
}

function CruiseBackground({ cruise }: { cruise: Cruise }) {
  const observations = useObservations(cruise.id);
  const onWatch = useWatchStore((s) => s.observerOnWatch[cruise.id]);
  useAutoTheme(observations ?? []);

  useEffect(() => {
    if (onWatch) return;
    void getSetting('currentObserverId').then((id) => {
      const known = cruise.observers.find((o) => o.id === id);
      const pick = known?.id ?? cruise.observers[0]?.id;
      if (pick && !useWatchStore.getState().observerOnWatch[cruise.id]) useWatchStore.getState().setObserverOnWatch(cruise.id, pick);
    });
  }, [cruise, onWatch]);

  if (!observations) return null;
  return <WatchCaller cruise={cruise} observations={observations} />;
}

export function LogBackground() {
  const cruise = useActiveCruise();
  if (!cruise) return null;
  return <CruiseBackground cruise={cruise} />;
}

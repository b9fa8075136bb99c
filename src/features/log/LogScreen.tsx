// The watch log: the observer's screen. The watch (countdown, handover), the observation form
// with its egg code and POLARIS beside it, the cruise's observations, and the ship's GPS.
// Without a cruise it is the start screen.
import { useLiveQuery } from 'dexie-react-hooks';
import { useMemo, useState } from 'react';
import { countTrackPoints } from '../../db';
import type { Cruise, Position } from '../../domain/model';
import { useGpsStore } from '../../state/gps';
import { emptyDraft, useObservationForm } from '../../state/observationForm';
import { useSelection } from '../../state/selection';
import { useWatchStore } from '../../state/watch';
import { observationToDraft, readTime } from './formModel';
import { GpsPanel, fixAgeS } from './GpsPanel';
import { HistoryPanel } from './HistoryPanel';
import { useActiveCruise, useObservations } from './logData';
import { NumberKeypad } from './NumberKeypad';
import { ObservationForm } from './ObservationForm';
import { ObservationList } from './ObservationList';
import { useServerMarks } from '../sync/useServerMarks';
import { StartScreen } from './StartScreen';
import { TrackImportPanel } from './TrackImportPanel';
import { useTrackPosition } from './trackPosition';
import { openEdit, useDraftAutosave } from './useDraftAutosave';
import { useNow } from './useNow';
import { WatchPanel } from './WatchPanel';
import './log.css';

/** A GPS fix older than this is not taken for a new observation. */
const GPS_MAX_AGE_S = 300;

function CruiseLog({ cruise }: { cruise: Cruise }) {
  const observations = useObservations(cruise.id);
  const trackCount = useLiveQuery(() => countTrackPoints(cruise.id), [cruise.id], 0);
  const gpsStatus = useGpsStore((s) => s.status);
  const fix = useGpsStore((s) => s.fix);
  const fixAtMs = useGpsStore((s) => s.fixAtMs);
  const onWatch = useWatchStore((s) => s.observerOnWatch[cruise.id] ?? '');
  const source = useObservationForm((s) => s.draft.positionSource);
  const timeText = useObservationForm((s) => s.draft.time);
  const [historyOf, setHistoryOf] = useState<string | null>(null);
  const now = useNow(15_000);

  const defaultSource: Position['source'] = gpsStatus === 'connected' ? 'gps-serial' : trackCount > 0 ? 'track-interpolated' : 'manual';
  const { restored, state: autosave, ready } = useDraftAutosave(cruise.id, () => emptyDraft(onWatch || cruise.observers[0]?.id || '', defaultSource));

  const obsTime = useMemo(() => {
    const minute = new Date(Math.floor(now.getTime() / 60_000) * 60_000).toISOString().replace(/\.\d{3}Z$/, 'Z');
    if (timeText.trim() === '') return minute;
    const r = readTime(timeText, now);
    return r.ok ? r.iso : minute;
  }, [timeText, now]);
  const trackPosition = useTrackPosition(source === 'track-interpolated' ? cruise.id : null, obsTime);

  let livePosition: Position | null = null;
  if (source === 'gps-serial' && fix && fixAgeS(fixAtMs, fix.ageMs, now.getTime()) <= GPS_MAX_AGE_S) {
    livePosition = { lat: fix.lat, lon: fix.lon, source: 'gps-serial', ...(fix.time ? { fixTime: fix.time } : {}) };
  } else if (source === 'track-interpolated' && trackPosition?.ok) {
    livePosition = { ...trackPosition.position, fixTime: obsTime };
  }
  const trackReason = source === 'track-interpolated' && trackPosition && !trackPosition.ok ? trackPosition.reason : null;

  const select = useSelection((s) => s.select);
  const onServer = useServerMarks(cruise.id);

  if (!observations || !ready) {
    return <p role="status">Opening the log of {cruise.name}…</p>;
  }

  return (
    <section className="screen log-screen" aria-labelledby="log-title">
      <div className="log-title-row">
        <h2 id="log-title">Watch log</h2>
        <p className="muted">
          {cruise.name} · {cruise.vesselName}
        </p>
      </div>
      <WatchPanel cruise={cruise} observations={observations} />
      {restored && (
        <p className="form-notice" role="status" data-testid="draft-restored">
          Brought back the entry in progress (kept {restored.replace('T', ' ').slice(0, 19)} UTC).
        </p>
      )}
      <ObservationForm cruise={cruise} observations={observations} livePosition={livePosition} positionNote={trackReason} defaultSource={defaultSource} />
      <NumberKeypad />
      <p className="muted small autosave-line" aria-live="polite">
        {autosave.kind === 'saved' && `Draft kept ${autosave.at.slice(11, 19)} UTC.`}
        {autosave.kind === 'failed' && <span className="finding finding-error">The draft could not be kept: {autosave.message}</span>}
      </p>
      <div className="list-and-history">
        <ObservationList
          cruise={cruise}
          observations={observations}
          onServer={onServer}
          onEdit={(o) => {
            select(o.id, 'list');
            void openEdit(cruise.id, o.id, () => ({ draft: observationToDraft(o, { asNext: false }), editing: { id: o.id, expectedRevision: o.revision } })).then(() => {
              document.getElementById('form-title')?.scrollIntoView?.({ block: 'start' });
              document.getElementById('f-total')?.focus();
            });
          }}
          onHistory={(o) => {
            select(o.id, 'list');
            setHistoryOf(o.id);
          }}
        />
        {historyOf && <HistoryPanel cruise={cruise} observationId={historyOf} onClose={() => setHistoryOf(null)} />}
      </div>
      <GpsPanel cruiseId={cruise.id} />
      <TrackImportPanel cruiseId={cruise.id} />
    </section>
  );
}

export function LogScreen() {
  const cruise = useActiveCruise();
  if (cruise === undefined) {
    return (
      <section className="screen" aria-labelledby="log-title">
        <h2 id="log-title">Watch log</h2>
        <p role="status">Opening the local store…</p>
      </section>
    );
  }
  if (cruise === null) return <StartScreen />;
  return <CruiseLog key={cruise.id} cruise={cruise} />;
}

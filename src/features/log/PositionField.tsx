// Where the observation was made, and from which source: the ship's GPS, this device's
// geolocation, typed by hand in any format the domain reads, or the imported track at the
// observation time. The source is stored with the position.
import { useState } from 'react';
import { type Finding, type Position, type PositionSource } from '../../domain/model';
import { useObservationForm } from '../../state/observationForm';
import { describedBy, Field } from './Field';
import { OBSERVATION_POSITION_SOURCES, POSITION_SOURCE_LABELS } from './options';
import { showPosition } from './positionText';

interface Props {
  /** The position the entry will be saved with. */
  reading: Position | null;
  livePosition: Position | null;
  /** Why the source has no position, if it has none. */
  note: string | null;
  findings: readonly Finding[];
}

export function PositionField({ reading, livePosition, note, findings }: Props) {
  const source = useObservationForm((s) => s.draft.positionSource);
  const text = useObservationForm((s) => s.draft.positionText);
  const held = useObservationForm((s) => s.draft.position);
  const setField = useObservationForm((s) => s.setField);
  const [locating, setLocating] = useState<string | null>(null);

  const choose = (next: PositionSource) => {
    setField('positionSource', next);
    // A position taken from another source no longer applies.
    if (held && held.source !== next) setField('position', null);
  };

  const locate = () => {
    if (!('geolocation' in navigator)) {
      setLocating('This browser offers no geolocation.');
      return;
    }
    setLocating('Locating…');
    navigator.geolocation.getCurrentPosition(
      (p) => {
        setLocating(null);
        setField('position', {
          lat: p.coords.latitude,
          lon: p.coords.longitude,
          source: 'geolocation',
          accuracyM: Math.round(p.coords.accuracy),
          fixTime: new Date(p.timestamp).toISOString().replace(/\.\d{3}Z$/, 'Z'),
        });
      },
      (e) => setLocating(`No position from this device: ${e.message || 'permission refused or no fix'}.`),
      { enableHighAccuracy: true, timeout: 20_000, maximumAge: 60_000 },
    );
  };

  return (
    <div className="position-field">
      <Field id="f-position-source" label="Position from" findings={[]}>
        <select id="f-position-source" value={source} onChange={(e) => choose(e.currentTarget.value as PositionSource)}>
          {OBSERVATION_POSITION_SOURCES.map((s) => (
            <option key={s} value={s}>
              {POSITION_SOURCE_LABELS[s]}
            </option>
          ))}
        </select>
      </Field>
      {source === 'manual' ? (
        <Field id="f-position" label="Position" hint="any format" findings={findings}>
          <input
            id="f-position"
            type="text"
            autoComplete="off"
            spellCheck={false}
            placeholder="e.g. 81°12.5'N 031°05.0'E or 81.21 31.08"
            value={text}
            onFocus={(e) => e.currentTarget.select()}
            onChange={(e) => setField('positionText', e.currentTarget.value)}
            {...describedBy('f-position', findings)}
          />
        </Field>
      ) : (
        <Field id="f-position" label="Position" findings={findings}>
          <div className="inline">
            <output id="f-position" className="position-value" aria-live="polite">
              {reading ? showPosition(reading) : 'No position yet'}
            </output>
            {source === 'geolocation' && (
              <button type="button" id="f-locate" className="button small" onClick={locate}>
                {held ? 'Locate again' : 'Locate'}
              </button>
            )}
          </div>
          <p className="muted small">
            {source === 'gps-serial' && (livePosition ? 'Latest fix of the ship GPS.' : 'No GPS fix: connect the GPS under "Ship GPS".')}
            {source === 'track-interpolated' && (livePosition ? 'Along the track at the observation time.' : `No position from the track: ${note ?? 'it does not cover the observation time'}.`)}
            {source === 'geolocation' && (locating ?? (held?.accuracyM !== undefined ? `Accuracy about ${held.accuracyM} m.` : ''))}
          </p>
        </Field>
      )}
    </div>
  );
}

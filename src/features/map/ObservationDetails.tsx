// The selected observation's details beside the map. Plain React text: nothing typed by a user
// ever goes into HTML markup.
import type { Observation, Observer } from '../../domain/model';
import { deriveEggCode, eggCodeText } from '../../domain/eggCode';
import { formatPosition } from '../../domain/position';
import { iceTypeName } from '../../domain/iceTypes';
import { band, bandOfObservation } from './concentrationBands';

export function ObservationDetails({ observation, observers, onClose }: { observation: Observation; observers: readonly Observer[]; onClose: () => void }) {
  const observer = observers.find((o) => o.id === observation.observerId);
  const b = band(bandOfObservation(observation));
  return (
    <section className="map-details" aria-labelledby="map-details-title" data-testid="map-details">
      <header>
        <h3 id="map-details-title">Observation {observation.time.replace('T', ' ').replace(/:\d\d(\.\d+)?Z$/, ' UTC')}</h3>
        <button type="button" className="button" onClick={onClose} aria-label="Close details">
          Close
        </button>
      </header>
      <dl>
        <dt>Position</dt>
        <dd>{observation.position ? formatPosition({ lat: observation.position.lat, lon: observation.position.lon }) : 'none'}</dd>
        <dt>Observer</dt>
        <dd>{observer ? `${observer.name} (${observer.initials})` : observation.observerId}</dd>
        <dt>Total concentration</dt>
        <dd>
          {observation.totalConcentration === null ? 'not judged' : `${observation.totalConcentration}/10`} ({b.label})
        </dd>
        <dt>Egg code</dt>
        <dd className="egg-line">{eggCodeText(deriveEggCode(observation))}</dd>
        {observation.categories.map((c, i) => (
          <div key={i} className="details-row">
            <dt>{iceTypeName(i)}</dt>
            <dd>
              {c.partialConcentration}/10 {c.stage.replace(/-/g, ' ')}
              {c.floeSize ? `, ${c.floeSize.replace(/-/g, ' ')}` : ''}
              {c.thicknessCm !== undefined ? `, ${c.thicknessCm} cm` : ''}
            </dd>
          </div>
        ))}
        {observation.notes !== '' && (
          <>
            <dt>Notes</dt>
            <dd className="notes">{observation.notes}</dd>
          </>
        )}
      </dl>
    </section>
  );
}

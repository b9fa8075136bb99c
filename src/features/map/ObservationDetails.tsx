// The selected observation's details beside the map. Plain React text: nothing typed by a user
// ever goes into HTML markup.
import { gridTenths, type Collocation, type GridMethod } from '../../domain/collocation';
import type { Observation, Observer } from '../../domain/model';
import { STAGES } from '../../domain/nomenclature';
import { deriveEggCode, eggCodeText } from '../../domain/eggCode';
import { formatPosition } from '../../domain/position';
import { iceTypeName } from '../../domain/iceTypes';
import { band, bandOfObservation } from './concentrationBands';

export function ObservationDetails({
  observation,
  observers,
  onClose,
  collocation = null,
  gridMethod = 'bilinear',
}: {
  observation: Observation;
  observers: readonly Observer[];
  onClose: () => void;
  collocation?: Collocation | null;
  gridMethod?: GridMethod;
}) {
  const chart = collocation?.chart ?? null;
  const grid = collocation?.grid ?? null;
  const gridValue = gridTenths(grid, gridMethod);
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
        {chart && (
          <>
            <dt>Chart ({chart.sourceName}, {Math.abs(chart.hoursApart).toFixed(0)} h {chart.hoursApart >= 0 ? 'before' : 'after'})</dt>
            <dd data-testid="details-chart">
              {chart.concentration === null
                ? chart.polygonIndex === null
                  ? 'outside the chart'
                  : 'no concentration'
                : `${chart.concentration.lo === chart.concentration.hi ? chart.concentration.lo : `${chart.concentration.lo}-${chart.concentration.hi}`}/10 (CT ${chart.ctCode ?? '--'})`}
              {chart.stage ? `, ${STAGES[chart.stage].label}` : ''}
              {observation.categories[0] ? ` (observed: ${STAGES[observation.categories[0].stage].label})` : ''}
            </dd>
          </>
        )}
        {grid && (
          <>
            <dt>Satellite grid ({grid.sourceName}, {gridMethod === 'nearest' ? 'nearest cell' : 'bilinear'})</dt>
            <dd data-testid="details-grid">
              {gridValue !== null ? `${gridValue.toFixed(1)}/10` : grid.sample.kind === 'flag' ? `no value (${grid.sample.flag.replace('poleHole', 'pole hole')})` : 'outside the grid'}
            </dd>
          </>
        )}
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

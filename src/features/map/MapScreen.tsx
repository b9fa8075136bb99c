// The ice map screen: the map, its legend, filters, the projection switch and the details of
// the selected observation. The map itself lives in MapView; data comes from useMapData.
import { useMemo, useState } from 'react';
import './map.css';
import { effectiveTheme, useThemeStore } from '../../state/theme';
import { useMapView, type ProjectionChoice } from '../../state/mapView';
import { useSelection } from '../../state/selection';
import { MapView } from './MapView';
import { MapLegend } from './MapLegend';
import { MapFilters } from './MapFilters';
import { ObservationDetails } from './ObservationDetails';
import { useMapData } from './useMapData';
import { useCollocation } from '../iceinfo/useIceInfo';
import { IceInfoLegend } from './IceInfoLegend';
import { isPolarCruise, type LonLat } from './view';
import type { ProjectionKind } from './style';

const PROJECTION_LABELS: Record<ProjectionChoice, string> = { auto: 'Automatic', globe: 'Globe', mercator: 'Mercator' };

export function MapScreen() {
  const data = useMapData();
  const theme = effectiveTheme(useThemeStore());
  const choice = useMapView((s) => s.projection);
  const setChoice = useMapView((s) => s.setProjection);
  const selectedId = useSelection((s) => s.selectedId);
  const clear = useSelection((s) => s.clear);
  const [frameRequest, setFrameRequest] = useState(0);
  const ice = useCollocation(data.observations);

  const polar = useMemo(() => {
    const pts: LonLat[] = data.observations.flatMap((o) => (o.position ? [[o.position.lon, o.position.lat] as const] : []));
    const step = Math.max(1, Math.floor(data.track.length / 500));
    for (let i = 0; i < data.track.length; i += step) {
      const p = data.track[i];
      if (p) pts.push([p.lon, p.lat]);
    }
    return isPolarCruise(pts);
  }, [data.observations, data.track]);
  const projection: ProjectionKind = choice === 'auto' ? (polar ? 'globe' : 'mercator') : choice;
  const selected = selectedId ? data.observations.find((o) => o.id === selectedId) : undefined;
  const observers = data.cruise?.observers ?? [];

  return (
    <section className="screen map-screen" aria-labelledby="map-title">
      <div className="map-toolbar">
        <h2 id="map-title">Ice map</h2>
        {data.cruise && (
          <span className="map-cruise">
            {data.cruise.name}, {data.cruise.vesselName}: {data.observations.length} observations, {data.track.length} track points
          </span>
        )}
        <label>
          Projection
          <select value={choice} onChange={(e) => setChoice(e.target.value as ProjectionChoice)} aria-label="Projection">
            {(Object.keys(PROJECTION_LABELS) as ProjectionChoice[]).map((k) => (
              <option key={k} value={k}>
                {PROJECTION_LABELS[k]}
                {k === 'auto' ? ` (${polar ? 'globe' : 'Mercator'})` : ''}
              </option>
            ))}
          </select>
        </label>
        <button type="button" className="button" onClick={() => setFrameRequest((n) => n + 1)}>
          Whole cruise
        </button>
      </div>
      {data.status === 'none' && <p className="map-empty">No cruise is active yet: the map shows the basemap only. Start or load a cruise in the watch log.</p>}
      <div className="map-layout">
        <div className="map-frame">
          <p className="map-caution" data-testid="map-caution" role="note">
            Not for navigation: an overview of the ice log, not a nautical chart.
          </p>
          <MapView
            cruiseId={data.cruise?.id ?? null}
            observations={data.observations}
            observers={observers}
            track={data.track}
            intervalMinutes={data.cruise?.intervalMinutes ?? 60}
            theme={theme}
            projection={projection}
            frameRequest={frameRequest}
            iceCharts={ice.charts}
            iceGrids={ice.grids}
          />
        </div>
        <aside className="map-side">
          {selected && <ObservationDetails observation={selected} observers={observers} onClose={clear} collocation={ice.collocation.get(selected.id) ?? null} gridMethod={ice.settings.gridMethod} />}
          <MapFilters observers={observers} />
          <MapLegend theme={theme} />
          <IceInfoLegend theme={theme} charts={ice.charts} grids={ice.grids} />
        </aside>
      </div>
    </section>
  );
}

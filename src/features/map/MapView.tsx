// Mounts the MapLibre map (through MapController) and keeps it in step with React state. Data
// goes to the map only when its identity changes; selection and filters never reload data.
import { useEffect, useRef, useState } from 'react';
import type { ConcentrationGrid, IceChart } from '../../domain/collocation/chartModel';
import type { Observation, Observer, TrackPoint } from '../../domain/model';
import { useSelection } from '../../state/selection';
import { useObservationFilters } from '../../state/observationFilters';
import { MapController } from './mapController';
import { installMapDebug } from './mapDebug';
import type { MapTheme, ProjectionKind } from './style';

export interface MapViewProps {
  /** The cruise shown; a new one is framed afresh. */
  cruiseId: string | null;
  observations: readonly Observation[];
  observers: readonly Observer[];
  track: readonly TrackPoint[];
  intervalMinutes: number;
  theme: MapTheme;
  projection: ProjectionKind;
  /** Changes to this number ask the map to frame the whole cruise again. */
  frameRequest: number;
  /** Switched-on ice charts and grids, drawn under the observations. */
  iceCharts?: readonly IceChart[];
  iceGrids?: readonly ConcentrationGrid[];
}

const NO_CHARTS: readonly IceChart[] = [];
const NO_GRIDS: readonly ConcentrationGrid[] = [];

export function MapView(props: MapViewProps) {
  const container = useRef<HTMLDivElement>(null);
  const controller = useRef<MapController | null>(null);
  const [state, setState] = useState<'loading' | 'idle' | 'busy'>('loading');
  const select = useSelection((s) => s.select);
  const selectedId = useSelection((s) => s.selectedId);
  const selectionSource = useSelection((s) => s.source);
  const filters = useObservationFilters();
  const { cruiseId, observations, observers, track, intervalMinutes, theme, projection, frameRequest } = props;
  const iceCharts = props.iceCharts ?? NO_CHARTS;
  const iceGrids = props.iceGrids ?? NO_GRIDS;
  const initial = useRef({ theme, projection });

  useEffect(() => {
    if (!container.current) return;
    const c = new MapController(container.current, {
      theme: initial.current.theme,
      projection: initial.current.projection,
      onSelect: (id) => select(id, 'map'),
      onState: setState,
    });
    controller.current = c;
    const uninstall = installMapDebug(c);
    return () => {
      uninstall();
      c.destroy();
      controller.current = null;
    };
  }, [select]);

  useEffect(() => controller.current?.setCruise(cruiseId), [cruiseId]);
  useEffect(() => controller.current?.setObservations(observations, observers), [observations, observers]);
  // The zone stretches depend on the observations too; the packed track is kept between runs.
  useEffect(() => void controller.current?.setTrack({ observations, observers, track, intervalMinutes }), [observations, observers, track, intervalMinutes]);
  useEffect(() => controller.current?.setSelected(selectedId, selectionSource === 'list'), [selectedId, selectionSource]);
  useEffect(() => {
    controller.current?.setFilter({
      fromMs: filters.from === null ? null : Date.parse(filters.from),
      toMs: filters.to === null ? null : Date.parse(filters.to),
      observerIds: filters.observerIds,
    });
  }, [filters.from, filters.to, filters.observerIds]);
  useEffect(() => controller.current?.setIceInfo(iceCharts, iceGrids), [iceCharts, iceGrids]);
  useEffect(() => controller.current?.setTheme(theme), [theme]);
  useEffect(() => controller.current?.setProjection(projection), [projection]);
  useEffect(() => {
    if (frameRequest > 0) controller.current?.frame();
  }, [frameRequest]);

  return <div ref={container} className="map-canvas" data-testid="map-canvas" data-map-state={state} data-projection={projection} />;
}

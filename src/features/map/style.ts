// The offline map style, built in code. No network ever: no tile, glyph or sprite URLs. Every
// text on the map (graticule labels, egg codes) and the ship symbol are images drawn in the
// browser (see mapImages.ts) and registered on demand, so the style needs no glyph PBFs and
// icon-only symbol layers do all the labelling.
import type {
  ExpressionSpecification,
  FilterSpecification,
  GeoJSONSourceSpecification,
  LayerSpecification,
  ProjectionSpecification,
  StyleSpecification,
} from 'maplibre-gl';
import type { FeatureCollection } from 'geojson';
import { bandSymbol, hasMarks } from './bandSymbols';
import { BANDS } from './concentrationBands';
import { BAND_RANK } from './geojson';
import { graticuleFilter } from './graticule';
import { TRACK_LEVELS } from './trackLevels';

export type MapTheme = 'day' | 'night' | 'red';
export type ProjectionKind = 'globe' | 'mercator';

export interface Palette {
  ocean: string;
  land: string;
  coast: string;
  graticule: string;
  label: string;
  track: string;
  miz: string;
  stroke: string;
  selected: string;
  ship: string;
  /** Observation disc radius in CSS pixels at zoom 0, 6 and 10 (not selected). */
  radius: readonly [number, number, number];
}

/**
 * Our own palettes. The observation discs follow bandSymbols.ts: the standard's colours by day,
 * dimmed at night, a red ramp with marks in the red display. The night palette stays below
 * relative luminance 0.42; the red one has no green or blue at all.
 */
export const PALETTES: Record<MapTheme, Palette> = {
  day: { ocean: '#d6e2ec', land: '#bdb6a4', coast: '#5d5a52', graticule: '#7f93a6', label: '#33475a', track: '#1d2733', miz: '#b02cc4', stroke: '#10161d', selected: '#00e5ff', ship: '#111111', radius: [4, 6, 8] },
  night: { ocean: '#0a141d', land: '#2a3038', coast: '#6c7784', graticule: '#34475a', label: '#8c9cab', track: '#9eabb7', miz: '#b86bd0', stroke: '#000000', selected: '#3fb0c4', ship: '#9eabb7', radius: [4, 6, 8] },
  red: { ocean: '#000000', land: '#1c0000', coast: '#700000', graticule: '#3a0000', label: '#d00000', track: '#e00000', miz: '#700000', stroke: '#000000', selected: '#ff0000', ship: '#ff0000', radius: [6, 7, 9] },
};

/** The size a mark image is drawn for: the disc radius at zoom 10, the largest unselected one. */
export function markImageRadius(theme: MapTheme): number {
  return PALETTES[theme].radius[2];
}

/** A band value per observation, by its `band` property. */
function byBand(value: (key: (typeof BANDS)[number]['key']) => string): ExpressionSpecification {
  const cases = BANDS.flatMap((b) => [b.key, value(b.key)]);
  return ['match', ['get', 'band'], ...cases, value('not-judged')] as unknown as ExpressionSpecification;
}

/** Zoom at which the finer Natural Earth land (1:50m) takes over from the coarse (1:110m). */
export const FINE_LAND_ZOOM = 3;
/** Zoom from which each observation's egg code is drawn beside it. */
export const EGG_MIN_ZOOM = 7;
/**
 * Up to this zoom, observations closer than CLUSTER_RADIUS pixels are drawn as one group symbol
 * (MapLibre's clustering, in its worker): 50,000 circles in software WebGL made every frame of a
 * pan slow. From the next zoom on every observation has its own symbol; a click on a group zooms
 * in to where it comes apart, and the list reaches every observation too.
 */
export const CLUSTER_MAX_ZOOM = 6;
/**
 * Pixels at the whole zoom MapLibre groups at; between whole zooms the screen distance grows up
 * to twice that. 7 px groups only symbols that overlap (circles of 4-6 px radius), so any
 * observation more than 14 px from every other keeps its own symbol at every zoom.
 */
export const CLUSTER_RADIUS = 7;

export const SRC = {
  land110: 'land-110m',
  coast110: 'coast-110m',
  land50: 'land-50m',
  coast50: 'coast-50m',
  graticule: 'graticule',
  graticuleLabels: 'graticule-labels',
  track: 'track',
  miz: 'miz',
  observations: 'observations',
  /** The same points for the egg codes, fed only from their zoom on (see mapController). */
  eggs: 'egg-points',
  ship: 'ship',
} as const;

export const LAYER = {
  graticule: 'graticule',
  graticuleLabels: 'graticule-labels',
  observations: 'observations',
  clusters: 'observation-groups',
  egg: 'egg-codes',
  marks: 'observation-marks',
  ship: 'ship-heading',
  shipNoHeading: 'ship-position',
  track: 'track',
  miz: 'miz',
} as const;

export const SHIP_IMAGE = 'ship-heading';
/** Prefix of the mark images (`mark:c4-6`), drawn on demand in the red display. */
export const MARK_PREFIX = 'mark:';

const EMPTY: FeatureCollection = { type: 'FeatureCollection', features: [] };

function geojson(data: GeoJSONSourceSpecification['data'], extra: Partial<GeoJSONSourceSpecification> = {}): GeoJSONSourceSpecification {
  return { type: 'geojson', data, ...extra };
}

export interface StyleInput {
  theme: MapTheme;
  projection: ProjectionKind;
  land110: FeatureCollection;
  coast110: FeatureCollection;
  graticule: FeatureCollection;
}

export function projectionSpec(kind: ProjectionKind): ProjectionSpecification {
  return { type: kind };
}

/** Observations beyond the Mercator limit are the polar overlay's to draw. */
const NOT_POLAR: ExpressionSpecification = ['!=', ['get', 'polar'], true];

const SELECTED: ExpressionSpecification = ['boolean', ['feature-state', 'selected'], false];

/** A single observation, not a group (groups carry point_count). */
const SINGLE: ExpressionSpecification = ['!', ['has', 'point_count']];

/** A group's colour: the band of the highest concentration in it (BAND_RANK order), as the display draws that band. */
function groupColour(theme: MapTheme, fallback: string): ExpressionSpecification {
  const stops = BAND_RANK.flatMap((key, rank) => [rank, bandSymbol(theme, key).fill ?? fallback]);
  return ['match', ['get', 'rank'], ...stops, fallback] as unknown as ExpressionSpecification;
}

export function buildStyle(input: StyleInput): StyleSpecification {
  const p = PALETTES[input.theme];
  const [r0, r6, r10] = p.radius;
  const marks = hasMarks(input.theme);
  const graticuleLayer: LayerSpecification = {
    id: LAYER.graticule,
    type: 'line',
    source: SRC.graticule,
    // The controller sets the filter for each view; this one is the first view's.
    filter: graticuleFilter({ lat: 30, lon: 30 }),
    paint: { 'line-color': p.graticule, 'line-width': ['case', ['==', ['get', 'level'], 0], 1, 0.6] },
  };
  const trackLayers: LayerSpecification[] = TRACK_LEVELS.map((l, i) => ({
    id: `${LAYER.track}-${i}`,
    type: 'line',
    source: SRC.track,
    minzoom: l.minZoom,
    maxzoom: l.maxZoom,
    filter: ['==', ['get', 'level'], i],
    layout: { 'line-join': 'round', 'line-cap': 'round' },
    paint: { 'line-color': p.track, 'line-width': 1.6 },
  }));
  return {
    version: 8,
    name: 'Floe Ledger offline',
    projection: projectionSpec(input.projection),
    sources: {
      [SRC.land110]: geojson(input.land110, { maxzoom: 6 }),
      [SRC.coast110]: geojson(input.coast110, { maxzoom: 6 }),
      [SRC.land50]: geojson(EMPTY),
      [SRC.coast50]: geojson(EMPTY),
      [SRC.graticule]: geojson(input.graticule, { maxzoom: 8 }),
      [SRC.graticuleLabels]: geojson(EMPTY),
      [SRC.track]: geojson(EMPTY),
      [SRC.miz]: geojson(EMPTY),
      [SRC.observations]: geojson(EMPTY, {
        promoteId: 'id',
        cluster: true,
        clusterMaxZoom: CLUSTER_MAX_ZOOM,
        clusterRadius: CLUSTER_RADIUS,
        clusterProperties: { rank: ['max', ['get', 'rank']] },
      }),
      [SRC.eggs]: geojson(EMPTY),
      [SRC.ship]: geojson(EMPTY),
    },
    layers: [
      { id: 'ocean', type: 'background', paint: { 'background-color': p.ocean } },
      // No fill outline: on the globe a polygon outline draws a false line along the seam.
      { id: 'land-coarse', type: 'fill', source: SRC.land110, maxzoom: FINE_LAND_ZOOM, paint: { 'fill-color': p.land, 'fill-antialias': false } },
      { id: 'land-fine', type: 'fill', source: SRC.land50, minzoom: FINE_LAND_ZOOM, paint: { 'fill-color': p.land, 'fill-antialias': false } },
      graticuleLayer,
      { id: 'coast-coarse', type: 'line', source: SRC.coast110, maxzoom: FINE_LAND_ZOOM, paint: { 'line-color': p.coast, 'line-width': 0.7 } },
      { id: 'coast-fine', type: 'line', source: SRC.coast50, minzoom: FINE_LAND_ZOOM, paint: { 'line-color': p.coast, 'line-width': 0.8 } },
      {
        id: LAYER.graticuleLabels,
        type: 'symbol',
        source: SRC.graticuleLabels,
        layout: { 'icon-image': ['get', 'text'], 'icon-padding': 4, 'icon-allow-overlap': false },
      },
      {
        id: LAYER.miz,
        type: 'line',
        source: SRC.miz,
        layout: { 'line-join': 'round', 'line-cap': 'round' },
        paint: { 'line-color': p.miz, 'line-width': 9, 'line-opacity': 0.5 },
      },
      ...trackLayers,
      {
        id: LAYER.clusters,
        type: 'circle',
        source: SRC.observations,
        filter: ['has', 'point_count'],
        paint: {
          'circle-color': groupColour(input.theme, p.ocean),
          'circle-radius': ['step', ['get', 'point_count'], 7, 10, 9, 100, 11, 1000, 13],
          'circle-stroke-color': p.stroke,
          'circle-stroke-width': 2.5,
          'circle-pitch-alignment': 'map',
        },
      },
      {
        id: LAYER.observations,
        type: 'circle',
        source: SRC.observations,
        filter: ['all', SINGLE, NOT_POLAR],
        paint: {
          'circle-color': byBand((k) => bandSymbol(input.theme, k).fill ?? p.ocean),
          'circle-radius': ['interpolate', ['linear'], ['zoom'], 0, ['case', SELECTED, r0 + 4, r0], 6, ['case', SELECTED, r6 + 4, r6], 10, ['case', SELECTED, r10 + 5, r10]],
          'circle-stroke-color': ['case', SELECTED, p.selected, marks ? byBand((k) => bandSymbol(input.theme, k).ring) : p.stroke],
          'circle-stroke-width': ['case', SELECTED, 3, marks ? 1.5 : 1],
          'circle-pitch-alignment': 'map',
        },
      },
      {
        // The red display's marks, one per band, drawn over the discs at the discs' size.
        id: LAYER.marks,
        type: 'symbol',
        source: SRC.observations,
        filter: ['all', SINGLE, NOT_POLAR],
        layout: {
          visibility: marks ? 'visible' : 'none',
          'icon-image': ['concat', MARK_PREFIX, ['get', 'band']],
          'icon-size': ['interpolate', ['linear'], ['zoom'], 0, r0 / r10, 6, r6 / r10, 10, 1],
          'icon-allow-overlap': true,
          'icon-ignore-placement': true,
          'icon-pitch-alignment': 'map',
        },
      },
      {
        id: LAYER.egg,
        type: 'symbol',
        source: SRC.eggs,
        minzoom: EGG_MIN_ZOOM,
        filter: ['all', ['!=', ['get', 'egg'], ''], NOT_POLAR],
        layout: { 'icon-image': ['get', 'egg'], 'icon-anchor': 'left', 'icon-offset': [12, 0], 'icon-padding': 2 },
      },
      {
        id: LAYER.ship,
        type: 'symbol',
        source: SRC.ship,
        filter: ['>=', ['get', 'heading'], 0],
        layout: {
          'icon-image': SHIP_IMAGE,
          'icon-rotate': ['get', 'heading'],
          'icon-rotation-alignment': 'map',
          'icon-allow-overlap': true,
          'icon-ignore-placement': true,
        },
      },
      {
        id: LAYER.shipNoHeading,
        type: 'circle',
        source: SRC.ship,
        filter: ['<', ['get', 'heading'], 0],
        paint: { 'circle-radius': 7, 'circle-color': p.ship, 'circle-stroke-color': p.ocean, 'circle-stroke-width': 2 },
      },
    ],
  };
}

export interface ObservationFilter {
  /** Milliseconds since 1970, inclusive; null for open. */
  fromMs: number | null;
  toMs: number | null;
  /** Observer ids to show; empty shows all. */
  observerIds: readonly string[];
}

/** The layer filter for the time range and observers: filtering needs no data reload. */
export function observationFilter(f: ObservationFilter): FilterSpecification | null {
  const parts: ExpressionSpecification[] = [];
  if (f.fromMs !== null) parts.push(['>=', ['get', 't'], f.fromMs]);
  if (f.toMs !== null) parts.push(['<=', ['get', 't'], f.toMs]);
  if (f.observerIds.length > 0) parts.push(['in', ['get', 'observerId'], ['literal', [...f.observerIds]]]);
  if (parts.length === 0) return null;
  return parts.length === 1 ? (parts[0] as FilterSpecification) : ['all', ...parts];
}

/** The symbol layer's filter: single observations, the polar rule and the shared filter. */
export function observationLayerFilter(f: ObservationFilter): FilterSpecification {
  const shared = observationFilter(f);
  return shared ? ['all', SINGLE, NOT_POLAR, shared as ExpressionSpecification] : ['all', SINGLE, NOT_POLAR];
}

/** The egg layer's filter: its own condition, the polar rule and the shared one. */
export function eggFilter(f: ObservationFilter): FilterSpecification {
  const shared = observationFilter(f);
  const own: ExpressionSpecification = ['!=', ['get', 'egg'], ''];
  return shared ? ['all', own, NOT_POLAR, shared as ExpressionSpecification] : ['all', own, NOT_POLAR];
}

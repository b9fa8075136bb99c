// The graticule: lines of latitude and longitude whose spacing follows the zoom, and labels for
// the lines in view. Lines are static (one source, a level per spacing); labels are made for
// the current view only, so there are never more than a few hundred of them.
import type { Feature, FeatureCollection, LineString, Point } from 'geojson';
import type { FilterSpecification } from 'maplibre-gl';

/**
 * Spacing in degrees by zoom: each spacing applies from `minZoom` up to the next level's. The
 * zoom is the equator-equivalent one (see `scaleZoom`), so the spacing follows what is seen.
 */
export const GRATICULE_LEVELS: readonly { step: number; minZoom: number }[] = [
  { step: 30, minZoom: 0 },
  { step: 10, minZoom: 2 },
  { step: 5, minZoom: 3.5 },
  { step: 2, minZoom: 5 },
  { step: 1, minZoom: 6 },
];

/**
 * The map's zoom as the zoom that shows the same ground scale at the equator: both Mercator
 * and MapLibre's globe magnify the centre by 1/cos(latitude), so near 85 N zoom 1 shows what
 * zoom 4.5 shows at the equator.
 */
export function scaleZoom(zoom: number, centreLat: number): number {
  const c = Math.cos((Math.min(89, Math.abs(centreLat)) * Math.PI) / 180);
  return zoom - Math.log2(c);
}

export function graticuleStep(zoom: number): number {
  let step = (GRATICULE_LEVELS[0] as { step: number }).step;
  for (const l of GRATICULE_LEVELS) if (zoom >= l.minZoom) step = l.step;
  return step;
}

export interface GraticuleSteps {
  lat: number;
  lon: number;
}

/**
 * Spacing of parallels and meridians for a view: parallels by the scale at the centre, meridians
 * wider apart towards the poles, where a degree of longitude is only cos(lat) of a degree of
 * latitude on the ground.
 */
export function graticuleSteps(zoom: number, centreLat: number): GraticuleSteps {
  const lat = graticuleStep(scaleZoom(zoom, centreLat));
  const wanted = lat / Math.max(0.02, Math.cos((Math.min(89, Math.abs(centreLat)) * Math.PI) / 180));
  const lon = GRATICULE_LEVELS.map((l) => l.step)
    .filter((s) => s >= wanted)
    .reduce((a, b) => Math.min(a, b), 30);
  return { lat, lon: Math.max(lat, lon) };
}

export function levelIndex(step: number): number {
  const i = GRATICULE_LEVELS.findIndex((l) => l.step === step);
  return i < 0 ? 0 : i;
}

/** The index of the coarsest level a line at `deg` belongs to. */
function levelOf(deg: number): number {
  const i = GRATICULE_LEVELS.findIndex((l) => Math.abs(deg / l.step - Math.round(deg / l.step)) < 1e-9);
  return i < 0 ? GRATICULE_LEVELS.length - 1 : i;
}

/** Points every `every` degrees, so the lines bend properly on the globe and in Mercator. */
function range(from: number, to: number, every: number): number[] {
  const out: number[] = [];
  for (let v = from; v < to; v += every) out.push(v);
  out.push(to);
  return out;
}

/**
 * Every graticule line at the finest spacing, each tagged with `kind` and `level`, the index of
 * the coarsest spacing it belongs to. The layer's filter shows the levels the view needs.
 * Meridians stop short of the pole, where they would crowd together.
 */
export function graticuleLines(): FeatureCollection<LineString, { level: number; kind: 'lat' | 'lon' }> {
  const finest = (GRATICULE_LEVELS[GRATICULE_LEVELS.length - 1] as { step: number }).step;
  const features: Feature<LineString, { level: number; kind: 'lat' | 'lon' }>[] = [];
  for (let lon = -180; lon < 180; lon += finest) {
    const level = levelOf(lon);
    // Only the coarsest meridians run on towards the pole, where the others would crowd it.
    const reach = level === 0 ? 89 : 85;
    features.push({ type: 'Feature', properties: { level, kind: 'lon' }, geometry: { type: 'LineString', coordinates: range(-reach, reach, 2).map((lat) => [lon, lat]) } });
  }
  for (let lat = -89; lat <= 89; lat += finest) {
    features.push({ type: 'Feature', properties: { level: levelOf(lat), kind: 'lat' }, geometry: { type: 'LineString', coordinates: range(-180, 180, 2).map((lon) => [lon, lat]) } });
  }
  return { type: 'FeatureCollection', features };
}

/** 80°N, 20°W, 0°, 180°: degrees with a hemisphere letter. */
export function formatLat(lat: number): string {
  return lat === 0 ? '0°' : `${Math.abs(lat)}°${lat > 0 ? 'N' : 'S'}`;
}

export function formatLon(lon: number): string {
  const l = ((((lon + 180) % 360) + 360) % 360) - 180;
  if (l === 0) return '0°';
  if (l === -180) return '180°';
  return `${Math.abs(l)}°${l > 0 ? 'E' : 'W'}`;
}

export interface ViewBox {
  west: number;
  south: number;
  east: number;
  north: number;
}

export interface LabelProps {
  /** The label text, also the key of the label's image. */
  text: string;
  kind: 'lat' | 'lon';
}

export const MAX_LABELS = 600;

/**
 * Labels for the graticule lines in view: each parallel labelled where it meets every other
 * meridian, each meridian halfway between parallels, so the two never sit on one spot. The
 * renderer drops labels that collide. `east` may exceed 180 when the view crosses the seam.
 */
export function graticuleLabels(view: ViewBox, steps: GraticuleSteps): FeatureCollection<Point, LabelProps> {
  const features: Feature<Point, LabelProps>[] = [];
  const { lat: latStep, lon: lonStep } = steps;
  const south = Math.max(-89, Math.ceil(view.south / latStep) * latStep);
  const north = Math.min(89, Math.floor(view.north / latStep) * latStep);
  const west = Math.ceil(view.west / lonStep) * lonStep;
  const east = Math.floor(view.east / lonStep) * lonStep;
  const full = () => features.length >= MAX_LABELS;
  for (let lat = south; lat <= north && !full(); lat += latStep) {
    for (let lon = Math.floor(west / (2 * lonStep)) * 2 * lonStep + lonStep; lon <= east + lonStep && !full(); lon += 2 * lonStep) {
      features.push({ type: 'Feature', properties: { text: formatLat(lat), kind: 'lat' }, geometry: { type: 'Point', coordinates: [lon, lat] } });
    }
  }
  for (let lon = west; lon <= east && !full(); lon += lonStep) {
    for (let lat = Math.floor(south / (2 * latStep)) * 2 * latStep; lat <= north && !full(); lat += 2 * latStep) {
      const at = lat + latStep / 2;
      if (Math.abs(at) > 88 || at < view.south - latStep || at > view.north + latStep) continue;
      features.push({ type: 'Feature', properties: { text: formatLon(lon), kind: 'lon' }, geometry: { type: 'Point', coordinates: [lon, at] } });
    }
  }
  return { type: 'FeatureCollection', features };
}

/** The graticule layer's filter for the spacings of the view. */
export function graticuleFilter(steps: GraticuleSteps): FilterSpecification {
  return [
    'any',
    ['all', ['==', ['get', 'kind'], 'lat'], ['<=', ['get', 'level'], levelIndex(steps.lat)]],
    ['all', ['==', ['get', 'kind'], 'lon'], ['<=', ['get', 'level'], levelIndex(steps.lon)]],
  ];
}

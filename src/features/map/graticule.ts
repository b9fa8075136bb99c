// The graticule: lines of latitude and longitude whose spacing follows the zoom, and labels for
// the lines in view. Lines are static (one source, a level per spacing); labels are made for
// the current view only, so there are never more than a few hundred of them.
import type { Feature, FeatureCollection, LineString, Point } from 'geojson';

/** Spacing in degrees by zoom: the spacing applies from `minZoom` up to the next level's. */
export const GRATICULE_LEVELS: readonly { step: number; minZoom: number }[] = [
  { step: 30, minZoom: 0 },
  { step: 10, minZoom: 2 },
  { step: 5, minZoom: 4 },
  { step: 2, minZoom: 5.5 },
  { step: 1, minZoom: 6.5 },
];

export function graticuleStep(zoom: number): number {
  let step = (GRATICULE_LEVELS[0] as { step: number }).step;
  for (const l of GRATICULE_LEVELS) if (zoom >= l.minZoom) step = l.step;
  return step;
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
 * Every graticule line at the finest spacing, each tagged with `level`, the index of the
 * coarsest spacing it belongs to. A layer for spacing i shows the lines with level <= i.
 * Meridians stop short of the pole, where they would crowd together.
 */
export function graticuleLines(): FeatureCollection<LineString, { level: number }> {
  const finest = (GRATICULE_LEVELS[GRATICULE_LEVELS.length - 1] as { step: number }).step;
  const features: Feature<LineString, { level: number }>[] = [];
  for (let lon = -180; lon < 180; lon += finest) {
    const level = levelOf(lon);
    // Only the coarsest meridians run on towards the pole, where the others would crowd it.
    const reach = level === 0 ? 89 : 85;
    features.push({ type: 'Feature', properties: { level }, geometry: { type: 'LineString', coordinates: range(-reach, reach, 2).map((lat) => [lon, lat]) } });
  }
  for (let lat = -89; lat <= 89; lat += finest) {
    features.push({ type: 'Feature', properties: { level: levelOf(lat) }, geometry: { type: 'LineString', coordinates: range(-180, 180, 2).map((lon) => [lon, lat]) } });
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
export function graticuleLabels(view: ViewBox, step: number): FeatureCollection<Point, LabelProps> {
  const features: Feature<Point, LabelProps>[] = [];
  const south = Math.max(-89, Math.ceil(view.south / step) * step);
  const north = Math.min(89, Math.floor(view.north / step) * step);
  const west = Math.ceil(view.west / step) * step;
  const east = Math.floor(view.east / step) * step;
  // Near a pole meridians crowd together: label only every few of them.
  const nearPole = Math.max(Math.abs(view.south), Math.abs(view.north)) > 75 && view.east - view.west > 90;
  const lonStep = nearPole ? Math.max(step, 30) : step;
  for (let lat = south; lat <= north; lat += step) {
    for (let lon = Math.ceil(west / (2 * lonStep)) * 2 * lonStep; lon <= east; lon += 2 * lonStep) {
      features.push({ type: 'Feature', properties: { text: formatLat(lat), kind: 'lat' }, geometry: { type: 'Point', coordinates: [lon + lonStep, lat] } });
      if (features.length >= MAX_LABELS) return { type: 'FeatureCollection', features };
    }
  }
  for (let lon = Math.ceil(west / lonStep) * lonStep; lon <= east; lon += lonStep) {
    for (let lat = south; lat <= north; lat += 2 * step) {
      const at = lat + step / 2;
      if (Math.abs(at) > 88) continue;
      features.push({ type: 'Feature', properties: { text: formatLon(lon), kind: 'lon' }, geometry: { type: 'Point', coordinates: [lon, at] } });
      if (features.length >= MAX_LABELS) return { type: 'FeatureCollection', features };
    }
  }
  return { type: 'FeatureCollection', features };
}

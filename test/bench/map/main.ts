// The map benchmark page: the app's map (MapController) or bare MapLibre given the same data,
// chosen by ?mode=subject|baseline, or ?mode=floor for bare MapLibre with the basemap alone (what
// software WebGL's frames cost without any data). Invented data: 50,000 observations along a 1,000,000-point
// track in the Arctic. The page reports through window.__bench.
import { Map as MapLibreMap, type GeoJSONSource } from 'maplibre-gl';
import 'maplibre-gl/dist/maplibre-gl.css';
import type { FeatureCollection } from 'geojson';
import type { Observation, TrackPoint } from '../../../src/domain/model';
import { MapController } from '../../../src/features/map/mapController';
import { coarseLand, graticuleData } from '../../../src/features/map/basemap';
import { buildStyle, SRC } from '../../../src/features/map/style';
import { observationFeatures } from '../../../src/features/map/geojson';

const N_OBS = 50_000;
const N_TRACK = 1_000_000;
const START = Date.UTC(2026, 2, 1);

interface BenchResult {
  idleMs: number;
  loadLongestTaskMs: number;
  panLongestTaskMs: number;
  /** The longest single script (a callback and what it calls) in any frame, from Long Animation Frames. */
  loadLongestScriptMs: number;
  panLongestScriptMs: number;
}

declare global {
  interface Window {
    __bench?: { result: Promise<BenchResult> };
  }
}

function makeData(): { track: TrackPoint[]; observations: Observation[] } {
  const track: TrackPoint[] = new Array(N_TRACK);
  for (let i = 0; i < N_TRACK; i++) {
    const f = i / N_TRACK;
    // A meandering transect from 75 N 10 E to 84 N and back west, one fix every 2 s.
    const lat = 75 + 9 * Math.sin(Math.PI * f) + 0.05 * Math.sin(i / 700);
    const lon = 10 + 25 * Math.sin(2 * Math.PI * f) + 0.05 * Math.cos(i / 900);
    track[i] = { cruiseId: 'bench', time: new Date(START + i * 2000).toISOString(), lat, lon, source: 'gps-serial', headingDeg: (i / 100) % 360 };
  }
  const observations: Observation[] = new Array(N_OBS);
  for (let k = 0; k < N_OBS; k++) {
    const p = track[Math.floor((k * N_TRACK) / N_OBS)] as TrackPoint;
    const total = k % 11;
    observations[k] = {
      id: `o${k}`, cruiseId: 'bench', time: p.time, position: { lat: p.lat, lon: p.lon, source: 'gps-serial' }, observerId: k % 2 ? 'a' : 'b',
      totalConcentration: total, categories: total ? [{ partialConcentration: total, stage: 'first-year', floeSize: 'big-floe' }] : [],
      notes: '', photoIds: [], revision: 1, savedAt: p.time, savedBy: 'a', deviceId: 'bench', deleted: false,
    };
  }
  return { track, observations };
}

const longTasks: number[] = [];
new PerformanceObserver((list) => {
  for (const e of list.getEntries()) longTasks.push(e.duration);
}).observe({ type: 'longtask', buffered: true });

// Long Animation Frames split a long task into the scripts that ran in it; what is left is the
// browser's own work (style, layout, and here above all the compositor waiting for SwiftShader
// to draw the WebGL frame and reading it back).
interface ScriptTiming { duration: number }
interface AnimationFrameTiming { scripts?: ScriptTiming[] }
const longScripts: number[] = [];
new PerformanceObserver((list) => {
  for (const e of list.getEntries() as unknown as AnimationFrameTiming[]) for (const sc of e.scripts ?? []) longScripts.push(sc.duration);
}).observe({ type: 'long-animation-frame', buffered: true });

function until(cond: () => boolean): Promise<void> {
  return new Promise((resolve) => {
    const tick = () => (cond() ? resolve() : setTimeout(tick, 20));
    tick();
  });
}

async function pan(map: MapLibreMap): Promise<{ task: number; script: number }> {
  longTasks.length = 0;
  longScripts.length = 0;
  for (let i = 0; i < 16; i++) {
    map.panBy([i % 8 < 4 ? 180 : -180, i % 4 < 2 ? 60 : -60], { duration: 250 });
    await new Promise<void>((r) => map.once('moveend', () => r()));
  }
  await new Promise<void>((r) => (map.loaded() ? r() : map.once('idle', () => r())));
  return { task: Math.max(0, ...longTasks), script: Math.max(0, ...longScripts) };
}

async function run(): Promise<BenchResult> {
  const mode = new URLSearchParams(location.search).get('mode') ?? 'subject';
  const { track, observations } = makeData();
  const container = document.getElementById('map') as HTMLElement;
  // Settle after the data generation, then measure from here.
  await new Promise((r) => setTimeout(r, 500));
  longTasks.length = 0;
  longScripts.length = 0;
  const t0 = performance.now();
  let map: MapLibreMap;
  if (mode === 'floor') {
    // The floor: bare MapLibre with the same style and basemap but no observations and no
    // track, on the same view. What its frames cost is what software WebGL costs here.
    const coarse = coarseLand();
    const style = buildStyle({ theme: 'day', projection: 'mercator', land110: coarse.land, coast110: coarse.coast, graticule: graticuleData() });
    map = new MapLibreMap({ container, style, fadeDuration: 0 });
    await new Promise<void>((r) => map.once('load', () => r()));
  } else if (mode === 'baseline') {
    // Bare MapLibre: the same style and basemap, the same observations and the full track as
    // GeoJSON objects straight into the sources, no worker, no simplification, no overlay.
    const coarse = coarseLand();
    const style = buildStyle({ theme: 'day', projection: 'mercator', land110: coarse.land, coast110: coarse.coast, graticule: graticuleData() });
    const trackFc: FeatureCollection = {
      type: 'FeatureCollection',
      features: [{ type: 'Feature', properties: { level: 0 }, geometry: { type: 'LineString', coordinates: track.map((p) => [p.lon, p.lat]) } }],
    };
    const obsFc = observationFeatures(observations);
    style.layers = style.layers.map((l) => (l.id.startsWith('track-') ? { ...l, filter: ['==', ['get', 'level'], 0], minzoom: 0, maxzoom: 24 } : l)) as typeof style.layers;
    // Bare: every observation its own circle, no grouping at small zooms.
    style.sources[SRC.observations] = { type: 'geojson', data: { type: 'FeatureCollection', features: [] }, promoteId: 'id' };
    map = new MapLibreMap({ container, style, fadeDuration: 0 });
    await new Promise<void>((r) => map.once('load', () => r()));
    (map.getSource(SRC.track) as GeoJSONSource).setData(trackFc);
    (map.getSource(SRC.observations) as GeoJSONSource).setData(obsFc);
    await until(() => map.isSourceLoaded(SRC.track) && map.isSourceLoaded(SRC.observations));
  } else {
    let fed = false;
    const c = new MapController(container, { theme: 'day', projection: 'mercator', onSelect: () => undefined, onTrackFed: () => (fed = true) });
    map = c.map;
    c.setObservations(observations, [{ id: 'a', name: 'A', initials: 'A' }]);
    void c.setTrack({ observations, observers: [], track, intervalMinutes: 60 });
    await until(() => fed && map.loaded() && map.isSourceLoaded(SRC.track));
  }
  // Both end on the same view, fully drawn.
  const idle = new Promise<void>((r) => map.once('idle', () => r()));
  map.jumpTo({ center: [20, 80], zoom: 3 });
  await idle;
  const idleMs = performance.now() - t0;
  const loadLongestTaskMs = Math.max(0, ...longTasks);
  const loadLongestScriptMs = Math.max(0, ...longScripts);
  const panned = await pan(map);
  return { idleMs, loadLongestTaskMs, panLongestTaskMs: panned.task, loadLongestScriptMs, panLongestScriptMs: panned.script };
}

window.__bench = { result: run() };

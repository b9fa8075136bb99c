// A hook for the browser tests, hidden in production: it exists only when the page was opened
// with `?map-debug`. It reads the map (screen positions, zoom, projection) and puts a test
// cruise in only through the app's own path, the local store's public functions.
import { addTrackPoints, createCruise, saveObservation, setActiveCruise } from '../../db';
import type { Cruise, Observation, TrackPoint } from '../../domain/model';
import type { MapController } from './mapController';

export interface MapDebug {
  project: (lon: number, lat: number) => { x: number; y: number };
  zoom: () => number;
  center: () => { lon: number; lat: number };
  projection: () => string;
  /** Every position the initial view frames. */
  positions: () => (readonly [number, number])[];
  jumpTo: (lon: number, lat: number, zoom: number) => void;
  frame: () => void;
  fineLand: () => string;
  /** Whether MapLibre's workers read the map's blob URLs themselves (maplibreWorkerPatch.ts). */
  workerPatch: () => string;
  /** The raster of an image the map holds (e.g. `egg:<id>`), or null while it is not drawn. */
  image: (id: string) => { width: number; height: number; data: number[] } | null;
  /** Stores a cruise with its observations and track and makes it the active one. */
  loadCruise: (cruise: Cruise, observations: Observation[], track: TrackPoint[]) => Promise<void>;
}

declare global {
  interface Window {
    __floeMapDebug?: MapDebug;
  }
}

export function installMapDebug(c: MapController): () => void {
  if (typeof window === 'undefined' || !new URLSearchParams(window.location.search).has('map-debug')) return () => undefined;
  window.__floeMapDebug = {
    project: (lon, lat) => {
      const p = c.map.project([lon, lat]);
      return { x: p.x, y: p.y };
    },
    zoom: () => c.map.getZoom(),
    center: () => {
      const l = c.map.getCenter();
      return { lon: l.lng, lat: l.lat };
    },
    projection: () => c.map.getProjection()?.type?.toString() ?? 'mercator',
    positions: () => c.positions(),
    jumpTo: (lon, lat, zoom) => c.map.jumpTo({ center: [lon, lat], zoom }),
    frame: () => c.frame(),
    fineLand: () => c.fineLand,
    workerPatch: () => c.workerPatch,
    image: (id) => {
      const img = c.map.getImage(id);
      return img ? { width: img.data.width, height: img.data.height, data: Array.from(img.data.data) } : null;
    },
    loadCruise: async (cruise, observations, track) => {
      const stored = await createCruise(cruise);
      for (const o of observations) await saveObservation({ ...o, cruiseId: stored.id });
      await addTrackPoints(track.map((p) => ({ ...p, cruiseId: stored.id })));
      await setActiveCruise(stored.id);
    },
  };
  return () => {
    delete window.__floeMapDebug;
  };
}

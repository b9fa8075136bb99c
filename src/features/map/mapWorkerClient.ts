// The page's side of the map worker (mapWorker.ts). The main thread packs the track points into
// typed arrays in small slices (so no slice blocks the page); the worker does the rest.
import type { FeatureCollection } from 'geojson';
import type { Topology } from 'topojson-specification';
import type { TrackPoint } from '../../domain/model';
import { packTrackInSlices } from '../../gps/trackColumns';
import { mapObservationFeatures, type ObservationColumns } from './geojson';
import { landFromTopology } from './land';
import MapDataWorker from './mapWorker.ts?worker&inline';
import { mizFeatures, toleranceAtZoom, trackLevels, type PolarParts, type TrackArrays } from './trackLevels';

export interface TrackJob extends TrackArrays {
  kind: 'track';
  id: number;
  obsT: Float64Array;
  obsMiz: Uint8Array;
  maxGapMs: number;
}

export interface LandJob {
  kind: 'land';
  id: number;
  /** Where the world-atlas topology is served from (a bundled asset). */
  url: string;
}

export interface ObservationsJob extends ObservationColumns {
  kind: 'observations';
  id: number;
}

export type WorkerJob = TrackJob | LandJob | ObservationsJob;

/** Two GeoJSON documents as UTF-8 (track levels and zone stretches, or land and coastlines). */
export type WorkerResult =
  | { id: number; kind: 'track' | 'land'; a: ArrayBuffer; b: ArrayBuffer; /** Track only: the parts beyond the Mercator limit. */ c?: ArrayBuffer }
  | { id: number; kind: 'observations'; a: ArrayBuffer }
  | { id: number; kind: 'error'; message: string };

/** GeoJSON for a source: an object, or a URL MapLibre loads in its own worker. */
export type SourceData = FeatureCollection | string;

/** One GeoJSON document for a source, as PreparedPair. */
export interface PreparedOne {
  data: SourceData;
  release: () => void;
}

export interface PreparedPair {
  a: SourceData;
  b: SourceData;
  /** Frees the blob URLs once MapLibre has read them. */
  release: () => void;
  /** Track only: the parts poleward of the Mercator limit, for the polar overlay. */
  polar?: PolarParts;
}

/** The track in time order as typed arrays, built a slice at a time (src/gps/trackColumns.ts). */
export function packTrack(track: readonly TrackPoint[], signal?: AbortSignal): Promise<TrackArrays> {
  return packTrackInSlices(track, signal);
}

const decoder = new TextDecoder();

/** UTF-8 GeoJSON as a blob: URL for MapLibre (parsed in place where there are no blob URLs). */
function sourceData(buf: ArrayBuffer): PreparedOne {
  if (typeof URL.createObjectURL !== 'function') return { data: JSON.parse(decoder.decode(buf)) as FeatureCollection, release: () => undefined };
  const url = URL.createObjectURL(new Blob([buf], { type: 'application/json' }));
  return { data: url, release: () => URL.revokeObjectURL(url) };
}

/**
 * Runs jobs in one Web Worker; without Worker support (tests in Node) it computes in place.
 */
export class MapWorker {
  private worker: Promise<Worker> | null = null;
  private disposed = false;
  private nextId = 1;
  private pending = new Map<number, (r: WorkerResult) => void>();

  constructor() {
    if (typeof Worker !== 'undefined') {
      // Inlined in the bundle and started from a blob URL: the worker needs no request of its
      // own, so the map also starts with no network and no service worker (CSP: worker-src blob:).
      this.worker = Promise.resolve().then(() => {
        const w = new MapDataWorker({ name: 'floe-map-data' });
        w.onmessage = (e: MessageEvent<WorkerResult>) => {
          const done = this.pending.get(e.data.id);
          this.pending.delete(e.data.id);
          done?.(e.data);
        };
        if (this.disposed) w.terminate();
        return w;
      });
    }
  }

  private post(job: WorkerJob, transfer: Transferable[]): Promise<WorkerResult> {
    const worker = this.worker as Promise<Worker>;
    return worker.then((w) => new Promise<WorkerResult>((resolve) => {
      this.pending.set(job.id, resolve);
      w.postMessage(job, transfer);
    })).then((r) => {
      if (r.kind === 'error') throw new Error(r.message);
      return r;
    });
  }

  private run(job: WorkerJob, transfer: Transferable[]): Promise<PreparedPair> {
    return this.post(job, transfer).then((r) => {
      if (r.kind !== 'track' && r.kind !== 'land') throw new Error(`map worker: a pair was expected, not ${r.kind}`);
      const polar = r.c ? (JSON.parse(decoder.decode(r.c)) as PolarParts) : undefined;
      const a = sourceData(r.a);
      const b = sourceData(r.b);
      return { a: a.data, b: b.data, polar, release: () => { a.release(); b.release(); } };
    });
  }

  /**
   * The observation points for MapLibre, written by the worker from columns (the typed arrays are
   * handed over, not copied) and given to MapLibre as a URL its own worker reads.
   */
  observations(cols: ObservationColumns): Promise<PreparedOne> {
    if (!this.worker) return Promise.resolve({ data: mapObservationFeatures(cols), release: () => undefined });
    const job: ObservationsJob = { kind: 'observations', id: this.nextId++, ...cols };
    return this.post(job, [cols.lon.buffer, cols.lat.buffer, cols.t.buffer, cols.band.buffer, cols.observer.buffer]).then((r) => {
      if (r.kind !== 'observations') throw new Error(`map worker: observations were expected, not ${r.kind}`);
      return sourceData(r.a);
    });
  }

  /** Track levels (a) and marginal ice zone stretches (b). The arrays are handed over, not copied. */
  track(track: TrackArrays, zones: { t: Float64Array; miz: Uint8Array }, maxGapMs: number): Promise<PreparedPair> {
    if (!this.worker) {
      const polar: PolarParts = { track: [], miz: [] };
      const a = trackLevels(track, polar);
      return Promise.resolve({ a, b: mizFeatures(track, zones.t, zones.miz, maxGapMs, toleranceAtZoom(12), polar), release: () => undefined, polar });
    }
    const job: TrackJob = { kind: 'track', id: this.nextId++, ...track, obsT: zones.t, obsMiz: zones.miz, maxGapMs };
    return this.run(job, [track.t.buffer, track.lon.buffer, track.lat.buffer]);
  }

  /** Fine land (a) and its coastlines (b) from a world-atlas topology URL. */
  async land(url: string): Promise<PreparedPair> {
    if (!this.worker) {
      const res = await fetch(url);
      const { land, coast } = landFromTopology((await res.json()) as Topology);
      return { a: land, b: coast, release: () => undefined };
    }
    return this.run({ kind: 'land', id: this.nextId++, url }, []);
  }

  dispose(): void {
    this.disposed = true;
    void this.worker?.then((w) => w.terminate());
    this.worker = null;
    this.pending.clear();
  }
}

// The page's side of the map worker (mapWorker.ts). The main thread packs the track points into
// typed arrays in small slices (so no slice blocks the page); the worker does the rest.
import type { FeatureCollection } from 'geojson';
import type { Topology } from 'topojson-specification';
import type { TrackPoint } from '../../domain/model';
import { packTrackInSlices } from '../../gps/trackColumns';
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

export type WorkerJob = TrackJob | LandJob;

/** Two GeoJSON documents as UTF-8 (track levels and zone stretches, or land and coastlines). */
export type WorkerResult =
  | { id: number; kind: 'track' | 'land'; a: ArrayBuffer; b: ArrayBuffer; /** Track only: the parts beyond the Mercator limit. */ c?: ArrayBuffer }
  | { id: number; kind: 'error'; message: string };

/** GeoJSON for a source: an object, or a URL MapLibre loads in its own worker. */
export type SourceData = FeatureCollection | string;

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

  private run(job: WorkerJob, transfer: Transferable[]): Promise<PreparedPair> {
    const worker = this.worker as Promise<Worker>;
    return worker.then((w) => new Promise<WorkerResult>((resolve) => {
      this.pending.set(job.id, resolve);
      w.postMessage(job, transfer);
    })).then((r) => {
      if (r.kind === 'error') throw new Error(r.message);
      const polar = r.c ? (JSON.parse(decoder.decode(r.c)) as PolarParts) : undefined;
      if (typeof URL.createObjectURL !== 'function') {
        return { a: JSON.parse(decoder.decode(r.a)) as FeatureCollection, b: JSON.parse(decoder.decode(r.b)) as FeatureCollection, release: () => undefined, polar };
      }
      const a = URL.createObjectURL(new Blob([r.a], { type: 'application/json' }));
      const b = URL.createObjectURL(new Blob([r.b], { type: 'application/json' }));
      return {
        a,
        b,
        polar,
        release: () => {
          URL.revokeObjectURL(a);
          URL.revokeObjectURL(b);
        },
      };
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

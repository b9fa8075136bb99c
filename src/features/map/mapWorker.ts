// Web Worker: the map's heavy conversions off the main thread. The observation points (written
// as GeoJSON from columns), the track (simplification per zoom level, marginal ice zone
// stretches) and the fine Natural Earth land (fetched and fixed
// for the antimeridian here). It answers with UTF-8 GeoJSON in transferable buffers, which the
// page hands to MapLibre as blob URLs, so MapLibre's own worker parses them and the main thread
// never copies a million coordinates.
import type { Topology } from 'topojson-specification';
import { mapObservationFeatures } from './geojson';
import { landFromTopology } from './land';
import { mizFeatures, toleranceAtZoom, trackLevels, type PolarParts } from './trackLevels';
import type { WorkerJob, WorkerResult } from './mapWorkerClient';

const encoder = new TextEncoder();

function encode(value: unknown): ArrayBuffer {
  return encoder.encode(JSON.stringify(value)).buffer as ArrayBuffer;
}

function reply(result: WorkerResult, transfer: ArrayBuffer[]): void {
  (self as unknown as Worker).postMessage(result, transfer);
}

async function run(job: WorkerJob): Promise<void> {
  if (job.kind === 'track') {
    const track = { t: job.t, lon: job.lon, lat: job.lat };
    const polar: PolarParts = { track: [], miz: [] };
    const levels = encode(trackLevels(track, polar));
    // The zone is drawn as a wide band: detail finer than a pixel at zoom 12 is never seen.
    const miz = encode(mizFeatures(track, job.obsT, job.obsMiz, job.maxGapMs, toleranceAtZoom(12), polar));
    const c = encode(polar);
    reply({ id: job.id, kind: 'track', a: levels, b: miz, c }, [levels, miz, c]);
    return;
  }
  if (job.kind === 'observations') {
    const a = encode(mapObservationFeatures(job));
    reply({ id: job.id, kind: 'observations', a }, [a]);
    return;
  }
  try {
    const res = await fetch(job.url);
    if (!res.ok) throw new Error(`HTTP ${res.status}`);
    const { land, coast } = landFromTopology((await res.json()) as Topology);
    const a = encode(land);
    const b = encode(coast);
    reply({ id: job.id, kind: 'land', a, b }, [a, b]);
  } catch (err) {
    reply({ id: job.id, kind: 'error', message: `fine land (${job.url}) could not be loaded: ${String(err)}` }, []);
  }
}

self.onmessage = (e: MessageEvent<WorkerJob>) => {
  void run(e.data);
};

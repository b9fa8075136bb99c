// The ship's track as typed columns, built a slice at a time on the page: a million track points
// parsed in one go would block the page for seconds. The columns then go to a worker (the map's,
// the review's) as transferable buffers.
import type { TrackPoint } from '../domain/model';

export interface TrackColumnArrays {
  /** ms since the epoch, ascending. */
  t: Float64Array;
  lon: Float64Array;
  lat: Float64Array;
}

/** Points packed between two yields to the page. */
export const TRACK_SLICE = 50_000;

function yieldToPage(): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, 0));
}

/** The track in time order as typed arrays, built a slice at a time. */
export async function packTrackInSlices(track: readonly TrackPoint[], signal?: AbortSignal): Promise<TrackColumnArrays> {
  const n = track.length;
  const t = new Float64Array(n);
  const lon = new Float64Array(n);
  const lat = new Float64Array(n);
  let sorted = true;
  for (let start = 0; start < n; start += TRACK_SLICE) {
    const end = Math.min(n, start + TRACK_SLICE);
    for (let i = start; i < end; i++) {
      const p = track[i] as TrackPoint;
      t[i] = Date.parse(p.time);
      lon[i] = p.lon;
      lat[i] = p.lat;
      if (i > 0 && (t[i] as number) < (t[i - 1] as number)) sorted = false;
    }
    if (end < n) {
      await yieldToPage();
      if (signal?.aborted) throw new DOMException('track preparation cancelled', 'AbortError');
    }
  }
  if (sorted) return { t, lon, lat };
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => (t[a] as number) - (t[b] as number));
  return { t: Float64Array.from(order, (i) => t[i] as number), lon: Float64Array.from(order, (i) => lon[i] as number), lat: Float64Array.from(order, (i) => lat[i] as number) };
}

// The page's side of the review worker. It sends the worker only what changed since the last
// time (observations by revision, the track at most every 30 s), in slices so that no message
// blocks the page, and keeps the last figures on screen until the new ones arrive.
import { useEffect, useRef, useState } from 'react';
import type { Cruise, Observation, TrackPoint } from '../../domain/model';
import { unpackSeries, type CruiseReview, type ReviewFinding, type TrackColumns } from '../../domain/stats';
import { packTrackInSlices } from '../../gps/trackColumns';
import { ReviewEngine } from './reviewEngine';
import type { FromReviewWorker, ToReviewWorker } from './reviewProtocol';
import ReviewWorker from './reviewWorker.ts?worker&inline';

export interface ReviewFigures {
  review: CruiseReview;
  findings: ReviewFinding[];
}

/** Observations per message: a structured clone of a few thousand takes a few ms. */
const OBSERVATION_SLICE = 2_000;
/** The track is re-sent at most this often (a live GPS adds fixes every few seconds). */
const TRACK_RESEND_MS = 30_000;

const yieldToPage = (): Promise<void> => new Promise((resolve) => setTimeout(resolve, 0));

/** What identifies a stored version of an observation (a restore flips `deleted` only). */
const stamp = (o: Observation): number => o.revision * 2 + (o.deleted ? 1 : 0);

/** The figures' inputs that make the worker start over. */
const startKey = (cruise: Cruise, observerId: string): string =>
  JSON.stringify([cruise.id, cruise.iceClass, cruise.intervalMinutes, cruise.observers, observerId]);

export interface Wanted {
  cruise: Cruise;
  observerId: string;
  observations: readonly Observation[];
  track: readonly TrackPoint[];
}

/** One worker (or, without Worker support, the same engine in place) and what it holds. */
export class ReviewChannel {
  private worker: Worker | null = null;
  private engine: ReviewEngine | null = null;
  private started = '';
  private sent = new Map<string, number>();
  private sentTrack: readonly TrackPoint[] | null = null;
  private trackSentAt = 0;
  private seq = 0;
  private busy = false;
  private wanted: Wanted | null = null;
  private disposed = false;

  private trackTimer: ReturnType<typeof setTimeout> | null = null;

  /** The inputs of the figures asked for last. */
  private syncedFor: Wanted | null = null;

  /** `inputs` are the inputs the figures are of. */
  constructor(private readonly onFigures: (f: ReviewFigures, inputs: Wanted) => void, private readonly onError: (message: string) => void) {
    if (typeof Worker !== 'undefined') {
      // Inlined and started from a blob URL, like the map's worker (CSP: worker-src blob:).
      this.worker = new ReviewWorker({ name: 'floe-review' });
      this.worker.onmessage = (e: MessageEvent<FromReviewWorker>) => this.receive(e.data);
      this.worker.onerror = (e) => this.onError(e.message || 'the review worker failed');
    } else {
      this.engine = new ReviewEngine();
    }
  }

  /** Asks for figures of this state; while a sync runs, only the latest request is kept. */
  request(w: Wanted): void {
    this.wanted = w;
    if (!this.busy) void this.drain();
  }

  dispose(): void {
    this.disposed = true;
    if (this.trackTimer) clearTimeout(this.trackTimer);
    this.worker?.terminate();
  }

  private post(m: ToReviewWorker, transfer: Transferable[] = []): void {
    if (this.worker) {
      this.worker.postMessage(m, transfer);
      return;
    }
    const out = (this.engine as ReviewEngine).handle(m);
    if (out) queueMicrotask(() => this.receive(out.reply));
  }

  private receive(m: FromReviewWorker): void {
    if (this.disposed || m.seq !== this.seq) return;
    if (m.type === 'error') {
      this.onError(m.message);
      return;
    }
    this.onFigures({ review: { ...m.tables, series: unpackSeries(m.series) }, findings: m.findings }, this.syncedFor as Wanted);
  }

  private async drain(): Promise<void> {
    this.busy = true;
    try {
      while (this.wanted && !this.disposed) {
        const w = this.wanted;
        this.wanted = null;
        await this.sync(w);
      }
    } catch (err) {
      this.onError(err instanceof Error ? err.message : String(err));
    } finally {
      this.busy = false;
    }
  }

  private async sync(w: Wanted): Promise<void> {
    const key = startKey(w.cruise, w.observerId);
    if (key !== this.started) {
      this.post({ type: 'start', cruise: w.cruise, observerId: w.observerId || null });
      this.started = key;
      this.sent = new Map();
    }
    const now = Date.now();
    if (w.track !== this.sentTrack && (this.sentTrack === null || now - this.trackSentAt >= TRACK_RESEND_MS || w.track.length < 2)) {
      const a = await packTrackInSlices(w.track);
      const track: TrackColumns | null = a.t.length >= 2 ? { timeMs: a.t, lat: a.lat, lon: a.lon } : null;
      this.post({ type: 'track', track }, track ? [track.timeMs.buffer, track.lat.buffer, track.lon.buffer] : []);
      this.sentTrack = w.track;
      this.trackSentAt = now;
    } else if (w.track !== this.sentTrack && !this.trackTimer) {
      // Too soon: ask again when the track may be re-sent.
      this.trackTimer = setTimeout(() => {
        this.trackTimer = null;
        this.request(this.wanted ?? w);
      }, TRACK_RESEND_MS - (now - this.trackSentAt));
    }
    const changed: Observation[] = [];
    const present = new Set<string>();
    for (const o of w.observations) {
      present.add(o.id);
      if (this.sent.get(o.id) !== stamp(o)) changed.push(o);
    }
    const gone = [...this.sent.keys()].filter((id) => !present.has(id));
    if (gone.length > 0) {
      this.post({ type: 'drop', ids: gone });
      for (const id of gone) this.sent.delete(id);
    }
    for (let i = 0; i < changed.length; i += OBSERVATION_SLICE) {
      const slice = changed.slice(i, i + OBSERVATION_SLICE);
      this.post({ type: 'take', observations: slice });
      for (const o of slice) this.sent.set(o.id, stamp(o));
      if (i + OBSERVATION_SLICE < changed.length) await yieldToPage();
    }
    this.syncedFor = w;
    this.post({ type: 'figures', seq: ++this.seq });
  }
}

/**
 * The review figures of these inputs, computed in the worker. Until the first figures arrive
 * `figures` is null; afterwards it keeps the previous figures while `updating` is true.
 */
export function useReviewFigures(cruise: Cruise, observations: readonly Observation[], track: readonly TrackPoint[], observerId: string): {
  figures: ReviewFigures | null;
  updating: boolean;
  error: string | null;
} {
  const [got, setGot] = useState<{ figures: ReviewFigures; inputs: Wanted } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const channel = useRef<ReviewChannel | null>(null);

  useEffect(() => {
    const c = new ReviewChannel(
      (figures, inputs) => {
        setGot({ figures, inputs });
        setError(null);
      },
      (message) => setError(message),
    );
    channel.current = c;
    return () => {
      c.dispose();
      channel.current = null;
    };
  }, []);

  useEffect(() => {
    channel.current?.request({ cruise, observerId, observations, track });
  }, [cruise, observerId, observations, track]);

  const i = got?.inputs;
  const updating = !i || i.cruise !== cruise || i.observerId !== observerId || i.observations !== observations || i.track !== track;
  return { figures: got?.figures ?? null, updating, error };
}

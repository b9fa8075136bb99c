// Messages between the Review screen and its worker (reviewWorker.ts).
import type { Cruise, Observation } from '../../domain/model';
import type { CruiseReview, PackedSeries, ReviewFinding, TrackColumns } from '../../domain/stats';

export type ToReviewWorker =
  /** Starts over: a cruise (or a new observer filter); observations follow in `take` messages. */
  | { type: 'start'; cruise: Cruise; observerId: string | null }
  /** New, edited or deleted observations (deleted ones carry `deleted: true`). */
  | { type: 'take'; observations: Observation[] }
  /** Observations no longer in the log at all. */
  | { type: 'drop'; ids: string[] }
  /** The track as columns (its buffers are transferred). */
  | { type: 'track'; track: TrackColumns | null }
  /** Send the figures for everything taken in so far, tagged with `seq`. */
  | { type: 'figures'; seq: number };

export type FromReviewWorker =
  | { type: 'figures'; seq: number; tables: Omit<CruiseReview, 'series'>; series: PackedSeries; findings: ReviewFinding[]; ms: number }
  | { type: 'error'; seq: number; message: string };

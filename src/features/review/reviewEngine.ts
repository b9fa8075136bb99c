// What the review worker does, apart from the messaging: an incremental ledger of the figures
// (src/domain/stats/ledger.ts) and the quality-control list. Runs in the worker, or in place
// where there is no Worker (jsdom tests).
import type { Cruise, Observation } from '../../domain/model';
import { collectFindings, ReviewLedger, type TrackColumns } from '../../domain/stats';
import type { FromReviewWorker, ToReviewWorker } from './reviewProtocol';

export class ReviewEngine {
  private cruise: Cruise | null = null;
  private ledger: ReviewLedger | null = null;
  private track: TrackColumns | null = null;
  private readonly observations = new Map<string, Observation>();

  /** Handles one message; returns the answer to a `figures` request, with the buffers to transfer. */
  handle(m: ToReviewWorker): { reply: FromReviewWorker; transfer: Transferable[] } | null {
    switch (m.type) {
      case 'start': {
        this.cruise = m.cruise;
        const observerId = m.observerId;
        this.ledger = new ReviewLedger({ cruise: m.cruise, include: observerId ? (o) => o.observerId === observerId : undefined });
        this.ledger.reset([], this.track);
        this.observations.clear();
        return null;
      }
      case 'take':
        for (const o of m.observations) {
          if (o.deleted) this.observations.delete(o.id);
          else this.observations.set(o.id, o);
        }
        this.ledger?.upsertMany(m.observations);
        return null;
      case 'drop':
        for (const id of m.ids) this.observations.delete(id);
        this.ledger?.remove(m.ids);
        return null;
      case 'track':
        this.track = m.track;
        this.ledger?.setTrack(m.track);
        return null;
      case 'figures': {
        if (!this.ledger || !this.cruise) return { reply: { type: 'error', seq: m.seq, message: 'the review has no cruise yet' }, transfer: [] };
        const t0 = performance.now();
        const tables = this.ledger.tables();
        const series = this.ledger.packedSeries();
        // The findings are a full pass (field and sequence rules); here, off the page's thread.
        const findings = collectFindings([...this.observations.values()], this.cruise);
        const transfer: Transferable[] = [
          series.time.buffer, series.totalConcentration.buffer, series.levelThicknessCm.buffer, series.thicknessWithRidgesCm.buffer,
          series.rio.buffer, series.airTempC.buffer, series.waterTempC.buffer, series.gapRow.buffer,
        ];
        return { reply: { type: 'figures', seq: m.seq, tables, series, findings, ms: performance.now() - t0 }, transfer };
      }
    }
  }
}

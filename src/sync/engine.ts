// The running sync of one cruise: a push loop (sends what the server lacks whenever the log
// changes) and a pull loop (a long poll on the changes feed), each retrying with backoff. It
// never stands between the observer and the store: saves go to the store as always, the loops
// carry them over when the server can be reached. The status is what the header shows.
import { cruiseChangeStamp, getSyncState, type SyncRefusal } from '../db';
import { CouchError, type CouchClient } from './couch';
import { outbox, outboxSize, pullStore, pushStore, targetDb, targetKey, type SyncTarget } from './storeSync';
import { backoffDelay } from './transfer';

export type SyncPhase = 'connecting' | 'synced' | 'sending' | 'receiving' | 'offline' | 'refused' | 'stopped';

export interface SyncStatus {
  phase: SyncPhase;
  /** Documents of this laptop the server does not hold yet (observation versions, track hours, cruise record, photos). */
  waiting: number;
  /** Since when the server could not be reached (or refused), while it lasts. */
  troubleSince: string | null;
  /** Why the laptop is offline or refused, in words for the observer. */
  reason: string | null;
  /** Pulled documents refused by the checks, newest last. */
  refusedDocs: SyncRefusal[];
  /** While catching up with the server: documents received and the server's total. */
  progress: { received: number; total: number | null } | null;
  lastSyncedAt: string | null;
  /** When the next attempt is due after a failure. */
  retryAt: string | null;
}

export interface EngineOptions extends SyncTarget {
  /** First retry delay; doubles up to maxBackoffMs. */
  backoffBaseMs?: number;
  maxBackoffMs?: number;
  /** How often the push loop looks for a change in the log. */
  pollMs?: number;
  /** Long poll length of the pull loop. */
  longPollMs?: number;
}

const nowIso = () => new Date().toISOString().replace(/\.\d{3}Z$/, 'Z');

function describe(e: unknown): { phase: 'offline' | 'refused'; reason: string } {
  if (e instanceof CouchError) {
    switch (e.kind) {
      case 'unauthorized':
        return { phase: 'refused', reason: 'the server does not accept this laptop\'s login: sign in again in Settings' };
      case 'forbidden':
        return { phase: 'refused', reason: 'this user may not use the cruise\'s database on the server (its _security lists who may)' };
      case 'offline':
        return { phase: 'offline', reason: 'the ship server cannot be reached' };
      case 'timeout':
        return { phase: 'offline', reason: 'the ship server does not answer in time' };
      case 'garbage':
        return { phase: 'offline', reason: `the server's answer is unreadable (${e.message})` };
      case 'too-large':
        return { phase: 'offline', reason: `the server's answer is too large (${e.message})` };
      default:
        return { phase: 'offline', reason: e.message };
    }
  }
  return { phase: 'refused', reason: e instanceof Error ? e.message : String(e) };
}

export class SyncEngine {
  private readonly opts: Required<Omit<EngineOptions, keyof SyncTarget>> & SyncTarget;
  private running = false;
  private listeners = new Set<(s: SyncStatus) => void>();
  private readonly sleepers = new Set<() => void>();
  private lastStamp: string | null = null;
  private readonly trackSent = new Map<string, number>();
  private pushFailing = false;
  private pullFailing = false;
  private loops: Promise<void>[] = [];
  private current: SyncStatus = { phase: 'stopped', waiting: 0, troubleSince: null, reason: null, refusedDocs: [], progress: null, lastSyncedAt: null, retryAt: null };

  constructor(opts: EngineOptions) {
    this.opts = { backoffBaseMs: 1000, maxBackoffMs: 60_000, pollMs: 1000, longPollMs: 10_000, ...opts };
  }

  get status(): SyncStatus {
    return this.current;
  }

  get client(): CouchClient {
    return this.opts.client;
  }

  subscribe(fn: (s: SyncStatus) => void): () => void {
    this.listeners.add(fn);
    return () => this.listeners.delete(fn);
  }

  private set(patch: Partial<SyncStatus>) {
    this.current = { ...this.current, ...patch };
    for (const l of this.listeners) l(this.current);
  }

  start(): void {
    if (this.running) return;
    this.running = true;
    this.set({ phase: 'connecting' });
    void getSyncState(targetKey(this.opts)).then((s) => s && this.set({ refusedDocs: s.refused, lastSyncedAt: s.lastPullAt }));
    this.loops = [this.pullLoop(), this.pushLoop()];
  }

  /** Stops both loops; a long poll in flight ends on its own, its result is dropped. */
  async stop(): Promise<void> {
    this.running = false;
    this.wakeAll();
    this.set({ phase: 'stopped' });
    await Promise.allSettled(this.loops);
  }

  /** Something was saved: look for documents to send now instead of at the next poll. */
  nudge(): void {
    this.wakeAll();
  }

  private wakeAll() {
    for (const w of [...this.sleepers]) w();
  }

  private sleep(ms: number): Promise<void> {
    return new Promise((ok) => {
      const done = () => {
        clearTimeout(timer);
        this.sleepers.delete(done);
        ok();
      };
      const timer = setTimeout(done, ms);
      this.sleepers.add(done);
    });
  }

  private trouble(e: unknown, attempt: number): number {
    const d = describe(e);
    const delay = backoffDelay(attempt, this.opts.backoffBaseMs, this.opts.maxBackoffMs);
    this.set({ phase: d.phase, reason: d.reason, troubleSince: this.current.troubleSince ?? nowIso(), retryAt: new Date(Date.now() + delay).toISOString(), progress: null });
    return delay;
  }

  private settle() {
    if (this.pushFailing || this.pullFailing) return;
    const busy = this.current.phase === 'sending' || this.current.phase === 'receiving';
    this.set({ phase: busy ? this.current.phase : this.current.waiting > 0 ? 'sending' : 'synced', reason: null, troubleSince: null, retryAt: null, lastSyncedAt: nowIso() });
  }

  private async pushLoop(): Promise<void> {
    let attempt = 0;
    while (this.running) {
      try {
        const stamp = await cruiseChangeStamp(this.opts.cruiseId);
        if (stamp !== this.lastStamp || this.current.waiting > 0) {
          const box = await outbox(this.opts, this.trackSent);
          this.set({ waiting: outboxSize(box) });
          if (outboxSize(box) > 0) {
            this.set({ phase: this.pullFailing ? this.current.phase : 'sending' });
            await pushStore(this.opts, box, (done, total) => this.set({ waiting: Math.max(0, total - done) }));
          }
          this.lastStamp = stamp;
          this.set({ waiting: 0 });
        }
        this.pushFailing = false;
        attempt = 0;
        if (this.current.phase === 'sending') this.set({ phase: 'synced' });
        this.settle();
        await this.sleep(this.opts.pollMs);
      } catch (e) {
        this.pushFailing = true;
        await this.sleep(this.trouble(e, attempt++));
      }
    }
  }

  private async pullLoop(): Promise<void> {
    let attempt = 0;
    let catchingUp = true;
    while (this.running) {
      try {
        let total: number | null = null;
        if (catchingUp) {
          const info = (await this.opts.client.request('GET', encodeURIComponent(targetDb(this.opts))).catch(() => null)) as { doc_count?: unknown } | null;
          total = typeof info?.doc_count === 'number' ? info.doc_count : null;
          this.set({ phase: 'receiving', progress: { received: 0, total } });
        }
        const r = await pullStore(this.opts, {
          ...(catchingUp ? {} : { waitMs: this.opts.longPollMs }),
          onProgress: (received) => {
            if (catchingUp) this.set({ phase: 'receiving', progress: { received, total } });
          },
        });
        if (!this.running) break;
        if (r.refused.length) {
          const s = await getSyncState(targetKey(this.opts));
          this.set({ refusedDocs: s?.refused ?? this.current.refusedDocs });
        }
        if (r.caughtUp) catchingUp = false;
        this.pullFailing = false;
        attempt = 0;
        if (this.current.phase === 'receiving' && !catchingUp) this.set({ phase: 'synced', progress: null });
        this.settle();
      } catch (e) {
        this.pullFailing = true;
        catchingUp = true;
        await this.sleep(this.trouble(e, attempt++));
      }
    }
  }
}

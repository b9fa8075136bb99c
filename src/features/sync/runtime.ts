// The tab's one running sync: started and stopped by SyncRunner from the settings, read by
// the header badge and the observation list. Not persisted: the engine reads its checkpoint
// and marks from the store when it starts.
import { useSyncExternalStore } from 'react';
import { CouchClient } from '../../sync/couch';
import { SyncEngine, type SyncStatus } from '../../sync/engine';
import { targetKey } from '../../sync/storeSync';

interface Running {
  id: string;
  engine: SyncEngine;
  /** The server database's address: the key of its marks in the store. */
  key: string;
}

let running: Running | null = null;
let status: SyncStatus | null = null;
const listeners = new Set<() => void>();
const emit = () => listeners.forEach((l) => l());

export interface SyncConfig {
  url: string;
  cruiseId: string;
  deviceId: string;
}

/** Runs the sync for this configuration (null stops it). The same configuration again changes nothing. */
export function runSync(cfg: SyncConfig | null): void {
  const id = cfg ? JSON.stringify([cfg.url, cfg.cruiseId, cfg.deviceId]) : '';
  if ((running?.id ?? '') === id) return;
  if (running) void running.engine.stop();
  running = null;
  status = null;
  if (cfg) {
    const client = new CouchClient({ url: cfg.url });
    const target = { client, cruiseId: cfg.cruiseId, deviceId: cfg.deviceId };
    // SyncRunner nudges the engine on every change of the log; the poll is only a safety net.
    const engine = new SyncEngine({ ...target, pollMs: 10_000 });
    running = { id, engine, key: targetKey(target) };
    engine.subscribe((s) => {
      status = s;
      emit();
    });
    engine.start();
  }
  emit();
}

function subscribe(l: () => void) {
  listeners.add(l);
  return () => listeners.delete(l);
}

export function useSyncStatus(): SyncStatus | null {
  return useSyncExternalStore(subscribe, () => status);
}

/** The running server database's address, for its marks; null when sync is off. */
export function useSyncKey(): string | null {
  return useSyncExternalStore(subscribe, () => running?.key ?? null);
}

/** A save happened: send now rather than at the next poll. */
export function nudgeSync(): void {
  running?.engine.nudge();
}

/** Logs in with a CouchDB session (the browser keeps the cookie); the password is not kept. */
export async function logIn(url: string, user: string, password: string): Promise<string> {
  const client = new CouchClient({ url });
  const r = await client.logIn(user, password);
  return r.name;
}

export async function logOut(url: string): Promise<void> {
  await new CouchClient({ url }).logOut();
}

/**
 * The origins the page's security policy lets it connect to besides itself, read from the policy
 * the page was served with (src/app/csp.config.ts adds them); null when the page has no policy
 * (the dev server removes it).
 */
export function policyOrigins(): string[] | null {
  const meta = document.querySelector('meta[http-equiv="Content-Security-Policy"]');
  const policy = meta?.getAttribute('content');
  if (!policy) return null;
  const connect = policy.split(';').map((d) => d.trim().split(/\s+/)).find((d) => d[0] === 'connect-src') ?? [];
  return connect.slice(1).filter((s) => /^https?:\/\//.test(s));
}

/** Whether the page's security policy lets the app reach the address. */
export function allowedByPolicy(url: string): boolean {
  try {
    const origin = new URL(url).origin;
    const allowed = policyOrigins();
    return allowed === null || allowed.includes(origin);
  } catch {
    return false;
  }
}

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

/** Whether this build's security policy lets the app reach the address. */
export function allowedByPolicy(url: string): boolean {
  try {
    return __FLOE_SHIP_SERVERS__.includes(new URL(url).origin);
  } catch {
    return false;
  }
}

// Service worker registration and the update lifecycle, as a small observable store the update
// banner reads. A new version is installed in the background but applied only when the
// observer agrees (the worker is built with skipWaiting off, see pwa.config.ts).
import { Workbox } from 'workbox-window';
import { runBeforeAppUpdate } from '../state/app-update';

export type UpdatePhase =
  /** Nothing to say. */
  | 'idle'
  /** First install finished: the app now works with no network. */
  | 'offline-ready'
  /** A new version is installed and waits for the observer's agreement. */
  | 'waiting'
  /** The observer chose "later"; a small reminder stays. */
  | 'postponed'
  /** Agreed: drafts are being flushed, then the new version takes over and the page reloads. */
  | 'applying'
  /** Another window applied a new version; this one still runs the old code. */
  | 'updated-elsewhere'
  /** This page was reloaded into a new version after the observer agreed. */
  | 'updated';

export interface PwaState {
  phase: UpdatePhase;
  /** The build marker of the code running in this page. */
  build: string;
  /** Why the last attempt to apply an update failed, if it did. */
  error: string | null;
}

export const APP_BUILD: string = __FLOE_BUILD__;
const UPDATED_FROM_KEY = 'floe-ledger:updated-from';
const UPDATE_CHECK_MS = 60 * 60 * 1000;

let state: PwaState = { phase: 'idle', build: APP_BUILD, error: null };
const listeners = new Set<() => void>();
let workbox: Workbox | null = null;
let applyRequested = false;

function set(patch: Partial<PwaState>): void {
  state = { ...state, ...patch };
  for (const l of listeners) l();
}

export function subscribePwa(listener: () => void): () => void {
  listeners.add(listener);
  return () => {
    listeners.delete(listener);
  };
}

export function getPwaState(): PwaState {
  return state;
}

/** Registers the service worker (production builds in a browser that has them). */
export async function registerServiceWorker(): Promise<void> {
  document.documentElement.dataset.build = APP_BUILD;
  noticeFinishedUpdate();
  if (!import.meta.env.PROD || !('serviceWorker' in navigator)) return;

  const container = navigator.serviceWorker;
  let hadController = container.controller !== null;
  container.addEventListener('controllerchange', () => {
    if (applyRequested) {
      window.location.reload();
      return;
    }
    // The first claim (clientsClaim on first install) is not an update.
    if (!hadController) {
      hadController = true;
      return;
    }
    set({ phase: 'updated-elsewhere' });
  });

  const wb = new Workbox(`${import.meta.env.BASE_URL}sw.js`, { scope: import.meta.env.BASE_URL });
  workbox = wb;
  wb.addEventListener('waiting', () => {
    if (state.phase !== 'applying') set({ phase: 'waiting', error: null });
  });
  wb.addEventListener('activated', (e) => {
    if (!e.isUpdate && state.phase === 'idle') set({ phase: 'offline-ready' });
  });
  try {
    await wb.register();
  } catch (err) {
    // The app still works online; say why offline use is not available.
    console.warn('Floe Ledger: the service worker could not be registered, so the app will not work offline:', err);
    return;
  }
  // Weeks at sea: look for a new version now and then, only when there is a network to ask.
  window.setInterval(() => {
    if (navigator.onLine) wb.update().catch(() => undefined);
  }, UPDATE_CHECK_MS);
}

/** The observer agreed: flush open work, then let the waiting version take over. */
export async function applyUpdate(): Promise<void> {
  if (state.phase === 'applying') return;
  set({ phase: 'applying', error: null });
  try {
    await runBeforeAppUpdate();
  } catch (err) {
    set({ phase: 'waiting', error: `open work could not be saved first (${String(err)}); the update was not applied` });
    return;
  }
  sessionStorage.setItem(UPDATED_FROM_KEY, APP_BUILD);
  if (workbox && (await hasWaitingWorker())) {
    applyRequested = true;
    workbox.messageSkipWaiting();
    // The controllerchange listener reloads the page; if the new worker never takes over, say so
    // instead of leaving the banner spinning.
    window.setTimeout(() => {
      if (state.phase !== 'applying') return;
      applyRequested = false;
      sessionStorage.removeItem(UPDATED_FROM_KEY);
      set({ phase: 'waiting', error: 'the new version did not take over within 45 s; this version keeps running' });
    }, 45_000);
  } else {
    // Another window already applied it (or the worker is gone): loading again is enough.
    window.location.reload();
  }
}

/** "Later": keep running this version; a small reminder stays on screen. */
export function postponeUpdate(): void {
  if (state.phase === 'waiting') set({ phase: 'postponed', error: null });
}

export function dismissNotice(): void {
  if (state.phase === 'offline-ready' || state.phase === 'updated') set({ phase: 'idle' });
}

/** Reloads into the version another window applied, after flushing open work. */
export async function reloadIntoNewVersion(): Promise<void> {
  return applyUpdate();
}

async function hasWaitingWorker(): Promise<boolean> {
  const reg = await navigator.serviceWorker.getRegistration(import.meta.env.BASE_URL);
  return Boolean(reg?.waiting);
}

function noticeFinishedUpdate(): void {
  const from = sessionStorage.getItem(UPDATED_FROM_KEY);
  if (from === null) return;
  sessionStorage.removeItem(UPDATED_FROM_KEY);
  if (from !== APP_BUILD) set({ phase: 'updated' });
}

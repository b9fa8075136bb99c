import { useSyncExternalStore } from 'react';
import { applyUpdate, dismissNotice, getPwaState, postponeUpdate, subscribePwa, type PwaState } from './pwa';

export interface UpdateBannerActions {
  apply: () => void;
  postpone: () => void;
  dismiss: () => void;
}

const DRAFT_KEPT =
  'Your draft observation is kept in this browser’s database, so it is still there after the update.';

/** What the banner says in each phase; rendered without the service worker for component tests. */
export function UpdateBannerView({ state, actions }: { state: PwaState; actions: UpdateBannerActions }) {
  const { phase, error } = state;
  if (phase === 'idle') return null;
  let body;
  switch (phase) {
    case 'offline-ready':
      body = (
        <>
          <span>Floe Ledger is stored in this browser and now works with no network.</span>
          <button type="button" className="button" onClick={actions.dismiss}>OK</button>
        </>
      );
      break;
    case 'waiting':
      body = (
        <>
          <span>
            <strong>A new version of Floe Ledger is ready.</strong> It is applied only when you
            choose. {DRAFT_KEPT}
          </span>
          <span className="update-banner-actions">
            <button type="button" className="button primary" onClick={actions.apply}>Update now</button>
            <button type="button" className="button" onClick={actions.postpone}>Later</button>
          </span>
        </>
      );
      break;
    case 'postponed':
      body = (
        <>
          <span>A new version is waiting; this one keeps running until you update.</span>
          <button type="button" className="button" onClick={actions.apply}>Update now</button>
        </>
      );
      break;
    case 'applying':
      body = <span>Saving open work, then starting the new version…</span>;
      break;
    case 'updated-elsewhere':
      body = (
        <>
          <span>
            Floe Ledger was updated in another window. Reload this window to use the new version.{' '}
            {DRAFT_KEPT}
          </span>
          <button type="button" className="button primary" onClick={actions.apply}>Reload now</button>
        </>
      );
      break;
    case 'updated':
      body = (
        <>
          <span>Floe Ledger was updated (build {state.build}). Your stored observations and draft were kept.</span>
          <button type="button" className="button" onClick={actions.dismiss}>OK</button>
        </>
      );
      break;
  }
  return (
    // A labelled region with a polite live announcement rather than role="status", so screens
    // that have their own status line keep the only one.
    <section className="update-banner" aria-label="App version" aria-live="polite" data-testid="update-banner" data-phase={phase}>
      {body}
      {error ? <span className="update-banner-error">Not updated: {error}.</span> : null}
    </section>
  );
}

const ACTIONS: UpdateBannerActions = {
  apply: () => void applyUpdate(),
  postpone: postponeUpdate,
  dismiss: dismissNotice,
};

/** The shell's banner for offline readiness and new versions. */
export function UpdateBanner() {
  const state = useSyncExternalStore(subscribePwa, getPwaState);
  return <UpdateBannerView state={state} actions={ACTIONS} />;
}

/**
 * Work that must be flushed before a new app version reloads the page (a draft being typed,
 * an edit in progress). Features register a flush here; the shell (src/app/pwa.ts) runs every
 * flush and reloads only when all of them succeeded, so an update never costs a keystroke.
 * It lives in src/state because features may import it (they may not import src/app).
 */
type Flush = () => Promise<void> | void;

const flushes = new Set<Flush>();

/** Registers a flush to run before an update reloads the page; returns the unregistration. */
export function onBeforeAppUpdate(flush: Flush): () => void {
  flushes.add(flush);
  return () => {
    flushes.delete(flush);
  };
}

/** Runs every registered flush; rejects with the first failure (the update is then held back). */
export async function runBeforeAppUpdate(): Promise<void> {
  await Promise.all([...flushes].map(async (f) => f()));
}

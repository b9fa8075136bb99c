// An init script for the app's pages (added before the first navigation) that watches every
// IndexedDB transaction the page opens: the durability it asked for, its mode and stores, kept in
// `window.__floeTx`; and, for the import's write (a read-write transaction over both the
// observations and the track), console lines "floe-tx:start" and "floe-tx:complete" / "abort",
// so a crash test can tell whether a kill landed inside that transaction. It only observes: the
// transaction is the one the app asked for, returned unchanged.
export interface TxRecord {
  mode: string;
  durability: string;
  stores: string[];
}

export const TX_PROBE = `(() => {
  const original = IDBDatabase.prototype.transaction;
  const seen = [];
  Object.defineProperty(window, '__floeTx', { value: seen });
  IDBDatabase.prototype.transaction = function (stores, mode, options) {
    const tx = original.call(this, stores, mode, options);
    const names = Array.from(typeof stores === 'string' ? [stores] : stores);
    seen.push({ mode: tx.mode, durability: tx.durability === undefined ? 'unknown' : tx.durability, stores: names });
    if (tx.mode === 'readwrite' && names.includes('observations') && (names.includes('trackChunks') || names.includes('trackPoints'))) {
      console.log('floe-tx:start');
      tx.addEventListener('complete', () => console.log('floe-tx:complete'));
      tx.addEventListener('abort', () => console.log('floe-tx:abort'));
    }
    return tx;
  };
})();`;

// An init script for the app's pages (added before the first navigation) that watches every
// IndexedDB transaction the page and its workers open: the durability it asked for, its mode and stores, kept in
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
  // Installed in the page and, through the Worker wrapper below, in every worker the page
  // starts: the import reads, plans and writes in its worker (docs/dev/exchange.md).
  function install(scope, record) {
    const original = scope.IDBDatabase.prototype.transaction;
    scope.IDBDatabase.prototype.transaction = function (stores, mode, options) {
      const tx = original.call(this, stores, mode, options);
      const names = Array.from(typeof stores === 'string' ? [stores] : stores);
      record({ mode: tx.mode, durability: tx.durability === undefined ? 'unknown' : tx.durability, stores: names });
      if (tx.mode === 'readwrite' && names.includes('observations') && (names.includes('trackChunks') || names.includes('trackPoints'))) {
        console.log('floe-tx:start');
        tx.addEventListener('complete', () => console.log('floe-tx:complete'));
        tx.addEventListener('abort', () => console.log('floe-tx:abort'));
      }
      return tx;
    };
  }
  const seen = [];
  Object.defineProperty(window, '__floeTx', { value: seen });
  install(window, (r) => seen.push(r));
  // A worker runs a small module (same origin, a blob URL) that installs the probe and imports
  // the real script; its records come back as messages the app's own handlers never see.
  const OriginalWorker = window.Worker;
  function ProbedWorker(url, options) {
    const target = new URL(String(url), location.href).href;
    const probe = '(' + install.toString() + ')(self, (r) => self.postMessage({ __floeTx: r }));';
    const module = options && options.type === 'module';
    const src = module ? 'import ' + JSON.stringify(target) + ';\\n' + probe : probe + '\\nimportScripts(' + JSON.stringify(target) + ');';
    const w = new OriginalWorker(URL.createObjectURL(new Blob([src], { type: 'text/javascript' })), options);
    w.addEventListener('message', (ev) => {
      if (ev.data && typeof ev.data === 'object' && ev.data.__floeTx) {
        seen.push(ev.data.__floeTx);
        ev.stopImmediatePropagation();
      }
    });
    return w;
  }
  ProbedWorker.prototype = OriginalWorker.prototype;
  window.Worker = ProbedWorker;
})();`;

// Runs inside MapLibre's own workers (loaded there by `importScriptInWorkers`, see
// mapController.ts), never on the page. Two things keep the big GeoJSON documents off the main
// thread:
//
// 1. MapLibre's worker sends every URL that is neither http(s) nor file, blob: URLs included,
//    to the page to be fetched and parsed there (its "getResource" round trip), so each blob
//    URL the map worker wrote was parsed on the page and cloned back: 150-330 ms tasks at full
//    size (measured with Long Animation Frames, docs/dev/benchmarks.md). A protocol handler for
//    the blob scheme makes the worker read the blob itself.
// 2. After indexing GeoJSON loaded from a URL, MapLibre's worker posts the whole document back
//    to the page so that `GeoJSONSource.getData()` can return it: another 200 ms of structured
//    clone on the page for 50,000 observations. The app never asks a source for its data, so
//    for blob URLs that copy is dropped.
//
// The file has no imports: it is a plain script for `importScripts`. It leans on two details
// of MapLibre's worker (`self.worker.actor.messageHandlers` and the 'LD' message name) of the
// exact version pinned in package.json; a test in test/e2e/map.e2e.ts fails if they change.

interface RequestLike {
  url: string;
  type?: string;
}

type Handler = (mapId: string, params: unknown, abort?: AbortController) => Promise<unknown>;

interface MapLibreWorkerScope {
  addProtocol?: (scheme: string, load: (params: RequestLike, abort: AbortController) => Promise<{ data: unknown }>) => void;
  worker?: { actor?: { messageHandlers?: Record<string, Handler | undefined> } };
  floeBlobReads?: number;
}

(() => {
  const scope = self as unknown as MapLibreWorkerScope;

  async function readBlob(params: RequestLike, abort: AbortController): Promise<{ data: unknown }> {
    const res = await fetch(params.url, { signal: abort.signal });
    if (!res.ok) throw new Error(`map data ${params.url}: ${res.status} ${res.statusText}`);
    scope.floeBlobReads = (scope.floeBlobReads ?? 0) + 1;
    if (params.type === 'json') return { data: await res.json() };
    if (params.type === 'string') return { data: await res.text() };
    return { data: await res.arrayBuffer() };
  }

  // MapLibre names a protocol by what precedes "://", so "blob:http://host/uuid" is "blob:http".
  for (const scheme of ['blob:http', 'blob:https', 'blob:file']) scope.addProtocol?.(scheme, readBlob);

  const handlers = scope.worker?.actor?.messageHandlers;
  const loadData = handlers?.LD;
  if (handlers && loadData && !(loadData as { floeWrapped?: boolean }).floeWrapped) {
    const wrapped: Handler = async (mapId, params, abort) => {
      const result = await loadData(mapId, params, abort);
      const url = (params as { request?: RequestLike } | null)?.request?.url;
      if (result && typeof result === 'object' && typeof url === 'string' && url.startsWith('blob:')) delete (result as { data?: unknown }).data;
      return result;
    };
    (wrapped as { floeWrapped?: boolean }).floeWrapped = true;
    handlers.LD = wrapped;
  }
})();

// A module for TypeScript (no globals leak between files); the built script has no export.
export {};

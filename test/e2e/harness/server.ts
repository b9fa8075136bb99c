// A small static server for the built app, so browser tests need no other process.
// Each test file gets its own server on a free loopback port, so parallel checkouts never clash.
import { createServer, type Server } from 'node:http';
import { readFile, stat } from 'node:fs/promises';
import { extname, join, normalize, resolve } from 'node:path';

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.webmanifest': 'application/manifest+json',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.wasm': 'application/wasm',
  '.map': 'application/json',
  '.txt': 'text/plain; charset=utf-8',
};

export interface StaticServer {
  url: string;
  close: () => Promise<void>;
  /** Serve another folder from now on (a second build, to test app updates). */
  setRoot: (root: string) => Promise<void>;
  /** How many requests reached the server so far (to prove a load came from the service worker). */
  requestCount: () => number;
}

async function checkBuilt(base: string): Promise<void> {
  try {
    await stat(join(base, 'index.html'));
  } catch {
    throw new Error(`No built app in ${base}: run "npm run build" before the browser tests (npm test does this).`);
  }
}

export async function serveDirectory(root: string): Promise<StaticServer> {
  let base = resolve(root);
  await checkBuilt(base);
  let requests = 0;
  const server: Server = createServer((req, res) => {
    requests++;
    void (async () => {
      const path = decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname);
      let file = normalize(join(base, path));
      if (!file.startsWith(base)) {
        res.writeHead(403).end();
        return;
      }
      try {
        const s = await stat(file);
        if (s.isDirectory()) file = join(file, 'index.html');
      } catch {
        // Unknown paths fall back to the app, as a single-page app expects.
        file = join(base, 'index.html');
      }
      try {
        const body = await readFile(file);
        res.writeHead(200, {
          'content-type': TYPES[extname(file)] ?? 'application/octet-stream',
          'cache-control': 'no-cache',
        });
        res.end(body);
      } catch {
        res.writeHead(404).end();
      }
    })();
  });
  await new Promise<void>((ok) => server.listen(0, '127.0.0.1', ok));
  const addr = server.address();
  if (addr === null || typeof addr === 'string') throw new Error('static server has no port');
  return {
    url: `http://127.0.0.1:${addr.port}/`,
    close: () =>
      new Promise<void>((ok) => {
        server.close(() => ok());
        // Keep-alive connections would otherwise hold the port open (and keep serving).
        server.closeAllConnections();
      }),
    setRoot: async (next) => {
      const resolved = resolve(next);
      await checkBuilt(resolved);
      base = resolved;
    },
    requestCount: () => requests,
  };
}

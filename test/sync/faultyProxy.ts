// A misbehaving server in front of the real one, on a free loopback port: it forwards requests
// to the embedded ship server unless told to answer 401, 403, 409, 500, garbage, a truncated
// body, 50 MB, or nothing at all (hang). Test-only. Faults carry the CORS headers a browser
// needs to read them (a page on another origin would otherwise see only "network error"), and a
// browser's preflight (OPTIONS) always goes through, as a captive portal or a failing CouchDB
// behind a working front would answer.
import { createServer, request as httpRequest, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';

export type Fault = 'none' | '401' | '403' | '409' | '500' | 'garbage' | 'truncated' | 'huge' | 'hang';

export interface FaultyProxy {
  url: string;
  fault: Fault;
  /** Only requests whose path matches are faulted (default: all). */
  only: RegExp | null;
  /** Requests seen while a fault was on. */
  faulted: number;
  /** Every request forwarded or faulted, as `METHOD /path?query`, oldest first. */
  seen: string[];
  /** Cuts the connections held by `hang` (a link that comes back resets them). */
  releaseHanging(): void;
  close(): Promise<void>;
}

export async function startFaultyProxy(target: string): Promise<FaultyProxy> {
  const t = new URL(target);
  const hanging = new Set<ServerResponse>();
  const proxy: FaultyProxy = { url: '', fault: 'none', only: null, faulted: 0, seen: [], releaseHanging: () => undefined, close: async () => undefined };
  const forward = (req: IncomingMessage, res: ServerResponse) => {
    const up = httpRequest({ host: t.hostname, port: t.port, method: req.method, path: req.url, headers: { ...req.headers, host: t.host } }, (r) => {
      res.writeHead(r.statusCode ?? 502, r.headers);
      r.pipe(res);
    });
    up.on('error', () => res.destroy());
    req.pipe(up);
  };
  const server: Server = createServer((req, res) => {
    const f = proxy.fault;
    if (req.method !== 'OPTIONS') proxy.seen.push(`${req.method} ${req.url}`);
    if (f === 'none' || req.method === 'OPTIONS' || (proxy.only && !proxy.only.test(req.url ?? ''))) return forward(req, res);
    proxy.faulted++;
    req.resume();
    const origin = req.headers.origin;
    if (origin) {
      res.setHeader('access-control-allow-origin', origin);
      res.setHeader('access-control-allow-credentials', 'true');
    }
    const json = (status: number, body: unknown) => res.writeHead(status, { 'content-type': 'application/json' }).end(JSON.stringify(body));
    switch (f) {
      case '401':
        return json(401, { error: 'unauthorized', reason: 'Name or password is incorrect.' });
      case '403':
        return json(403, { error: 'forbidden', reason: 'You are not allowed to access this db.' });
      case '409':
        return json(409, { error: 'conflict', reason: 'Document update conflict.' });
      case '500':
        return json(500, { error: 'internal_server_error', reason: 'disk on fire' });
      case 'garbage':
        return res.writeHead(200, { 'content-type': 'text/html' }).end('<html><body>Captive portal: accept the terms</body></html>');
      case 'truncated':
        res.writeHead(200, { 'content-type': 'application/json', 'content-length': '5000' });
        res.write('{"results":[{"seq":1,"id":"obs:');
        setTimeout(() => res.destroy(), 20);
        return;
      case 'huge': {
        // 50 MB of one JSON string, streamed without a length: the client must stop at its limit.
        res.writeHead(200, { 'content-type': 'application/json' });
        res.write('{"results":[{"seq":1,"id":"x","doc":{"_id":"x","pad":"');
        const block = 'x'.repeat(1024 * 1024);
        let sent = 0;
        const more = () => {
          while (sent < 50) {
            sent++;
            if (!res.write(block)) return void res.once('drain', more);
          }
          res.end('"}}],"last_seq":1}');
        };
        res.on('error', () => undefined);
        more();
        return;
      }
      case 'hang':
        hanging.add(res);
        res.on('close', () => hanging.delete(res));
        return;
    }
  });
  await new Promise<void>((ok) => server.listen(0, '127.0.0.1', ok));
  proxy.url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/`;
  proxy.releaseHanging = () => {
    for (const r of hanging) r.destroy();
    hanging.clear();
  };
  proxy.close = () =>
    new Promise<void>((ok) => {
      for (const r of hanging) r.destroy();
      server.closeAllConnections();
      server.close(() => ok());
    });
  return proxy;
}

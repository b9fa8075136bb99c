// The embedded ship server: PouchDB Server (npm `pouchdb-server`, CouchDB's HTTP and replication
// interfaces over LevelDB) in a child process, bound to loopback by default, with its databases,
// its config and its log in one folder. `npm run ship-server` uses it, and so do the tests, which
// need a real process they can SIGKILL and start again on the same folder and port.
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { createServer } from 'node:net';
import { dirname, join, resolve } from 'node:path';

export interface ShipServerOptions {
  /** Folder for the databases, config.json and log.txt; created when missing. */
  dir: string;
  /** Default loopback. Another address exposes the server to the ship's network: say so. */
  host?: string;
  /** Default: a free port. A restart on the same folder passes the port it had. */
  port?: number;
  /** Keep the databases in memory only (lost at exit). */
  inMemory?: boolean;
  /** Lines the server prints, for a caller that wants to show them. */
  onLog?: (line: string) => void;
}

export interface ShipServer {
  /** Base address with a trailing slash, e.g. http://127.0.0.1:41234/ */
  url: string;
  port: number;
  host: string;
  dir: string;
  process: ChildProcess;
  /** Stops the server (SIGTERM, then SIGKILL after a grace period) and waits for its exit. */
  stop(): Promise<void>;
  /** SIGKILL, as a crash or a power cut: nothing is flushed. */
  kill(): Promise<void>;
}

/** A port free on the host right now (the OS picks it); the server binds it right after. */
export function freePort(host = '127.0.0.1'): Promise<number> {
  return new Promise((ok, fail) => {
    const s = createServer();
    s.once('error', fail);
    s.listen(0, host, () => {
      const a = s.address();
      const port = typeof a === 'object' && a ? a.port : 0;
      s.close(() => ok(port));
    });
  });
}

function pouchdbServerBin(): string {
  const require = createRequire(import.meta.url);
  const pkg = require.resolve('pouchdb-server/package.json');
  return join(dirname(pkg), 'bin', 'pouchdb-server');
}

function waitForExit(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
  return new Promise((ok) => child.once('exit', () => ok()));
}

/**
 * Puts a session secret in the folder's config.json when it has none. PouchDB Server otherwise
 * makes a new one at every start, which signs every laptop out after a restart (CouchDB keeps
 * its secret in its ini file, `[chttpd_auth] secret`). A config the server cannot have written
 * (not JSON) is left alone.
 */
function keepSessionSecret(configFile: string): void {
  let config: Record<string, unknown> = {};
  if (existsSync(configFile)) {
    try {
      const parsed: unknown = JSON.parse(readFileSync(configFile, 'utf8'));
      if (parsed === null || typeof parsed !== 'object' || Array.isArray(parsed)) return;
      config = parsed as Record<string, unknown>;
    } catch {
      return;
    }
  }
  const auth = config.couch_httpd_auth;
  const section = auth !== null && typeof auth === 'object' && !Array.isArray(auth) ? (auth as Record<string, unknown>) : {};
  if (typeof section.secret === 'string' && section.secret !== '') return;
  config.couch_httpd_auth = { ...section, secret: randomBytes(16).toString('hex') };
  writeFileSync(configFile, `${JSON.stringify(config, null, 2)}\n`);
}

async function startOnce(opts: ShipServerOptions, port: number): Promise<ShipServer> {
  const host = opts.host ?? '127.0.0.1';
  const dir = resolve(opts.dir);
  mkdirSync(dir, { recursive: true });
  keepSessionSecret(join(dir, 'config.json'));
  // PouchDB Server leaves a promise unhandled when a _replicate target dies mid-run (the shore
  // link cut): Node's default would end the whole ship server for it, so such a rejection is
  // logged instead; the replication itself reports its failure to whoever asked for it.
  const args = ['--unhandled-rejections=warn', pouchdbServerBin(), '--host', host, '--port', String(port), '--dir', dir, '--config', join(dir, 'config.json'), '--no-color'];
  if (opts.inMemory) args.push('--in-memory');
  // cwd is the folder: the server writes its log file (log.txt) relative to it.
  const child = spawn(process.execPath, args, { cwd: dir, stdio: ['ignore', 'pipe', 'pipe'] });
  const url = `http://${host.includes(':') ? `[${host}]` : host}:${port}/`;
  let output = '';
  const started = new Promise<void>((ok, fail) => {
    const onData = (chunk: Buffer) => {
      const text = chunk.toString('utf8');
      output += text;
      for (const line of text.split('\n')) if (line.trim()) opts.onLog?.(line);
      if (output.includes('has started on')) ok();
      if (output.includes('already in use')) fail(new Error(`port ${port} is already in use`));
    };
    child.stdout?.on('data', onData);
    child.stderr?.on('data', onData);
    child.once('exit', (code, signal) => fail(new Error(`the ship server stopped while starting (exit ${code ?? signal}): ${output.trim().slice(-500)}`)));
    child.once('error', fail);
  });
  const timer = setTimeout(() => child.kill('SIGKILL'), 30_000);
  try {
    await started;
  } catch (e) {
    child.kill('SIGKILL');
    await waitForExit(child);
    throw e;
  } finally {
    clearTimeout(timer);
  }
  await waitUntilAnswering(url);
  const kill = async () => {
    child.kill('SIGKILL');
    await waitForExit(child);
  };
  return {
    url,
    port,
    host,
    dir,
    process: child,
    kill,
    async stop() {
      if (child.exitCode !== null || child.signalCode !== null) return;
      child.kill('SIGTERM');
      const grace = setTimeout(() => child.kill('SIGKILL'), 5000);
      await waitForExit(child);
      clearTimeout(grace);
    },
  };
}

/** The log line comes before the databases are ready; the root answers once they are. */
async function waitUntilAnswering(url: string): Promise<void> {
  const until = Date.now() + 15_000;
  for (;;) {
    try {
      const r = await fetch(url);
      if (r.ok) return;
    } catch {
      // not listening yet
    }
    if (Date.now() > until) throw new Error(`the ship server at ${url} does not answer`);
    await new Promise((ok) => setTimeout(ok, 100));
  }
}

/** Starts the server; without a port it takes a free one, retrying if another process took it first. */
export async function startShipServer(opts: ShipServerOptions): Promise<ShipServer> {
  if (opts.port !== undefined) return startOnce(opts, opts.port);
  let last: unknown;
  for (let i = 0; i < 5; i++) {
    try {
      return await startOnce(opts, await freePort(opts.host));
    } catch (e) {
      last = e;
      if (!(e instanceof Error && e.message.includes('already in use'))) throw e;
    }
  }
  throw last;
}

/**
 * Makes `name` a server admin (ends the "everyone is admin" state of a fresh server) through
 * CouchDB's documented config interface, then `users` ordinary users in `_users`.
 */
export async function addAccounts(url: string, admin: { name: string; password: string }, users: { name: string; password: string }[] = []): Promise<void> {
  const r = await fetch(new URL(`_config/admins/${encodeURIComponent(admin.name)}`, url), { method: 'PUT', body: JSON.stringify(admin.password) });
  if (!r.ok) throw new Error(`could not add the admin ${admin.name}: HTTP ${r.status} ${await r.text()}`);
  const auth = `Basic ${Buffer.from(`${admin.name}:${admin.password}`).toString('base64')}`;
  for (const u of users) {
    const id = `org.couchdb.user:${u.name}`;
    const res = await fetch(new URL(`_users/${encodeURIComponent(id)}`, url), {
      method: 'PUT',
      headers: { authorization: auth, 'content-type': 'application/json' },
      body: JSON.stringify({ _id: id, name: u.name, password: u.password, roles: [], type: 'user' }),
    });
    if (!res.ok && res.status !== 409) throw new Error(`could not add the user ${u.name}: HTTP ${res.status} ${await res.text()}`);
  }
}

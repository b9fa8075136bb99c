// Laptops (Chromium profiles) on one ship server, for the sync tests: the embedded server on a
// free loopback port with an admin and users, optionally a misbehaving proxy in front of it
// (test/sync/faultyProxy.ts), and the built app served with the server's (and proxy's) origin
// added to its connect-src by the same function the build uses (src/app/csp.config.ts), since
// the ports are only known now. Everything is started here and stopped by `close()`.
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { DEFAULT_DB_NAME } from '../../../src/db/database';
import { withShipServers } from '../../../src/app/csp.config';
import type { LogBundle } from '../../../src/format/types';
import { CouchClient } from '../../../src/sync/couch';
import { pushBundle } from '../../../src/sync/fileSync';
import { cruiseDatabaseName } from '../../../src/sync/ids';
import { addAccounts, startShipServer, type ShipServer } from '../../../server/shipServer';
import { startFaultyProxy, type FaultyProxy } from '../../sync/faultyProxy';
import { collectConsoleErrors, DIST_DIR, launchChromium, type Browser } from './browser';
import { showScreen } from './screens';
import { serveDirectory, type StaticServer } from './server';

export const ADMIN = { name: 'admin', password: 'ship-admin' };
/** One user per laptop: bridge, lab, and the chief scientist's. */
export const USERS = [
  { name: 'bridge', password: 'bridge-pw' },
  { name: 'lab', password: 'lab-pw' },
  { name: 'chief', password: 'chief-pw' },
] as const;

export interface ShipRig {
  ship: ShipServer;
  /** In front of the ship server when asked for; laptops then sign in through it. */
  proxy: FaultyProxy | null;
  web: StaticServer;
  /** The address the laptops are given. */
  serverUrl: string;
  /** Kills the ship server (SIGKILL), as a crash or a power cut of its laptop. */
  kill(): Promise<void>;
  /** Starts the killed server again on the same port and folder. */
  restart(): Promise<void>;
  close(): Promise<void>;
}

export interface Laptop {
  page: Page;
  browser: Browser;
  errors: string[];
}

const browsers: Browser[] = [];

export async function startShipRig(opts: { proxy?: boolean } = {}): Promise<ShipRig> {
  const dir = mkdtempSync(join(tmpdir(), 'floe-e2e-ship-'));
  let ship = await startShipServer({ dir });
  await addAccounts(ship.url, ADMIN, [...USERS]);
  const proxy = opts.proxy ? await startFaultyProxy(ship.url) : null;
  const dist = mkdtempSync(join(tmpdir(), 'floe-e2e-dist-'));
  cpSync(DIST_DIR, dist, { recursive: true });
  const index = join(dist, 'index.html');
  const origins = [new URL(ship.url).origin, ...(proxy ? [new URL(proxy.url).origin] : [])];
  writeFileSync(index, withShipServers(readFileSync(index, 'utf8'), origins));
  const web = await serveDirectory(dist);
  const rig: ShipRig = {
    ship,
    proxy,
    web,
    serverUrl: proxy?.url ?? ship.url,
    kill: () => ship.kill(),
    async restart() {
      ship = await startShipServer({ dir, port: ship.port });
      rig.ship = ship;
    },
    async close() {
      for (const b of browsers.splice(0)) await b.close();
      await web.close();
      await proxy?.close();
      await ship.stop();
      rmSync(dir, { recursive: true, force: true });
      rmSync(dist, { recursive: true, force: true });
    },
  };
  return rig;
}

/** A fresh Chromium profile with the app open. */
export async function openLaptop(rig: ShipRig): Promise<Laptop> {
  const browser = await launchChromium();
  browsers.push(browser);
  const page = browser.context.pages()[0] ?? (await browser.context.newPage());
  const errors = collectConsoleErrors(page);
  await page.goto(rig.web.url);
  await page.locator('main h2').first().waitFor();
  return { page, browser, errors };
}

/** An admin session on the ship server itself (not through the proxy). */
export async function adminClient(rig: ShipRig): Promise<CouchClient> {
  const admin = new CouchClient({ url: rig.ship.url, cookies: 'manual', timeoutMs: 300_000 });
  await admin.logIn(ADMIN.name, ADMIN.password);
  return admin;
}

/** The admin creates the cruise's database and lets the users in (README, "A real CouchDB"). */
export async function openCruiseDatabase(rig: ShipRig, cruiseId: string): Promise<void> {
  const admin = await adminClient(rig);
  const db = cruiseDatabaseName(cruiseId);
  await admin.ensureDatabase(db);
  await admin.request('PUT', `${db}/_security`, { members: { names: USERS.map((u) => u.name), roles: [] }, admins: { names: [], roles: [] } });
}

/** Puts a log on the server as the cruise's documents (as `floe-ledger push` does). */
export async function seedCruise(rig: ShipRig, bundle: LogBundle): Promise<number> {
  await openCruiseDatabase(rig, bundle.cruise.id);
  const r = await pushBundle(await adminClient(rig), bundle);
  if (r.rejected.length) throw new Error(`the server refused ${r.rejected.length} documents of the seed cruise`);
  return r.total;
}

/** Settings > Ship server: address, user, password (and the cruise to receive), then sign in. */
export async function signIn(page: Page, serverUrl: string, user: { name: string; password: string }, join?: string): Promise<void> {
  await showScreen(page, 'Settings');
  await page.getByLabel('Server address').fill(serverUrl);
  await page.getByLabel(/^User/).fill(user.name);
  await page.getByLabel(/^Password/).fill(user.password);
  if (join) await page.getByLabel(/Cruise to receive/).fill(join);
  await page.getByRole('button', { name: 'Sign in and switch sync on' }).click();
  await page.getByText(`Signed in as ${user.name}. Sync is on.`).waitFor({ timeout: 30_000 });
}

export const badge = (page: Page) => page.getByTestId('sync-badge');

/** Console lines of a blocked connection: the policy must let the app reach the server. */
export const policyErrors = (errors: string[]) => errors.filter((e) => /Content Security Policy|Refused to connect/.test(e));

/** The photos stored in the app's database: file name, type and the bytes as base64. */
export function storedPhotos(page: Page): Promise<{ fileName: string; mimeType: string; base64: string }[]> {
  return page.evaluate(async (name) => {
    const rows = await new Promise<{ fileName: string; mimeType: string; blob: Blob }[]>((ok, fail) => {
      const req = indexedDB.open(name);
      req.onerror = () => fail(req.error);
      req.onsuccess = () => {
        const db = req.result;
        const all = db.transaction('photos', 'readonly').objectStore('photos').getAll();
        all.onsuccess = () => {
          db.close();
          ok(all.result as { fileName: string; mimeType: string; blob: Blob }[]);
        };
        all.onerror = () => fail(all.error);
      };
    });
    const out: { fileName: string; mimeType: string; base64: string }[] = [];
    for (const r of rows) {
      const bytes = new Uint8Array(await r.blob.arrayBuffer());
      let text = '';
      for (let i = 0; i < bytes.length; i += 0x8000) text += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
      out.push({ fileName: r.fileName, mimeType: r.mimeType, base64: btoa(text) });
    }
    return out;
  }, DEFAULT_DB_NAME);
}

// Two laptops (two Chromium profiles) on one ship server (PouchDB Server on a free loopback
// port, started and stopped here): laptop B joins mid-cruise and receives the cruise; a save on
// A appears in B's list within 5 s and in B's Review without a reload, with A's list marking it
// "on server". The built app is served with the server's origin added to its connect-src by the
// same function the build uses (src/app/csp.config.ts), since the port is only known now.
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { withShipServers } from '../../src/app/csp.config';
import { CouchClient } from '../../src/sync/couch';
import { cruiseDatabaseName } from '../../src/sync/ids';
import { addAccounts, startShipServer, type ShipServer } from '../../server/shipServer';
import { collectConsoleErrors, DIST_DIR, launchChromium, type Browser } from './harness/browser';
import { createCruise, logObservation } from './harness/logFlow';
import { showScreen } from './harness/screens';
import { serveDirectory, type StaticServer } from './harness/server';

const CRUISE = { name: 'Shared log trial', vessel: 'RV Frostwren', observers: [{ name: 'Ines Tarvo', initials: 'IT' }] };

let ship: ShipServer;
let web: StaticServer;
let dist: string;
const browsers: Browser[] = [];

beforeAll(async () => {
  ship = await startShipServer({ dir: mkdtempSync(join(tmpdir(), 'floe-e2e-ship-')) });
  await addAccounts(ship.url, { name: 'admin', password: 'ship-admin' }, [
    { name: 'bridge', password: 'bridge-pw' },
    { name: 'lab', password: 'lab-pw' },
  ]);
  dist = mkdtempSync(join(tmpdir(), 'floe-e2e-dist-'));
  cpSync(DIST_DIR, dist, { recursive: true });
  const index = join(dist, 'index.html');
  writeFileSync(index, withShipServers(readFileSync(index, 'utf8'), [new URL(ship.url).origin]));
  web = await serveDirectory(dist);
});

afterAll(async () => {
  for (const b of browsers) await b.close();
  await web?.close();
  await ship?.stop();
  rmSync(ship.dir, { recursive: true, force: true });
  rmSync(dist, { recursive: true, force: true });
});

async function laptop(): Promise<{ page: Page; errors: string[] }> {
  const b = await launchChromium();
  browsers.push(b);
  const page = b.context.pages()[0] ?? (await b.context.newPage());
  const errors = collectConsoleErrors(page);
  await page.goto(web.url);
  await page.locator('main h2').first().waitFor();
  return { page, errors };
}

async function signIn(page: Page, user: string, password: string, join?: string) {
  await showScreen(page, 'Settings');
  await page.getByLabel('Server address').fill(ship.url);
  await page.getByLabel(/^User/).fill(user);
  await page.getByLabel(/^Password/).fill(password);
  if (join) await page.getByLabel(/Cruise to receive/).fill(join);
  await page.getByRole('button', { name: 'Sign in and switch sync on' }).click();
  await page.getByText(`Signed in as ${user}. Sync is on.`).waitFor({ timeout: 15_000 });
}

const badge = (page: Page) => page.getByTestId('sync-badge');

// Two browsers, a cruise set up through the screens and three saves: minutes on a loaded 2-core machine.
describe('two laptops on one ship server', { timeout: 300_000 }, () => {
  it('B joins and receives the cruise; a save on A shows on B within 5 s, in its list and in Review', async () => {
    const a = await laptop();
    await createCruise(a.page, CRUISE);
    await logObservation(a.page, { position: '78 30.0 N 015 00.0 E', total: '7', notes: 'first entry before the server' });
    await showScreen(a.page, 'Settings');
    const cruiseId = (await a.page.getByTestId('sync-cruise-id').innerText()).trim();
    // The admin creates the cruise's database and lets the two users in (README, "A real CouchDB").
    const admin = new CouchClient({ url: ship.url, cookies: 'manual' });
    await admin.logIn('admin', 'ship-admin');
    const db = cruiseDatabaseName(cruiseId);
    await admin.request('PUT', db);
    await admin.request('PUT', `${db}/_security`, { members: { names: ['bridge', 'lab'], roles: [] }, admins: { names: [], roles: [] } });

    await signIn(a.page, 'bridge', 'bridge-pw');
    await expect.poll(() => badge(a.page).innerText(), { timeout: 20_000 }).toMatch(/Synced with the ship server/);
    await showScreen(a.page, 'Watch log');
    await expect.poll(() => a.page.getByTestId('server-mark').first().innerText(), { timeout: 10_000 }).toMatch(/on server/);

    const b = await laptop();
    await signIn(b.page, 'lab', 'lab-pw', cruiseId);
    await showScreen(b.page, 'Watch log');
    await b.page.getByText(CRUISE.name).first().waitFor({ timeout: 30_000 });
    await expect.poll(() => b.page.getByTestId('observation-row').count(), { timeout: 20_000 }).toBe(1);

    // A save on A: on B's list within 5 s.
    await showScreen(a.page, 'Watch log');
    await logObservation(a.page, { time: '2026-03-10 06:00', position: '78 31.0 N 015 02.0 E', total: '9', notes: 'second entry, over the server' });
    const t0 = Date.now();
    await expect.poll(() => b.page.getByTestId('observation-row').count(), { timeout: 5000, interval: 25 }).toBe(2);
    const seenMs = Date.now() - t0;
    expect(seenMs).toBeLessThan(5000);

    // B on Review; a third save on A updates it without a reload.
    await showScreen(b.page, 'Review');
    await expect.poll(() => b.page.getByTestId('value-observations').innerText(), { timeout: 10_000 }).toBe('2');
    await logObservation(a.page, { time: '2026-03-10 07:00', position: '78 32.0 N 015 04.0 E', total: '8', notes: 'third entry' });
    await expect.poll(() => b.page.getByTestId('value-observations').innerText(), { timeout: 5000 }).toBe('3');
    console.log(`sync-laptops: a save on A was in B's list after ${seenMs} ms`);
    expect(a.errors.filter((e) => /Content Security Policy|Refused to connect/.test(e))).toEqual([]);
    expect(b.errors.filter((e) => /Content Security Policy|Refused to connect/.test(e))).toEqual([]);
  });
});

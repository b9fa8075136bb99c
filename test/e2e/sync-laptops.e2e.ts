// Two laptops (two Chromium profiles) on one ship server (PouchDB Server on a free loopback
// port, started and stopped here): laptop B joins mid-cruise and receives the cruise; a save on
// A appears in B's list within 5 s and in B's Review without a reload, with A's list marking it
// "on server". The built app is served with the server's origin added to its connect-src by the
// same function the build uses (src/app/csp.config.ts), since the port is only known now.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createCruise, logObservation } from './harness/logFlow';
import { showScreen } from './harness/screens';
import { badge, openCruiseDatabase, openLaptop, policyErrors, signIn, startShipRig, USERS, type ShipRig } from './harness/shipRig';

const CRUISE = { name: 'Shared log trial', vessel: 'RV Frostwren', observers: [{ name: 'Ines Tarvo', initials: 'IT' }] };
const [BRIDGE, LAB] = USERS;

let rig: ShipRig;
beforeAll(async () => {
  rig = await startShipRig();
});
afterAll(async () => {
  await rig?.close();
});

// Two browsers, a cruise set up through the screens and three saves: minutes on a loaded 2-core machine.
describe('two laptops on one ship server', { timeout: 300_000 }, () => {
  it('B joins and receives the cruise; a save on A shows on B within 5 s, in its list and in Review', async () => {
    const a = await openLaptop(rig);
    await createCruise(a.page, CRUISE);
    await logObservation(a.page, { position: '78 30.0 N 015 00.0 E', total: '7', notes: 'first entry before the server' });
    await showScreen(a.page, 'Settings');
    const cruiseId = (await a.page.getByTestId('sync-cruise-id').innerText()).trim();
    // The admin creates the cruise's database and lets the users in (README, "A real CouchDB").
    await openCruiseDatabase(rig, cruiseId);

    await signIn(a.page, rig.serverUrl, BRIDGE);
    await expect.poll(() => badge(a.page).innerText(), { timeout: 20_000 }).toMatch(/Synced with the ship server/);
    await showScreen(a.page, 'Watch log');
    await expect.poll(() => a.page.getByTestId('server-mark').first().innerText(), { timeout: 10_000 }).toMatch(/on server/);

    const b = await openLaptop(rig);
    await signIn(b.page, rig.serverUrl, LAB, cruiseId);
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
    expect(policyErrors(a.errors)).toEqual([]);
    expect(policyErrors(b.errors)).toEqual([]);
  });
});

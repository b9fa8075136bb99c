// Three laptops (three Chromium profiles) on one ship server (PouchDB Server on a free loopback
// port, started and stopped here). A creates the cruise, B and C join it. A save on each laptop
// appears on the two others, the bridge's with a photo that arrives byte for byte. Then the same observation is edited on A and on B while B's network
// is cut (Chromium's offline emulation): when B is back, the conflict is shown on both laptops
// (Exchange: "Flagged for review") and both versions are kept: each laptop's own edit as the
// current revision, the other's as a conflict copy, revision 1 in the history.
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { storeCounts } from './harness/idbCounts';
import { createCruise, logObservation } from './harness/logFlow';
import { showScreen } from './harness/screens';
import { badge, openCruiseDatabase, openLaptop, policyErrors, signIn, startShipRig, storedPhotos, USERS, type Laptop, type ShipRig } from './harness/shipRig';
import { DEFAULT_DB_NAME } from '../../src/db/database';

const CRUISE = { name: 'Three laptop trial', vessel: 'RV Frostwren', observers: [{ name: 'Ines Tarvo', initials: 'IT' }] };
const [BRIDGE, LAB, CHIEF] = USERS;

let rig: ShipRig;
beforeAll(async () => {
  rig = await startShipRig();
});
afterAll(async () => {
  await rig?.close();
});

const rows = (page: Page) => page.getByTestId('observation-row');

/** The notes of every stored observation and of every conflict copy, read from the app's database. */
function notesOf(page: Page): Promise<{ current: string[]; copies: string[] }> {
  return page.evaluate(
    (name) =>
      new Promise<{ current: string[]; copies: string[] }>((ok, fail) => {
        const req = indexedDB.open(name);
        req.onerror = () => fail(req.error);
        req.onsuccess = () => {
          const db = req.result;
          const tx = db.transaction(['observations', 'conflicts'], 'readonly');
          const out = { current: [] as string[], copies: [] as string[] };
          const a = tx.objectStore('observations').getAll();
          a.onsuccess = () => (out.current = (a.result as { notes?: string }[]).map((o) => o.notes ?? ''));
          const c = tx.objectStore('conflicts').getAll();
          c.onsuccess = () => (out.copies = (c.result as { observation: { notes?: string } }[]).map((r) => r.observation.notes ?? ''));
          tx.oncomplete = () => {
            db.close();
            ok(out);
          };
          tx.onerror = () => fail(tx.error);
        };
      }),
    DEFAULT_DB_NAME,
  );
}

/** Opens the observation logged at `time` in the form and saves it with other notes (revision 2). */
async function editNotes(page: Page, time: string, before: string, after: string): Promise<void> {
  await showScreen(page, 'Watch log');
  await rows(page).filter({ hasText: time }).click();
  await page.getByRole('button', { name: /Edit the selected observation/ }).click();
  await page.waitForFunction((n) => (document.getElementById('f-notes') as HTMLTextAreaElement | null)?.value === n, before);
  await page.locator('#f-notes').fill(after);
  await page.locator('#f-total').press('Enter');
  await page.getByText(/^Saved: the .* UTC observation, revision 2\./).waitFor({ timeout: 30_000 });
}

async function allHaveRows(laptops: Laptop[], n: number, timeout: number) {
  for (const l of laptops) await expect.poll(() => rows(l.page).count(), { timeout, interval: 50 }).toBe(n);
}

// Three browsers on a loaded 2-core machine: allow minutes, wait on conditions only.
describe('three laptops on one ship server', { timeout: 300_000 }, () => {
  it('a save on each laptop appears on the two others; an edit made apart on two is a conflict shown on both, both versions kept', async () => {
    const a = await openLaptop(rig);
    await createCruise(a.page, CRUISE);
    const first = 'first entry: close pack, big floes';
    await logObservation(a.page, { time: '2026-03-10 05:00', position: '78 30.0 N 015 00.0 E', total: '9', notes: first });
    await showScreen(a.page, 'Settings');
    const cruiseId = (await a.page.getByTestId('sync-cruise-id').innerText()).trim();
    await openCruiseDatabase(rig, cruiseId);
    await signIn(a.page, rig.serverUrl, BRIDGE);
    await expect.poll(() => badge(a.page).innerText(), { timeout: 30_000 }).toMatch(/Synced with the ship server/);

    const [b, c] = await Promise.all([openLaptop(rig), openLaptop(rig)]);
    await Promise.all([signIn(b.page, rig.serverUrl, LAB, cruiseId), signIn(c.page, rig.serverUrl, CHIEF, cruiseId)]);
    for (const l of [b, c]) await showScreen(l.page, 'Watch log');
    await allHaveRows([b, c], 1, 60_000);

    // One save on each laptop, each on the two others.
    const laptops = { a, b, c };
    const saves = [
      { on: 'a', time: '2026-03-10 06:00', position: '78 31.0 N 015 02.0 E', total: '8', notes: 'from the bridge laptop' },
      { on: 'b', time: '2026-03-10 07:00', position: '78 32.0 N 015 04.0 E', total: '7', notes: 'from the lab laptop' },
      { on: 'c', time: '2026-03-10 08:00', position: '78 33.0 N 015 06.0 E', total: '6', notes: 'from the chief scientist' },
    ] as const;
    // An invented image: the JPEG start-of-image marker, then varied bytes (90 kB).
    const image = Buffer.from(Uint8Array.from({ length: 90_000 }, (_, i) => (i < 4 ? [0xff, 0xd8, 0xff, 0xe0][i]! : (i * 37) & 0xff)));
    const seenMs: number[] = [];
    let count = 1;
    for (const s of saves) {
      const from = laptops[s.on];
      await showScreen(from.page, 'Watch log');
      if (s.on === 'a') {
        await from.page.locator('#f-photos').setInputFiles({ name: 'floe-edge.jpg', mimeType: 'image/jpeg', buffer: image });
        await from.page.getByRole('img', { name: 'floe-edge.jpg' }).waitFor({ timeout: 30_000 });
      }
      await logObservation(from.page, s);
      count++;
      const t0 = Date.now();
      await allHaveRows(Object.values(laptops).filter((l) => l !== from), count, 15_000);
      seenMs.push(Date.now() - t0);
    }
    // The bridge's photo on the two others, byte for byte.
    for (const l of [b, c]) {
      await expect.poll(async () => (await storedPhotos(l.page)).length, { timeout: 30_000, interval: 100 }).toBe(1);
      expect(await storedPhotos(l.page)).toEqual([{ fileName: 'floe-edge.jpg', mimeType: 'image/jpeg', base64: image.toString('base64') }]);
    }

    // Apart: B's network is cut; B and A edit the first entry (revision 1) each their own way.
    await b.browser.context.setOffline(true);
    const fromB = 'edited on the lab laptop, offline: pack opening to the east';
    await editNotes(b.page, '2026-03-10 05:00', first, fromB);
    await expect.poll(() => badge(b.page).innerText(), { timeout: 60_000 }).toMatch(/offline since .*waiting to send/);
    const fromA = 'edited on the bridge: pack closing, ridges';
    await editNotes(a.page, '2026-03-10 05:00', first, fromA);

    // B is back; its next save wakes the sync at once instead of at the next retry.
    await b.browser.context.setOffline(false);
    await showScreen(b.page, 'Watch log');
    await logObservation(b.page, { time: '2026-03-10 09:00', position: '78 34.0 N 015 08.0 E', total: '5', notes: 'after the link came back' });
    count++;
    await allHaveRows(Object.values(laptops), count, 60_000);
    for (const l of [a, b]) {
      await showScreen(l.page, 'Exchange');
      await expect.poll(() => l.page.getByTestId('conflict-item').count(), { timeout: 60_000, interval: 100 }).toBe(1);
      await expect.poll(() => l.page.locator('#conflicts-title').innerText()).toMatch(/Flagged for review: 1 open conflict/);
    }
    // Both versions kept on both: the laptop's own edit stands, the other's is the copy; revision 1 in the history.
    const mine = { a: fromA, b: fromB };
    for (const k of ['a', 'b'] as const) {
      const l = laptops[k];
      const notes = await notesOf(l.page);
      expect(notes.current).toContain(mine[k]);
      expect(notes.copies).toEqual([k === 'a' ? fromB : fromA]);
      const counts = await storeCounts(l.page);
      expect(counts.observations).toBe(count);
      expect(counts.conflicts).toBe(1);
      expect(counts.revisions).toBe(1);
    }
    // C, which edited nothing, holds both versions too: one current, one copy, none lost.
    await expect.poll(async () => (await storeCounts(c.page)).conflicts, { timeout: 60_000 }).toBe(1);
    const onC = await notesOf(c.page);
    expect([...onC.current.filter((n) => n === fromA || n === fromB), ...onC.copies].sort()).toEqual([fromA, fromB].sort());

    console.log(`sync-three-laptops: each save on the two others after ${seenMs.join(', ')} ms`);
    for (const l of Object.values(laptops)) expect(policyErrors(l.errors)).toEqual([]);
  });
});

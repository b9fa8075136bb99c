// The ship server failing under Chromium profiles (laptops). The embedded server (PouchDB Server
// on a free loopback port) sits behind test/sync/faultyProxy.ts, which logs every request and
// answers faults on demand; all is started and stopped here.
// - SIGKILL of the server while two laptops that just joined are receiving a cruise of a few
//   thousand observations, then a restart on the same port and folder: both laptops resume from
//   their checkpoints (no changes feed read from the start again) and end with exactly the
//   cruise: every observation, earlier revision and track point once, no conflict.
// - The server answering 401, 403, 409, a truncated body, 500, 50 MB, garbage, then nothing
//   (hanging): the observer keeps logging,
//   the header shows the state and why, and once the fault clears everything arrives.
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Observation } from '../../src/domain/model';
import type { LogBundle } from '../../src/format/types';
import { pullBundle } from '../../src/sync/fileSync';
import { bigCruise } from '../bench/bigCruise';
import { storeCounts } from './harness/idbCounts';
import { logObservation } from './harness/logFlow';
import { showScreen } from './harness/screens';
import { adminClient, badge, openLaptop, policyErrors, seedCruise, signIn, startShipRig, USERS, type ShipRig } from './harness/shipRig';

const [BRIDGE, LAB, CHIEF] = USERS;

let rig: ShipRig;
beforeAll(async () => {
  rig = await startShipRig({ proxy: true });
});
afterAll(async () => {
  await rig?.close();
});

/** The invented long cruise of the benchmarks, with a cruise id of its own and `edited` observations at revision 2. */
function cruise(id: string, observations: number, trackPoints: number, edited: number): LogBundle {
  const b = bigCruise(observations, trackPoints);
  const c = { ...b.cruise, id, name: `Trial ${id}` };
  const history: Observation[] = [];
  const current = b.observations.map((o, i) => {
    const first = { ...o, cruiseId: id };
    if (i >= edited) return first;
    history.push(first);
    return { ...first, revision: 2, notes: `${o.notes} (checked again)`, savedAt: new Date(Date.parse(o.savedAt) + 600_000).toISOString().replace('.000Z', 'Z') };
  });
  return { ...b, cruise: c, observations: current, history, track: b.track.map((p) => ({ ...p, cruiseId: id })) };
}

const received = async (page: Page) => Number(/Receiving from the ship server: (\d+)/.exec(await badge(page).innerText())?.[1] ?? -1);

describe('the ship server failing', { timeout: 300_000 }, () => {
  it('SIGKILL during a large sync, restart on the same port and folder: every laptop resumes from its checkpoint, nothing lost or doubled', async () => {
    const N = 2000;
    const TRACK = 4000;
    const EDITED = 25;
    const log = cruise('kill-trial', N, TRACK, EDITED);
    const docs = await seedCruise(rig, log);
    const laptops = await Promise.all([openLaptop(rig), openLaptop(rig)]);
    await Promise.all(laptops.map((l, i) => signIn(l.page, rig.serverUrl, i === 0 ? LAB : CHIEF, log.cruise.id)));

    // Both have taken at least one page (the checkpoint is saved before the progress moves).
    for (const l of laptops) await expect.poll(() => received(l.page), { timeout: 120_000, interval: 50 }).toBeGreaterThanOrEqual(500);
    const before = await Promise.all(laptops.map((l) => storeCounts(l.page)));
    await rig.kill();
    for (const l of laptops) await expect.poll(() => badge(l.page).innerText(), { timeout: 60_000 }).toMatch(/Ship server offline since/);
    const fromRestart = rig.proxy!.seen.length;
    await rig.restart();

    for (const l of laptops) {
      await expect.poll(async () => (await storeCounts(l.page)).observations, { timeout: 180_000, interval: 250 }).toBe(N);
      await expect.poll(() => badge(l.page).innerText(), { timeout: 60_000 }).toMatch(/Synced with the ship server/);
      const counts = await storeCounts(l.page);
      expect(counts.revisions).toBe(EDITED);
      expect(counts.trackPoints).toBe(TRACK);
      expect(counts.conflicts).toBe(0);
      expect(counts.cruises).toBe(1);
    }
    // Resumed, not restarted: after the restart no laptop read the changes feed from the start.
    const after = rig.proxy!.seen.slice(fromRestart).filter((r) => r.includes('/_changes?'));
    expect(after.length).toBeGreaterThan(0);
    expect(after.filter((r) => /[?&]since=0(&|$)/.test(r))).toEqual([]);
    console.log(
      `sync-server-faults: ${docs} documents; killed with ${before.map((c) => c.observations).join(' and ')} observations received; ` +
        `both resumed and hold ${N} observations, ${EDITED} earlier revisions, ${TRACK} track points`,
    );
    for (const l of laptops) expect(policyErrors(l.errors)).toEqual([]);
  });

  it('the server answering 401, 403, 409, a truncated body, 500, 50 MB, garbage or nothing: logging goes on, the header says why, and after the fault everything arrives', async () => {
    const proxy = rig.proxy!;
    const log = cruise('fault-trial', 3, 0, 0);
    await seedCruise(rig, log);
    const a = await openLaptop(rig);
    await signIn(a.page, rig.serverUrl, BRIDGE, log.cruise.id);
    await expect.poll(() => badge(a.page).innerText(), { timeout: 60_000 }).toMatch(/Synced with the ship server/);
    await showScreen(a.page, 'Watch log');
    await expect.poll(() => a.page.getByTestId('observation-row').count(), { timeout: 30_000 }).toBe(3);

    // Each state differs from the one before it, so the header is seen to change with the fault.
    const faults = [
      { fault: '401', shows: /Ship server refused, \d+ waiting to send.*sign in again/ },
      { fault: '403', shows: /Ship server refused, \d+ waiting to send.*_security/ },
      { fault: '409', shows: /Ship server offline since \d\d:\d\d UTC, \d+ waiting to send.*HTTP 409/ },
      { fault: 'truncated', shows: /Ship server offline since.*unreadable.*cut off/ },
      { fault: '500', shows: /Ship server offline since \d\d:\d\d UTC, \d+ waiting to send.*HTTP 500/ },
      // 50 MB streamed without a length: under the browser client's limit of 64 MB an answer, so
      // it is read whole and found not to be the answer asked for (the Node test sets a lower
      // limit to see "too large").
      { fault: 'huge', shows: /Ship server offline since.*unreadable \(POST _all_docs: the answer has no rows\)/ },
      { fault: 'garbage', shows: /Ship server offline since.*unreadable.*not JSON/ },
      // The app gives an answer 30 s before it calls the server silent.
      { fault: 'hang', shows: /Ship server offline since.*does not answer in time/ },
    ] as const;
    let hour = 10;
    const shown: string[] = [];
    for (const f of faults) {
      proxy.fault = f.fault;
      // Logging goes on: the save is stored whatever the server does.
      const saved = await logObservation(a.page, { time: `2026-03-11 ${hour++}:00`, position: '79 10.0 N 012 00.0 E', total: '4', notes: `saved while the server answers ${f.fault}` });
      expect(saved).toMatch(/^Saved: /);
      await expect.poll(() => badge(a.page).innerText(), { timeout: 60_000, interval: 100 }).toMatch(f.shows);
      shown.push(`${f.fault}: ${await badge(a.page).innerText()}`);
    }
    expect(proxy.faulted).toBeGreaterThan(0);

    // The fault clears (held connections are reset, as when a link comes back); the next save wakes the sync.
    proxy.fault = 'none';
    proxy.releaseHanging();
    await logObservation(a.page, { time: `2026-03-11 ${hour}:00`, position: '79 11.0 N 012 02.0 E', total: '5', notes: 'saved after the fault cleared' });
    await expect.poll(() => badge(a.page).innerText(), { timeout: 90_000, interval: 100 }).toMatch(/^Synced with the ship server$/);
    const server = (await pullBundle(await adminClient(rig), log.cruise.id)).bundle!;
    const notes = server.observations.map((o) => o.notes).filter((n) => n.startsWith('saved'));
    expect(notes.sort()).toEqual([...faults.map((f) => `saved while the server answers ${f.fault}`), 'saved after the fault cleared'].sort());
    expect((await storeCounts(a.page)).observations).toBe(3 + faults.length + 1);
    console.log(`sync-server-faults: the header during the faults:\n${shown.join('\n')}`);
    expect(policyErrors(a.errors)).toEqual([]);
  });
});

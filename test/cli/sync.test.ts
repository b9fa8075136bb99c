// `push` and `pull` against embedded ship servers (PouchDB Server on free loopback ports,
// started and stopped here), and ship-to-shore with CouchDB's own `_replicate`, including a run
// cut by a SIGKILL of the shore server: the shore copy pulled to a file equals the ship's log.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CliIO } from '../../src/cli/command.ts';
import { runCli } from '../../src/cli/main.ts';
import { pullCommandFor, pushCommandFor } from '../../src/cli/commands/sync.ts';
import { writeArchive } from '../../src/format/archive.ts';
import { readArchive } from '../../src/format/archiveRead.ts';
import { canonicalJson } from '../../src/format/merge.ts';
import { readLogText } from '../../src/format/read.ts';
import type { LogBundle } from '../../src/format/types.ts';
import { CouchClient } from '../../src/sync/couch.ts';
import { cruiseDatabaseName } from '../../src/sync/ids.ts';
import { addAccounts, startShipServer, type ShipServer } from '../../server/shipServer.ts';

const dir = mkdtempSync(join(tmpdir(), 'floe-cli-sync-'));
const demoFile = join(dir, 'demo.json');
let ship: ShipServer;

async function run(...argv: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIO = { stdout: (l) => out.push(l), stderr: (l) => err.push(l) };
  const code = await runCli(argv, io);
  return { code, out, err };
}

function read(file: string): LogBundle {
  const r = readLogText(readFileSync(file, 'utf8'));
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  return r.bundle;
}

function sameLog(a: LogBundle, b: LogBundle) {
  const s = (xs: readonly object[]) => xs.map(canonicalJson).sort();
  expect(canonicalJson(a.cruise)).toBe(canonicalJson(b.cruise));
  expect(s(a.observations)).toEqual(s(b.observations));
  expect(s(a.history)).toEqual(s(b.history));
  expect(s(a.conflicts)).toEqual(s(b.conflicts));
  expect(a.track.length).toBe(b.track.length);
  expect(s(a.track)).toEqual(s(b.track));
}

beforeAll(async () => {
  expect((await run('demo', '-o', demoFile)).code).toBe(0);
  ship = await startShipServer({ dir: join(dir, 'ship') });
}, 120_000);
afterAll(async () => {
  await ship?.stop();
  rmSync(dir, { recursive: true, force: true });
});

describe('push and pull', { timeout: 120_000 }, () => {
  it('push a log, push it again (nothing new), pull it back: the same log', async () => {
    const demo = read(demoFile);
    const first = await run('push', demoFile, '--server', ship.url);
    expect(first.err).toEqual([]);
    expect(first.code).toBe(0);
    const total = Number(/: (\d+) of (\d+) documents/.exec(first.out[0]!)?.[2]);
    expect(first.out[0]).toContain(`${total} of ${total} documents are on the server (database ${cruiseDatabaseName(demo.cruise.id)})`);
    const again = await run('push', demoFile, '--server', ship.url);
    expect(again.code).toBe(0);
    const out = join(dir, 'pulled.json');
    const pulled = await run('pull', '--server', ship.url, '--cruise', demo.cruise.id, '-o', out);
    expect(pulled.err).toEqual([]);
    expect(pulled.code).toBe(0);
    sameLog(read(out), demo);
  });

  it('names what is wrong: a bad address (exit 2), a server that is down (exit 1), an unknown cruise (exit 1)', async () => {
    const bad = await run('pull', '--server', 'ftp://x', '--cruise', 'c', '-o', join(dir, 'x.json'));
    expect(bad.code).toBe(2);
    expect(bad.err[0]).toMatch(/must start with http/);
    const down = await run('push', demoFile, '--server', 'http://127.0.0.1:9/');
    expect(down.code).toBe(1);
    expect(down.err[0]).toMatch(/cannot be reached/);
    const none = await run('pull', '--server', ship.url, '--cruise', 'no-such-cruise', '-o', join(dir, 'y.json'));
    expect(none.code).toBe(1);
    expect(none.err.join('\n')).toMatch(/no readable log of cruise no-such-cruise/);
  });

  it('a zip archive pushed carries its photos; pulled to .zip they come back byte for byte, to .json as descriptions', async () => {
    const demo = read(demoFile);
    // Our own cruise under another id, so this database holds only this test's documents.
    const cruise = { ...demo.cruise, id: `${demo.cruise.id}-photos` };
    const observations = demo.observations.slice(0, 3).map((o, i) => ({ ...o, cruiseId: cruise.id, photoIds: i === 0 ? ['ph-1', 'ph-2'] : [] }));
    const first = observations[0]!;
    const image = (n: number, seed: number) => Uint8Array.from({ length: n }, (_, i) => (i < 2 ? [0xff, 0xd8][i]! : (i * seed) & 0xff));
    const bytes = new Map([['ph-1', image(70_000, 7)], ['ph-2', image(1234, 11)]]);
    const photos = [...bytes].map(([id, b]) => ({ id, observationId: first.id, fileName: `${id}.jpg`, mediaType: 'image/jpeg', byteLength: b.length, addedAt: '2026-03-10T06:05:00Z' }));
    const bundle: LogBundle = { cruise, observations, history: [], conflicts: [], track: [], photos };
    const zip = join(dir, 'with-photos.zip');
    writeFileSync(zip, writeArchive(bundle, bytes));
    const pushed = await run('push', zip, '--server', ship.url);
    expect(pushed.err).toEqual([]);
    // 1 cruise record + 3 observations + 2 photos.
    expect(pushed.out[0]).toContain('6 of 6 documents are on the server');
    const outZip = join(dir, 'pulled-photos.zip');
    const pulled = await run('pull', '--server', ship.url, '--cruise', cruise.id, '-o', outZip);
    expect(pulled.err).toEqual([]);
    expect(pulled.out[0]).toContain('2 photos');
    const back = readArchive(new Uint8Array(readFileSync(outZip)));
    if (!back.ok) throw new Error(JSON.stringify(back.problems));
    expect(back.photos).toEqual(bytes);
    expect(back.bundle.photos.map(canonicalJson).sort()).toEqual(photos.map(canonicalJson).sort());
    const outJson = join(dir, 'pulled-photos.json');
    expect((await run('pull', '--server', ship.url, '--cruise', cruise.id, '-o', outJson)).code).toBe(0);
    expect(read(outJson).photos.map((p) => p.id).sort()).toEqual(['ph-1', 'ph-2']);
  });

  it('a session outlives a SIGKILL and restart of the ship server: the session secret is kept in its folder', async () => {
    let s = await startShipServer({ dir: join(dir, 'restarted') });
    try {
      await addAccounts(s.url, { name: 'admin', password: 'ice-admin' }, [{ name: 'lab', password: 'lab-pw' }]);
      const lab = new CouchClient({ url: s.url, cookies: 'manual' });
      await lab.logIn('lab', 'lab-pw');
      expect(await lab.sessionUser()).toBe('lab');
      await s.kill();
      s = await startShipServer({ dir: join(dir, 'restarted'), port: s.port });
      expect(await lab.sessionUser()).toBe('lab');
    } finally {
      await s.stop();
    }
  });

  it('logs in with a session when the server has accounts; the password comes from the environment only', async () => {
    const s = await startShipServer({ dir: join(dir, 'secured') });
    try {
      await addAccounts(s.url, { name: 'admin', password: 'ice-admin' }, [{ name: 'lab', password: 'lab-pw' }]);
      const push = pushCommandFor({ FLOE_LEDGER_PASSWORD: 'ice-admin' });
      const io = { out: [] as string[], err: [] as string[] };
      const cio: CliIO = { stdout: (l) => io.out.push(l), stderr: (l) => io.err.push(l) };
      expect(await push.run([demoFile, '--server', s.url, '--user', 'admin'], cio)).toBe(0);
      const demo = read(demoFile);
      const db = cruiseDatabaseName(demo.cruise.id);
      const admin = new CouchClient({ url: s.url, cookies: 'manual' });
      await admin.logIn('admin', 'ice-admin');
      await admin.request('PUT', `${db}/_security`, { members: { names: ['lab'], roles: [] }, admins: { names: [], roles: [] } });
      const out = join(dir, 'lab.json');
      expect(await pullCommandFor({ FLOE_LEDGER_PASSWORD: 'lab-pw' }).run(['--server', s.url, '--cruise', demo.cruise.id, '-o', out, '--user', 'lab'], cio)).toBe(0);
      sameLog(read(out), demo);
      const wrong = await pullCommandFor({ FLOE_LEDGER_PASSWORD: 'nope' }).run(['--server', s.url, '--cruise', demo.cruise.id, '-o', out, '--user', 'lab'], cio);
      expect(wrong).toBe(1);
      expect(io.err.at(-1)).toMatch(/HTTP 401/);
      const anonymous = await pullCommandFor({}).run(['--server', s.url, '--cruise', demo.cruise.id, '-o', out], cio);
      expect(anonymous).toBe(1);
      expect(io.err.at(-1)).toMatch(/HTTP 40[13]/);
      await expect(pullCommandFor({}).run(['--server', s.url, '--cruise', demo.cruise.id, '-o', out, '--user', 'lab'], cio)).rejects.toThrow(/FLOE_LEDGER_PASSWORD/);
    } finally {
      await s.stop();
    }
  });
});

describe('ship to shore with CouchDB replication', { timeout: 300_000 }, () => {
  it('an interrupted _replicate run resumes; the shore copy pulled to a file equals the ship\'s log', async () => {
    const demo = read(demoFile);
    const db = cruiseDatabaseName(demo.cruise.id);
    expect((await run('push', demoFile, '--server', ship.url)).code).toBe(0);
    const shoreDir = join(dir, 'shore');
    let shore = await startShipServer({ dir: shoreDir });
    const shipClient = new CouchClient({ url: ship.url, cookies: 'manual' });
    try {
      // Cut the link: SIGKILL the shore server while the ship's replicator is writing to it.
      const running = shipClient.replicate(db, `${shore.url}${db}`, { createTarget: true }).catch((e: unknown) => e);
      const shoreClient = new CouchClient({ url: shore.url, cookies: 'manual' });
      for (let i = 0; i < 200; i++) {
        const info = (await shoreClient.request('GET', db).catch(() => null)) as { doc_count?: number } | null;
        if (info && (info.doc_count ?? 0) > 0) break;
        await new Promise((ok) => setTimeout(ok, 25));
      }
      await shore.kill();
      await running;
      // The ship's own server outlives the cut link (PouchDB Server used to exit on it).
      expect(ship.process.exitCode, 'the ship server is still running').toBeNull();
      shore = await startShipServer({ dir: shoreDir, port: shore.port });
      const before = (await new CouchClient({ url: shore.url }).request('GET', db)) as { doc_count: number };
      const shipInfo = (await shipClient.request('GET', db)) as { doc_count: number };
      // The link came back: the same replication again takes only what is missing.
      const second = await shipClient.replicate(db, `${shore.url}${db}`);
      expect(second.ok).toBe(true);
      const after = (await new CouchClient({ url: shore.url }).request('GET', db)) as { doc_count: number };
      expect(after.doc_count).toBe(shipInfo.doc_count);
      expect(before.doc_count).toBeLessThanOrEqual(shipInfo.doc_count);
      // The cut came before the end (the replicator writes in batches of 100 by default).
      expect(before.doc_count, 'the first run was cut before the end').toBeLessThan(shipInfo.doc_count);
      const out = join(dir, 'shore.json');
      const pulled = await run('pull', '--server', shore.url, '--cruise', demo.cruise.id, '-o', out);
      expect(pulled.err).toEqual([]);
      sameLog(read(out), demo);
    } finally {
      await shore.stop();
    }
  });
});

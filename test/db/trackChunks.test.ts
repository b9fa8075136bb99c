// The track stored as one row per cruise and UTC hour (schema version 4): the columnar codec,
// the upgrade from the one-row-per-point table of versions 1 and 2 (0 points lost, every value
// equal), and the point-level functions over chunks.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { TrackPoint } from '../../src/domain/model';
import { POSITION_SOURCES } from '../../src/domain/model';
import {
  addTrackPoints,
  countTrackPoints,
  FloeDatabase,
  getDb,
  isIsoUtc,
  listTrackChunks,
  listTrackPoints,
  openFloeDb,
  SCHEMA_VERSIONS,
  selectDatabase,
  trackPointAtOrBefore,
} from '../../src/db';
import { canonicalTime, decodeChunk, encodeChunk, hourOf, isCanonicalText, parseTrackTime, sortUnique, type TimedPoint } from '../../src/db/trackChunk';
import { fixtureFiles, loadFixture, readFixture } from './fixtures/load';
import { freshDatabasePerTest } from './helpers';

const db = freshDatabasePerTest();

const byTrackOrder = (a: TrackPoint, b: TrackPoint) => Date.parse(a.time) - Date.parse(b.time) || (a.time < b.time ? -1 : a.time > b.time ? 1 : 0);

/** Points written the way older code wrote them: whole seconds, fractions, optional values left out. */
function oddTrack(cruiseId: string, n: number, t0 = Date.UTC(2026, 1, 10, 5, 58, 0)): TrackPoint[] {
  const out: TrackPoint[] = [];
  for (let i = 0; i < n; i++) {
    const ms = t0 + i * 1_700;
    const iso = new Date(ms).toISOString();
    // Every seventh point keeps its milliseconds as written ("…:01.700Z"), every eleventh has
    // a fraction of other length ("…:01.7Z"); the rest are whole seconds.
    const time = i % 11 === 0 && ms % 1000 !== 0 ? iso.replace(/\.(\d)00Z$/, '.$1Z') : i % 7 === 0 ? iso : new Date(ms - (ms % 1000)).toISOString().replace('.000Z', 'Z');
    const p: TrackPoint = { cruiseId, time, lat: -70 + i * 1e-5 + 1e-13, lon: 179.9999 - i * 1e-6, source: POSITION_SOURCES[i % POSITION_SOURCES.length] as TrackPoint['source'] };
    if (i % 3 !== 0) p.sogKn = (i % 130) / 10;
    if (i % 4 !== 0) p.cogDeg = (i * 7.3) % 360;
    if (i % 5 === 0) p.headingDeg = (i * 1.1) % 360;
    out.push(p);
  }
  return out;
}

describe('track chunk codec', () => {
  it('names the hour a time falls in, and writes whole seconds without a fraction', () => {
    expect(hourOf(Date.parse('2026-02-10T06:59:59.999Z'))).toBe('2026-02-10T06:00:00Z');
    expect(hourOf(Date.parse('2026-02-10T07:00:00Z'))).toBe('2026-02-10T07:00:00Z');
    expect(canonicalTime(Date.parse('2026-02-10T06:05:09Z'))).toBe('2026-02-10T06:05:09Z');
    expect(canonicalTime(Date.parse('2026-02-10T06:05:09.05Z'))).toBe('2026-02-10T06:05:09.050Z');
  });

  it('reads times digit by digit exactly as Date.parse does, or leaves them to it (fast-check)', () => {
    const two = (max: number) => fc.integer({ min: 0, max }).map((n) => String(n).padStart(2, '0'));
    const arbText = fc
      .tuple(
        fc.integer({ min: 1960, max: 2100 }).map(String),
        two(13),
        two(32),
        two(25),
        two(60),
        two(61),
        fc.constantFrom('', '.', '.5', '.05', '.000', '.123', '.1234', '.123456789', '.1234567890', '.x'),
        fc.constantFrom('Z', 'Z', 'Z', 'z', '+00:00', ''),
      )
      .map(([y, mo, d, h, mi, s, f, z]) => `${y}-${mo}-${d}T${h}:${mi}:${s}${f}${z}`);
    fc.assert(
      fc.property(fc.oneof(arbText, fc.string()), (text) => {
        const fast = parseTrackTime(text);
        if (Number.isNaN(fast)) return;
        expect(isIsoUtc(text), text).toBe(true);
        expect(fast, text).toBe(Date.parse(text));
        expect(isCanonicalText(text, fast), text).toBe(text === canonicalTime(fast));
      }),
      { numRuns: 5_000 },
    );
    // Plain cases it must take itself (not hand to Date.parse).
    expect(parseTrackTime('2024-02-29T23:59:59Z')).toBe(Date.UTC(2024, 1, 29, 23, 59, 59));
    expect(parseTrackTime('2026-02-10T06:05:09.05Z')).toBe(Date.UTC(2026, 1, 10, 6, 5, 9, 50));
    expect(parseTrackTime('2026-02-29T00:00:00Z')).toBeNaN();
  });

  it('gives back every point exactly: time text, numbers, sources, values left out', () => {
    const arbPoint = fc.record(
      {
        cruiseId: fc.constant('c1'),
        ms: fc.integer({ min: 0, max: 3_599_999 }),
        frac: fc.constantFrom('', '.0', '.5', '.000', '.123456789'),
        lat: fc.double({ min: -90, max: 90, noNaN: true }),
        lon: fc.double({ min: -180, max: 180, noNaN: true }),
        source: fc.constantFrom(...POSITION_SOURCES),
        sogKn: fc.option(fc.double({ noNaN: true, noDefaultInfinity: true }), { nil: undefined }),
        cogDeg: fc.option(fc.double({ min: 0, max: 360, noNaN: true }), { nil: undefined }),
        headingDeg: fc.option(fc.double({ min: 0, max: 360, noNaN: true }), { nil: undefined }),
      },
      { requiredKeys: ['cruiseId', 'ms', 'frac', 'lat', 'lon', 'source'] },
    );
    fc.assert(
      fc.property(fc.array(arbPoint, { maxLength: 60 }), (raw) => {
        const hourMs = Date.UTC(2026, 1, 10, 6);
        const pts: TrackPoint[] = raw.map(({ ms, frac, ...rest }) => {
          const whole = new Date(hourMs + ms - (ms % 1000)).toISOString().slice(0, 19);
          const p: TrackPoint = { ...rest, time: `${whole}${frac}Z` };
          for (const k of ['sogKn', 'cogDeg', 'headingDeg'] as const) if (p[k] === undefined) delete p[k];
          return p;
        });
        const timed: TimedPoint[] = sortUnique(pts.map((p) => ({ ms: Date.parse(p.time), p })));
        const chunk = encodeChunk('c1', '2026-02-10T06:00:00Z', timed);
        expect(decodeChunk(chunk)).toEqual(timed.map((x) => x.p));
        // Later copies of a time text win, as a put of the same key would.
        const lastOf = new Map(pts.map((p) => [p.time, p]));
        expect(decodeChunk(chunk)).toEqual([...lastOf.values()].sort(byTrackOrder));
      }),
      { numRuns: 200 },
    );
  });
});

describe('schema version 4 upgrade: trackPoints rows to hour chunks', () => {
  for (const { version, file } of fixtureFiles().filter((f) => f.version < 4)) {
    it(`keeps every track point of the version ${version} fixture, every value equal`, async () => {
      const fx = readFixture(file);
      const rows = (fx.tables.trackPoints ?? []) as TrackPoint[];
      expect(rows.length).toBeGreaterThan(0);
      await loadFixture(db.name(), fx);
      selectDatabase(db.name());
      await openFloeDb();
      expect(getDb().tables.map((t) => t.name)).not.toContain('trackPoints');
      for (const cruiseId of new Set(rows.map((r) => r.cruiseId))) {
        const mine = rows.filter((r) => r.cruiseId === cruiseId).sort(byTrackOrder);
        expect(await listTrackPoints(cruiseId)).toEqual(mine);
        expect(await countTrackPoints(cruiseId)).toBe(mine.length);
      }
    });
  }

  it('converts 30,000 points of two cruises written by version 2 code: 0 lost, every value equal', async () => {
    const a = oddTrack('cruise-a', 20_000);
    const b = oddTrack('cruise-b', 10_000, Date.UTC(2026, 2, 1, 23, 30, 0));
    // Two texts of one instant are two rows of the old table; both must survive.
    const twin: TrackPoint = { ...(a[1] as TrackPoint), time: new Date(Date.parse((a[1] as TrackPoint).time)).toISOString(), lat: 10 };
    if (twin.time === (a[1] as TrackPoint).time) throw new Error('the twin must differ in text');
    const old = new FloeDatabase(db.name(), { versions: SCHEMA_VERSIONS.filter((v) => v.version <= 2) });
    await old.open();
    await old.table('trackPoints').bulkAdd([...b, ...a, twin]);
    old.close();

    selectDatabase(db.name());
    await openFloeDb();
    expect(await listTrackPoints('cruise-a')).toEqual([...a, twin].sort(byTrackOrder));
    expect(await listTrackPoints('cruise-b')).toEqual(b);
    expect(await countTrackPoints('cruise-a')).toBe(20_001);
    const chunks = await listTrackChunks('cruise-b');
    // 10,000 fixes 1.7 s apart from 23:30 span 17,000 s: hours 23, 00, 01, 02, 03, 04.
    expect(chunks.map((c) => c.hour)).toEqual(['2026-03-01T23:00:00Z', '2026-03-02T00:00:00Z', '2026-03-02T01:00:00Z', '2026-03-02T02:00:00Z', '2026-03-02T03:00:00Z', '2026-03-02T04:00:00Z']);
    expect(chunks.reduce((n, c) => n + c.count, 0)).toBe(10_000);
  });
});

describe('track over chunks', () => {
  it('a live fix is one read and one write of its hour chunk; the hour grows in order', async () => {
    // 1.7 s apart from 05:59:30: points 0-17 fall in hour 05, points 18-49 in hour 06.
    const pts = oddTrack('c1', 50, Date.UTC(2026, 1, 10, 5, 59, 30));
    for (const p of pts) await addTrackPoints([p]);
    const chunks = await listTrackChunks('c1');
    expect(chunks.map((c) => [c.hour, c.count])).toEqual([
      ['2026-02-10T05:00:00Z', 18],
      ['2026-02-10T06:00:00Z', 32],
    ]);
    expect(await listTrackPoints('c1')).toEqual(pts);
  });

  it('reads ranges, limits and the fix before a time across hour boundaries', async () => {
    const pts = oddTrack('c1', 6_000);
    await addTrackPoints(pts, { chunkSize: 700 });
    const sorted = [...pts].sort(byTrackOrder);
    const from = sorted[2_100] as TrackPoint;
    const to = sorted[4_300] as TrackPoint;
    expect(await listTrackPoints('c1', { from: from.time, to: to.time })).toEqual(sorted.slice(2_100, 4_301));
    expect(await listTrackPoints('c1', { from: from.time, limit: 3 })).toEqual(sorted.slice(2_100, 2_103));
    // 2,200 points from point 2,100 cross an hour boundary within the four-chunk pages.
    expect(await listTrackPoints('c1', { from: from.time, limit: 2_200 })).toEqual(sorted.slice(2_100, 4_300));
    expect(await trackPointAtOrBefore('c1', to.time)).toEqual(to);
    expect(await trackPointAtOrBefore('c1', '2026-02-11T00:00:00Z')).toEqual(sorted[sorted.length - 1]);
    expect(await trackPointAtOrBefore('c1', '2026-02-10T05:57:59Z')).toBeUndefined();
    expect(await listTrackPoints('c1', { from: 'not a time' })).toEqual([]);
  });

  it('finds the fix before a time across empty hours', async () => {
    const early = oddTrack('c1', 3, Date.UTC(2026, 1, 10, 1, 0, 0));
    const late = oddTrack('c1', 3, Date.UTC(2026, 1, 10, 9, 0, 0));
    const other = oddTrack('c1', 3, Date.UTC(2026, 1, 10, 12, 0, 0));
    await addTrackPoints([...early, ...late, ...other]);
    expect(await trackPointAtOrBefore('c1', '2026-02-10T08:59:00Z')).toEqual(early[2]);
    expect(await trackPointAtOrBefore('c1', '2026-02-10T11:00:00Z')).toEqual(late[2]);
  });

  it('refuses a speed, course or heading that is not a number, naming the point', async () => {
    const pts = oddTrack('c1', 10);
    pts[6] = { ...(pts[6] as TrackPoint), sogKn: NaN };
    await expect(addTrackPoints(pts)).rejects.toMatchObject({ path: 'points.6.sogKn' });
    expect(await countTrackPoints('c1')).toBe(0);
  });
});

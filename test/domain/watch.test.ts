import { describe, expect, it } from 'vitest';
import { formatCountdown, groupMissed, missedRunText, missedSlotsBetween, readUtcMinute, slotOf, watchStatus } from '../../src/domain/watch';

// Hourly observations on the full hour from the bridge: common practice, no source (WMO-No. 259
// names what is observed, not how often). The due/overdue margins are our own.
const t = (iso: string) => Date.parse(iso);

describe('slotOf', () => {
  it('counts an observation for the nearest full hour with a 60-minute interval', () => {
    expect(new Date(slotOf(t('2026-03-04T12:25:00Z'), 60)).toISOString()).toBe('2026-03-04T12:00:00.000Z');
    expect(new Date(slotOf(t('2026-03-04T11:40:00Z'), 60)).toISOString()).toBe('2026-03-04T12:00:00.000Z');
    expect(new Date(slotOf(t('2026-03-04T12:31:00Z'), 60)).toISOString()).toBe('2026-03-04T13:00:00.000Z');
  });

  it('uses half-hour slots with a 30-minute interval', () => {
    expect(new Date(slotOf(t('2026-03-04T12:40:00Z'), 30)).toISOString()).toBe('2026-03-04T12:30:00.000Z');
  });

  it('rejects a non-positive interval', () => {
    expect(() => slotOf(0, 0)).toThrow(/positive/);
    expect(() => slotOf(0, -5)).toThrow(/positive/);
  });
});

describe('watchStatus', () => {
  const opts = { intervalMinutes: 60 };

  it('waits for the next hour after an observation on the hour', () => {
    const s = watchStatus(t('2026-03-04T12:20:00Z'), ['2026-03-04T12:02:00Z'], opts);
    expect(s.nextDue).toBe('2026-03-04T13:00:00Z');
    expect(s.msToDue).toBe(40 * 60_000);
    expect(s.state).toBe('waiting');
    expect(s.missed).toEqual([]);
    expect(s.lastObservation).toBe('2026-03-04T12:02:00Z');
  });

  it('is due from five minutes before the slot to ten minutes after it', () => {
    const obs = ['2026-03-04T12:00:00Z'];
    expect(watchStatus(t('2026-03-04T12:54:59Z'), obs, opts).state).toBe('waiting');
    expect(watchStatus(t('2026-03-04T12:55:00Z'), obs, opts).state).toBe('due');
    expect(watchStatus(t('2026-03-04T13:10:00Z'), obs, opts).state).toBe('due');
    const late = watchStatus(t('2026-03-04T13:10:01Z'), obs, opts);
    expect(late.state).toBe('overdue');
    expect(late.nextDue).toBe('2026-03-04T13:00:00Z');
    expect(late.msToDue).toBe(-(10 * 60_000 + 1000));
  });

  it('honours custom due and grace margins', () => {
    const obs = ['2026-03-04T12:00:00Z'];
    const o = { intervalMinutes: 60, dueBeforeMinutes: 0, graceMinutes: 2 };
    expect(watchStatus(t('2026-03-04T12:59:00Z'), obs, o).state).toBe('waiting');
    expect(watchStatus(t('2026-03-04T13:02:00Z'), obs, o).state).toBe('due');
    expect(watchStatus(t('2026-03-04T13:03:00Z'), obs, o).state).toBe('overdue');
  });

  it('lists a missed hour once its window has closed and moves on to the next slot', () => {
    const obs = ['2026-03-04T10:00:00Z', '2026-03-04T11:05:00Z'];
    // At 12:29 the 12:00 slot is still open (overdue); at 12:30 it is missed.
    const open = watchStatus(t('2026-03-04T12:29:00Z'), obs, opts);
    expect(open.nextDue).toBe('2026-03-04T12:00:00Z');
    expect(open.state).toBe('overdue');
    expect(open.missed).toEqual([]);
    const closed = watchStatus(t('2026-03-04T12:30:00Z'), obs, opts);
    expect(closed.missed).toEqual(['2026-03-04T12:00:00Z']);
    expect(closed.nextDue).toBe('2026-03-04T13:00:00Z');
    expect(closed.state).toBe('waiting');
  });

  it('finds gaps between observations and skips slots covered early', () => {
    const obs = ['2026-03-04T06:00:00Z', '2026-03-04T08:55:00Z', '2026-03-04T10:35:00Z'];
    // 08:55 covers 09:00, 10:35 covers 11:00; 07:00, 08:00 and 10:00 are missed.
    const s = watchStatus(t('2026-03-04T11:20:00Z'), obs, opts);
    expect(s.missed).toEqual(['2026-03-04T07:00:00Z', '2026-03-04T08:00:00Z', '2026-03-04T10:00:00Z']);
    expect(s.nextDue).toBe('2026-03-04T12:00:00Z');
  });

  it('looks back no further than the look-back window', () => {
    // Window 09:10..12:10: the 10:00 and 11:00 slots; 12:00 is still open (overdue).
    const s = watchStatus(t('2026-03-05T12:10:00Z'), ['2026-03-01T00:00:00Z', '2026-03-05T09:20:00Z'], {
      intervalMinutes: 60,
      lookbackHours: 3,
    });
    expect(s.missed).toEqual(['2026-03-05T10:00:00Z', '2026-03-05T11:00:00Z']);
  });

  it('lists nothing missed when the last observation is older than the look-back window', () => {
    const s = watchStatus(t('2026-12-02T12:10:00Z'), ['2026-03-01T00:00:00Z'], opts);
    expect(s.missed).toEqual([]);
    expect(s.state).toBe('due');
  });

  it('with no observation yet, the current slot is due and nothing is missed', () => {
    const s = watchStatus(t('2026-03-04T12:07:00Z'), [], opts);
    expect(s.nextDue).toBe('2026-03-04T12:00:00Z');
    expect(s.state).toBe('due');
    expect(s.missed).toEqual([]);
    expect(s.lastObservation).toBeNull();
  });

  it('skips a slot already covered by an observation a little ahead of time', () => {
    // Observed at 12:40 for the 13:00 slot; at 12:45 the next one is 14:00.
    const s = watchStatus(t('2026-03-04T12:45:00Z'), ['2026-03-04T12:00:00Z', '2026-03-04T12:40:00Z'], opts);
    expect(s.nextDue).toBe('2026-03-04T14:00:00Z');
  });

  it('ignores unreadable times rather than failing', () => {
    const s = watchStatus(t('2026-03-04T12:20:00Z'), ['not a time', '2026-03-04T12:00:00Z'], opts);
    expect(s.nextDue).toBe('2026-03-04T13:00:00Z');
  });
});

describe('missedSlotsBetween and groupMissed', () => {
  it('groups consecutive missed slots into runs', () => {
    const obs = ['2026-03-04T00:00:00Z', '2026-03-04T04:00:00Z', '2026-03-04T06:00:00Z'];
    const slots = missedSlotsBetween(obs, 60, t('2026-03-04T00:00:00Z'), t('2026-03-04T06:00:00Z'));
    expect(slots.map((s) => new Date(s).toISOString().slice(11, 16))).toEqual(['01:00', '02:00', '03:00', '05:00']);
    expect(groupMissed(slots, 60)).toEqual([
      { from: '2026-03-04T01:00:00Z', to: '2026-03-04T03:00:00Z', count: 3 },
      { from: '2026-03-04T05:00:00Z', to: '2026-03-04T05:00:00Z', count: 1 },
    ]);
  });

  it('returns no runs for no slots', () => {
    expect(groupMissed([], 60)).toEqual([]);
  });
});

describe('formatCountdown', () => {
  it('shows minutes and seconds under an hour and hours and minutes above', () => {
    expect(formatCountdown(12 * 60_000 + 5000)).toBe('in 12 min 05 s');
    expect(formatCountdown(-(63 * 60_000))).toBe('1 h 03 min ago');
  });
});

// The cruise's end and runs across midnight: our own rules for the watch (no source; the hourly
// watch itself is common practice, see above).
describe('the watch after the cruise ends', () => {
  const opts = { intervalMinutes: 60, endTime: '2026-12-02T12:00:00Z' };
  const hourly = (from: string, n: number) => Array.from({ length: n }, (_, i) => new Date(t(from) + i * 3_600_000).toISOString());

  it('is ended from the end time on: nothing due, and no missed hour after the end', () => {
    const times = hourly('2026-12-02T00:00:00Z', 6); // 00:00 to 05:00, then nothing
    const before = watchStatus(t('2026-12-02T10:20:00Z'), times, opts);
    expect(before.state).toBe('overdue');
    expect(before.missed).toContain('2026-12-02T09:00:00Z');
    const after = watchStatus(t('2026-12-02T16:20:00Z'), times, opts);
    expect(after.state).toBe('ended');
    // Slots 06:00 to 11:00 were owed (their windows closed before 12:00); 12:00 on are not.
    expect(after.missed[0]).toBe('2026-12-02T06:00:00Z');
    expect(after.missed[after.missed.length - 1]).toBe('2026-12-02T11:00:00Z');
  });

  it('a cruise with no end keeps calling', () => {
    expect(watchStatus(t('2026-12-02T16:58:00Z'), hourly('2026-12-02T00:00:00Z', 16), { intervalMinutes: 60 }).state).toBe('due');
  });
});

describe('missedRunText', () => {
  it('names both dates when a run crosses midnight', () => {
    const slots = Array.from({ length: 23 }, (_, i) => t('2026-12-01T19:00:00Z') + i * 3_600_000);
    const [run] = groupMissed(slots, 60);
    expect(run && missedRunText(run)).toBe('19:00 on 2026-12-01 to 17:00 on 2026-12-02 UTC (23 observations)');
  });

  it('gives one date for a run within a day, and a single slot alone', () => {
    const runs = groupMissed([t('2026-12-01T03:00:00Z'), t('2026-12-01T04:00:00Z'), t('2026-12-01T09:00:00Z')], 60);
    expect(runs.map(missedRunText)).toEqual(['03:00\u201304:00 UTC on 2026-12-01 (2 observations)', '09:00 UTC on 2026-12-01']);
  });
});

describe('readUtcMinute', () => {
  it('reads YYYY-MM-DD HH:MM as UTC and refuses what is not a real time', () => {
    expect(readUtcMinute('2026-12-20 08:00')).toEqual({ ok: true, value: '2026-12-20T08:00:00Z' });
    expect(readUtcMinute('2026-12-20T08:00Z')).toEqual({ ok: true, value: '2026-12-20T08:00:00Z' });
    const bad = readUtcMinute('2026-02-30 08:00');
    expect(bad.ok).toBe(false);
    expect(!bad.ok && bad.error).toContain('2026-02-30 08:00');
    expect(readUtcMinute('tomorrow').ok).toBe(false);
  });
});

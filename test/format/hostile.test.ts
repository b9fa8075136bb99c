import { describe, expect, it } from 'vitest';
import { readLogText } from '../../src/format/read';
import { hostileCases, validText } from './hostile';

describe('hostile and broken files', { timeout: 120_000 }, () => {
  const cases = hostileCases();

  it('the generator makes at least 1,000 distinct cases from a file that is itself valid', () => {
    expect(cases.length).toBeGreaterThanOrEqual(1000);
    expect(new Set(cases.map((c) => c.text)).size).toBeGreaterThanOrEqual(1000);
    expect(readLogText(validText()).ok).toBe(true);
  });

  it('rejects every one, with a path and a reason, and leaves Object.prototype untouched', () => {
    const protoKeys = Object.getOwnPropertyNames(Object.prototype).sort();
    const accepted: string[] = [];
    for (const c of cases) {
      const r = readLogText(c.text);
      if (r.ok) {
        accepted.push(c.name);
        continue;
      }
      expect(r.problems.listed.length, c.name).toBeGreaterThan(0);
      for (const p of r.problems.listed) {
        expect(p.path, c.name).toMatch(/^\$/);
        expect(p.message.length, c.name).toBeGreaterThan(5);
      }
    }
    expect(accepted).toEqual([]);
    expect(Object.getOwnPropertyNames(Object.prototype).sort()).toEqual(protoKeys);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });
});

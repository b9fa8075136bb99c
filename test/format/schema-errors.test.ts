// Guards issue 16 "quadratic time on error-dense files": ajv's standalone validators with
// allErrors used to copy their whole error list on every $ref'd row (vErrors.concat), so a log
// whose track rows are all invalid took time quadratic in the number of errors. The generator now
// appends in place and keeps at most MAX_SCHEMA_ERRORS (scripts/build-validators.ts, capErrors).
// Work is counted, not timed: every array element the validator copies or appends while it runs.
import { describe, expect, it } from 'vitest';
import validateCurrent from '../../src/format/generated/validate-log-2.js';
import { MAX_LISTED_PROBLEMS, MAX_SCHEMA_ERRORS } from '../../src/format/limits';
import { formatReport } from '../../src/format/problems';
import { readLogText } from '../../src/format/read';
import { errorDenseLog } from './hostile';

/** Elements moved by Array.prototype.push and concat while `fn` runs (synchronously). */
function countArrayWork(fn: () => void): number {
  const proto = Array.prototype as unknown as Record<'push' | 'concat', (...a: unknown[]) => unknown>;
  const push = proto.push;
  const concat = proto.concat;
  let moved = 0;
  proto.push = function (this: unknown[], ...items: unknown[]) {
    moved += items.length;
    return push.apply(this, items);
  };
  proto.concat = function (this: unknown[], ...items: unknown[]) {
    moved += this.length;
    for (const x of items) moved += Array.isArray(x) ? x.length : 1;
    return concat.apply(this, items);
  };
  try {
    fn();
  } finally {
    proto.push = push;
    proto.concat = concat;
  }
  return moved;
}

describe('schema validation of error-dense files (issue 16)', () => {
  it('keeps MAX_SCHEMA_ERRORS errors and counts every other one exactly', () => {
    const doc = errorDenseLog(5_000);
    expect(validateCurrent(doc)).toBe(false);
    expect(validateCurrent.errors).toHaveLength(MAX_SCHEMA_ERRORS);
    expect(validateCurrent.droppedErrors).toBe(5_000 - MAX_SCHEMA_ERRORS);
    expect(validateCurrent.errors?.[0]?.instancePath).toBe('/track/points/0/1');
    // A valid file afterwards reports no leftover count from the previous call.
    expect(validateCurrent(errorDenseLog(0))).toBe(true);
    expect(validateCurrent.droppedErrors).toBe(0);
  });

  it('does work linear in the number of errors: 8x the bad rows, at most 9x the array work', () => {
    const work = [1_000, 8_000].map((n) => {
      const doc = errorDenseLog(n);
      return countArrayWork(() => validateCurrent(doc));
    });
    // Quadratic work (the old concat) grows 64x here; linear grows 8x. Measured with the old
    // generated validator: 1,000 rows 500,499 elements, 8,000 rows 32,003,999 (64x), and this test failed; the
    // capped one moves 99 elements at both sizes.
    expect((work[1] as number) / (work[0] as number)).toBeLessThan(9);
    expect(work[1]).toBeLessThan(20 * MAX_SCHEMA_ERRORS + 8_000);
  });

  it('a rejected file says how many problems were not listed, the dropped ones included', () => {
    const r = readLogText(JSON.stringify(errorDenseLog(3_000)));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.problems.listed).toHaveLength(MAX_LISTED_PROBLEMS);
    expect(r.problems.listed[0]?.path).toBe('$.track.points[0][1]');
    expect(r.problems.more).toBe(3_000 - MAX_LISTED_PROBLEMS);
    expect(formatReport(r.problems).at(-1)).toBe(`... and ${3_000 - MAX_LISTED_PROBLEMS} more problems`);
  });
});

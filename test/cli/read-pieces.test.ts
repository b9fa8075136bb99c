// The command line reads JSON logs in pieces (src/cli/logFiles.ts over src/format/readStream.ts):
// the same bundle, counts, warnings and problems as the whole-file reader gives.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { checkLog, loadLog } from '../../src/cli/logFiles';
import { readLogText } from '../../src/format/read';

const dir = mkdtempSync(join(tmpdir(), 'floe-cli-pieces-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const FILES = ['docs/examples/demo-cruise.floe-log.json', 'docs/examples/demo-cruise-v1.floe-log.json', 'test/format/fixtures/log-v0.json'];

describe('the command line reads logs in pieces', () => {
  it.each(FILES)('%s: the whole reader\'s bundle, warnings and counts', (file) => {
    const whole = readLogText(readFileSync(file, 'utf8'));
    const loaded = loadLog(file);
    const checked = checkLog(file);
    expect(whole.ok && loaded.ok && checked.ok).toBe(true);
    if (!whole.ok || !loaded.ok || !checked.ok) return;
    expect(loaded.bundle).toStrictEqual(whole.bundle);
    expect(loaded.warnings).toStrictEqual(whole.warnings);
    expect(checked.warnings).toStrictEqual(whole.warnings);
    const b = whole.bundle;
    expect(checked.counts).toEqual({ observations: b.observations.length, history: b.history.length, conflicts: b.conflicts.length, trackPoints: b.track.length, photos: b.photos.length });
  });

  it('a file rejected half-way gets the whole reader\'s report, with line and column', () => {
    const text = readFileSync(FILES[0] as string, 'utf8');
    // The last observation's latitude, far into the file, out of range.
    const at = text.lastIndexOf('"lat":', text.indexOf('"track"'));
    const bad = `${text.slice(0, at)}"lat":95,"x${text.slice(at + 6)}`.replace('"x', '"was":');
    const file = join(dir, 'bad.json');
    writeFileSync(file, bad);
    const whole = readLogText(bad);
    expect(whole.ok).toBe(false);
    for (const r of [loadLog(file), checkLog(file)]) {
      expect(r.ok).toBe(false);
      if (!r.ok && !whole.ok) expect(r.problems).toEqual(whole.problems);
    }
  });
});

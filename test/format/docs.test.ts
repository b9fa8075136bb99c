import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { generateDocs } from '../../scripts/build-format-docs';
import { readLogText } from '../../src/format/read';

const ROOT = resolve(import.meta.dirname, '../..');

describe('published format description and examples', { timeout: 60_000 }, () => {
  it('docs/format.md and docs/examples are current (run: npx tsx scripts/build-format-docs.ts)', () => {
    for (const [rel, content] of generateDocs()) expect(readFileSync(resolve(ROOT, rel), 'utf8') === content, rel).toBe(true);
  });
  it('the example logs are valid, in both versions', () => {
    for (const f of ['docs/examples/demo-cruise.floe-log.json', 'docs/examples/log-v0.json']) {
      const r = readLogText(readFileSync(resolve(ROOT, f), 'utf8'));
      expect(r.ok, f).toBe(true);
    }
  });
  it('describes every field of the schema', () => {
    const doc = readFileSync(resolve(ROOT, 'docs/format.md'), 'utf8');
    for (const field of ['totalConcentrationSigrid3', 'partialConcentrationSigrid3', 'floeSizeSigrid3', 'history', 'conflicts', 'archivePath', 'intervalMinutes', 'iceClass', 'fixTime', 'cloudOktas']) {
      expect(doc).toContain(`\`${field}\``);
    }
  });
});

// Guards issue 16 on the command line: atomic output (a failed write leaves the old file), never
// writing a file the tool rejects (zip without the photos' bytes), invalid UTF-8 refused as in
// the app, control characters shown visibly in text output while JSON stays exact, and no EPIPE
// stack trace when the reader of a pipe goes away. Spawned runs go through the bin shim; the
// file-size limit is bash's `ulimit -f` (POSIX setrlimit RLIMIT_FSIZE, in 1024-byte blocks).
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { run } from './runCollected.ts';
import { visible } from '../../src/cli/terminalText.ts';
import { encodeLog, writeLogJson } from '../../src/format/encode.ts';
import { sampleBundle } from '../format/arbitraries.ts';

const ROOT = resolve(import.meta.dirname, '../..');
const BIN = resolve(ROOT, 'bin/floe-ledger.mjs');
const dir = mkdtempSync(join(tmpdir(), 'floe-cli-hostile-'));
const demo = join(dir, 'demo.json');


/** bash -c with the command line; the bin shim is `floe`. */
function sh(script: string) {
  return spawnSync('bash', ['-c', script], { encoding: 'utf8', env: { ...process.env, FLOE: `${process.execPath} ${BIN}` } });
}

beforeAll(async () => {
  expect((await run('demo', '-o', demo)).code).toBe(0);
}, 60_000);

describe('atomic -o (issue 16)', { timeout: 120_000 }, () => {
  it('a write stopped by a file-size limit exits 1 with its own message and leaves the old file, even an input', () => {
    const target = join(dir, 'kept.json');
    writeFileSync(target, 'the file that was there\n');
    const before = readdirSync(dir).sort();
    // 16 KiB may be written; the converted log is about 800 kB.
    const r = sh(`ulimit -f 16; $FLOE convert ${demo} --to log -o ${target}`);
    expect(r.status).toBe(1);
    expect(r.stderr).toContain(`floe-ledger convert: cannot write ${target} (file too large`);
    expect(r.stderr).toContain('nothing was written and any file that was there is unchanged');
    expect(r.stderr).not.toContain('--help');
    expect(readFileSync(target, 'utf8')).toBe('the file that was there\n');
    // The input itself as the output: still whole afterwards.
    const input = join(dir, 'input.json');
    writeFileSync(input, readFileSync(demo));
    const again = sh(`ulimit -f 16; $FLOE convert ${input} --to log -o ${input}`);
    expect(again.status).toBe(1);
    expect(readFileSync(input)).toEqual(readFileSync(demo));
    // No temporary file is left beside the target.
    expect(readdirSync(dir).sort()).toEqual([...before, 'input.json'].sort());
  });

  it('the same write without the limit replaces the file whole (the positive control)', () => {
    const target = join(dir, 'replaced.json');
    writeFileSync(target, 'old');
    const r = sh(`$FLOE convert ${demo} --to log -o ${target}`);
    expect(r.status).toBe(0);
    expect(sh(`$FLOE validate --quiet ${target}`).status).toBe(0);
  });
});

describe('never a file the tool rejects (issue 16)', { timeout: 120_000 }, () => {
  const withPhoto = join(dir, 'with-photo.json');
  beforeAll(() => writeFileSync(withPhoto, writeLogJson(encodeLog(sampleBundle())).join('')));

  it('convert --to zip of a JSON log naming photos is refused, naming them; nothing written', async () => {
    const out = join(dir, 'no-photos.zip');
    const r = await run('convert', withPhoto, '--to', 'zip', '-o', out);
    expect(r.code).toBe(1);
    expect(r.err[0]).toBe(`floe-ledger convert: ${out}: the log names 1 photo ("ph-1") whose bytes are in none of the input files (a JSON log carries photo descriptions only); give the zip archives that hold them, or write a JSON log; nothing written`);
    expect(existsSync(out)).toBe(false);
  });

  it('merge -o x.zip of JSON logs naming photos is refused the same way; a zip with the photos is written and validates', async () => {
    const out = join(dir, 'merged.zip');
    const r = await run('merge', withPhoto, withPhoto, '-o', out);
    expect(r.code).toBe(1);
    expect(r.err[0]).toMatch(/the log names 1 photo \("ph-1"\) whose bytes are in none of the input files/);
    expect(existsSync(out)).toBe(false);
    const demoZip = join(dir, 'demo.zip');
    expect((await run('convert', demo, '--to', 'zip', '-o', demoZip)).code).toBe(0);
    expect((await run('validate', demoZip)).code).toBe(0);
  });
});

describe('bytes and terminal text (issue 16)', { timeout: 120_000 }, () => {
  it('invalid UTF-8 is refused by the CLI as by the app', async () => {
    const bytes = readFileSync(demo);
    const bad = Buffer.concat([bytes.subarray(0, 200), Buffer.from([0xc3, 0x28]), bytes.subarray(202)]);
    const file = join(dir, 'bad-utf8.json');
    writeFileSync(file, bad);
    const r = await run('validate', file);
    expect(r.code).toBe(1);
    expect(r.err[0]).toMatch(/bad-utf8\.json: line 6: \$: the file is not valid UTF-8: byte 200 \(0xc3\) starts no character/);
  });

  it('a CSV export given to validate says what validate reads', async () => {
    const csv = join(dir, 'demo.csv');
    expect((await run('convert', demo, '--to', 'csv', '-o', csv)).code).toBe(0);
    const r = await run('validate', csv);
    expect(r.code).toBe(1);
    expect(r.err[0]).toMatch(/demo\.csv: line 1, column 1: \$: this looks like a CSV table .* a log file is UTF-8 JSON text \(format "floe-ledger-log"\) or its zip archive$/);
  });

  it('escape sequences, NUL and right-to-left override in names are shown visibly; --json stays exact', async () => {
    const b = sampleBundle();
    const name = 'Leg \u001b[2J\u001b[31mred\u0000 \u202eevil\u202c';
    b.cruise = { ...b.cruise, name, vesselName: 'RV \u0007Bell' };
    const file = join(dir, 'controls.json');
    writeFileSync(file, writeLogJson(encodeLog(b)).join(''));
    const r = await run('summary', file);
    expect(r.code).toBe(0);
    const text = r.out.join('\n');
    // eslint-disable-next-line no-control-regex -- looking for raw control characters is the point
    expect(text).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f\u202a-\u202e]/);
    expect(r.out[0]).toBe('Cruise      Leg \\u001b[2J\\u001b[31mred\\u0000 \\u202eevil\\u202c (cruise-test-1)');
    expect(r.out[1]).toBe('Vessel      RV \\u0007Bell, ice class PC5');
    const json = await run('summary', file, '--json');
    expect((JSON.parse(json.out[0] as string) as { cruise: { name: string } }).cruise.name).toBe(name);
    // Refusal messages too: a file name with an escape sequence.
    const odd = join(dir, 'odd\u001b[2Jname.json');
    writeFileSync(odd, '{');
    const refused = await run('validate', odd);
    expect(refused.err.join('\n')).not.toContain('\u001b');
    expect(refused.err[0]).toContain('odd\\u001b[2Jname.json');
    expect(visible('tab\there')).toBe('tab\\u0009here');
  });

  it('summary | head -1 and a reader that is gone: no EPIPE stack trace, exit 0', () => {
    const head = sh(`$FLOE summary ${demo} 2>${dir}/head-err.txt | head -1; echo "status=\${PIPESTATUS[0]}"`);
    expect(head.stdout).toMatch(/^Cruise {6}.*\nstatus=0\n$/);
    expect(readFileSync(join(dir, 'head-err.txt'), 'utf8')).toBe('');
    // `true` never reads: every write of the command meets a closed pipe.
    const gone = sh(`$FLOE summary ${demo} 2>${dir}/gone-err.txt | true; echo "status=\${PIPESTATUS[0]}"`);
    expect(gone.stdout).toBe('status=0\n');
    expect(readFileSync(join(dir, 'gone-err.txt'), 'utf8')).toBe('');
  });
});

import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { runCli } from '../../src/cli/main.ts';
import type { CliIO } from '../../src/cli/command.ts';

const root = fileURLToPath(new URL('../..', import.meta.url));

async function run(...argv: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIO = { stdout: (l) => out.push(l), stderr: (l) => err.push(l) };
  const code = await runCli(argv, io);
  return { code, stdout: out.join('\n'), stderr: err.join('\n'), lastLine: out.at(-1) ?? '' };
}

describe('polaris command (IMO MSC.1/Circ.1519)', () => {
  it('PC5, 6/10 thick FY + 3/10 second-year: RIO 6x0 + 3x(-1) + 1x3 = 0, normal (Table 1.3, 1.1)', async () => {
    const r = await run('polaris', '--class', 'PC5', '--ice', '6:thick-first-year,3:second-year');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('RIO 0: normal operation');
    expect(r.stdout).toMatch(/1\/10\s+Ice free\s+RIV\s+3/);
    expect(r.stdout).toContain('Polar Code');
  });

  it('--json prints an object with rio and outcome on the last line', async () => {
    // PC7: 5 x (-1) + 4 x (-2) + 1 x 3 = -10, elevated, 3 kn (Tables 1.3, 1.1, 1.2).
    const r = await run('polaris', '--class', 'PC7', '--ice', '5:medium-first-year,4:thick-first-year', '--json');
    expect(r.code).toBe(0);
    const obj = JSON.parse(r.lastLine) as { rio: number; outcome: string; speedLimitKn: number; regime: unknown[] };
    expect(obj).toMatchObject({ rio: -10, outcome: 'elevated', speedLimitKn: 3 });
    expect(obj.regime).toHaveLength(3);
  });

  it('below PC7 there is no elevated band: IA, 9/10 medium FY = -15, special', async () => {
    const r = await run('polaris', '--class', 'ia', '--ice', '9:medium-first-year', '--json');
    expect(JSON.parse(r.lastLine)).toMatchObject({ iceClass: 'IA', rio: -15, outcome: 'special', speedLimitKn: null });
  });

  it('all ice free gives 10 x 3 = 30; decay-confirmed raises PC6 thick FY from -1 to 0', async () => {
    expect(JSON.parse((await run('polaris', '--class', 'none', '--ice', '0:new', '--json')).lastLine).rio).toBe(30);
    const d = await run('polaris', '--class', 'PC6', '--ice', '10:thick-first-year', '--json', '--decay-confirmed');
    expect(JSON.parse(d.lastLine)).toMatchObject({ rio: 0, outcome: 'normal', decayConfirmed: true });
  });

  it.each([
    [['--class', 'PC8', '--ice', '1:new'], 'unknown ice class "PC8"'],
    [['--class', 'PC5', '--ice', '3:thick'], 'unknown ice type "thick" in "3:thick"'],
    [['--class', 'PC5', '--ice', '6:thick-first-year,5:new'], 'add up to 11 tenths, more than 10'],
    [['--class', 'PC5', '--ice', '-1:new'], 'share -1 in "-1:new" is negative'],
    [['--class', 'PC5', '--ice', '2:new,-3:grey'], 'share -3 in "-3:grey" is negative'],
    [['--class', 'PC5', '--ice', '11:new'], 'more than 10 tenths'],
    [['--class', 'PC5', '--ice', '1.5:new'], 'not a whole number of tenths'],
    [['--class', 'PC5', '--ice', 'x:new'], 'share "x" in "x:new" is not a number'],
    [['--class', 'PC5', '--ice', '6thick-first-year'], 'must be <tenths>:<ice type>'],
    [['--class', 'PC5', '--ice', '1:new,2:new'], 'given twice'],
    [['--ice', '1:new'], 'missing --class'],
    [['--class', 'PC5'], 'missing --ice'],
    [['--class', 'PC5', '--ice', '1:new', '--speed', '3'], "Unknown option '--speed'"],
  ])('exits 2 for %j naming the bad part', async (args, msg) => {
    const r = await run('polaris', ...args);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(msg);
    expect(r.stdout).toBe('');
  });
});

// IMO MSC.1/Circ.1519 Table 1.3 names its rows "PC 1" ... "PC 7", "IA Super", "IA", "IB", "IC" and
// "Not ice-strengthened"; the Finnish-Swedish rules write "1A Super", "1A", "1B", "1C" (from
// memory). Any of these, in any case and with or without spaces and hyphens, names the class.
describe('--class takes the circular\'s spellings', () => {
  it.each([
    ['IA Super', 'IA-Super'], ['ia super', 'IA-Super'], ['IA-Super', 'IA-Super'], ['iasuper', 'IA-Super'], ['1A Super', 'IA-Super'],
    ['PC 5', 'PC5'], ['pc5', 'PC5'], ['Pc-5', 'PC5'], [' PC 1 ', 'PC1'], ['PC7', 'PC7'],
    ['IA', 'IA'], ['1A', 'IA'], ['ib', 'IB'], ['I C', 'IC'],
    ['Not ice-strengthened', 'none'], ['NOT ICE STRENGTHENED', 'none'], ['none', 'none'],
  ])('"%s" is %s', async (typed, key) => {
    // 10/10 ice free is RIO 30 for every class (Table 1.3, first column all 3).
    const r = await run('polaris', '--class', typed, '--ice', '0:new', '--json');
    expect(r.code, r.stderr).toBe(0);
    expect(JSON.parse(r.lastLine)).toMatchObject({ iceClass: key, rio: 30 });
  });

  it('IA Super as typed from the circular gives its own row: 10/10 thick FY = 10 x (-2) = -20, special', async () => {
    const r = await run('polaris', '--class', 'IA Super', '--ice', '10:thick-first-year', '--json');
    expect(JSON.parse(r.lastLine)).toMatchObject({ iceClass: 'IA-Super', rio: -20, outcome: 'special' });
  });

  it.each(['PC 8', 'IA Ultra', 'ice class', ''])('refuses "%s", listing the spellings', async (typed) => {
    const r = await run('polaris', '--class', typed, '--ice', '0:new');
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('unknown ice class');
    expect(r.stderr).toContain('IA Super');
  });
});

describe('dispatcher', () => {
  it('lists commands, prints help, rejects unknown commands', async () => {
    expect((await run()).code).toBe(2);
    const help = await run('help');
    expect(help.code).toBe(0);
    expect(help.stdout).toContain('polaris');
    expect((await run('polaris', '--help')).stdout).toContain('--decay-confirmed');
    expect((await run('help', 'polaris')).stdout).toContain('--class');
    const bad = await run('frobnicate');
    expect(bad.code).toBe(2);
    expect(bad.stderr).toContain('unknown command "frobnicate"');
  });
});

describe('the program, spawned', () => {
  const cli = (...args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/main.ts', ...args], { cwd: root, encoding: 'utf8', timeout: 60_000 });

  it('prints JSON and exits 0', () => {
    const p = cli('polaris', '--class', 'PC5', '--ice', '6:thick-first-year,3:second-year', '--json');
    expect(p.status, p.stderr).toBe(0);
    const last = p.stdout.trim().split('\n').at(-1) ?? '';
    expect(JSON.parse(last)).toMatchObject({ rio: 0, outcome: 'normal' });
  });

  it('exits 2 with the message on stderr', () => {
    const p = cli('polaris', '--class', 'PC5', '--ice', '6:thick-first-year,5:second-year');
    expect(p.status).toBe(2);
    expect(p.stderr).toContain('add up to 11 tenths');
  });
});

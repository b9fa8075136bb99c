// `summary FILE [--json] [--chart F] [--grid G]`: the cruise statistics of a log file, and with
// ice charts or grids, how well the observations agree with them.
import { iceInfoReport, type IceInfoReport } from '../../domain/collocation/index.ts';
import { summarise, summaryLines } from '../../format/summary.ts';
import { parseOptions } from '../args.ts';
import { EXIT_FAILURE, EXIT_OK, UsageError, type CliIO, type Command } from '../command.ts';
import { collocateLoaded, ICEINFO_OPTIONS, ICEINFO_USAGE, loadIceInfo } from '../iceInfoFiles.ts';
import { loadLog, printProblems } from '../logFiles.ts';
import { visible } from '../terminalText.ts';

const usage = `Usage: npm run cli -- summary FILE [--json] [--chart FILE] [--grid FILE] [options]

Prints the cruise statistics of a log file: observations, time span, observers, distance along
the track (WGS 84 geodesic), mean total concentration, stages seen, quality-control findings.
With an ice chart or a concentration grid, also the agreement of the observed total
concentration with them (observed minus product, tenths: count, mean, RMS, share within 1/10
and 2/10, by ice regime and by observer, the largest differences), with its cautions.
Control characters in names (escape sequences, NUL, right-to-left overrides) are shown as \\u
escapes; --json gives the exact text.

  --json   print one JSON object instead (the agreement under "iceInfo")
${ICEINFO_USAGE}`;

const fmt = (x: number | null, d = 2) => (x === null ? '-' : x.toFixed(d));

function agreementLines(r: IceInfoReport): string[] {
  const out: string[] = ['', 'Agreement with ice information (observed minus product, tenths)'];
  for (const p of r.products) out.push(`  ${p.kind} ${p.sourceName}, valid ${p.time}${p.resolutionKm === null ? '' : `, ${p.resolutionKm} km cells`}`);
  for (const [label, a] of [['chart', r.chart], [`grid (${r.gridMethod})`, r.grid]] as const) {
    const f = a.overall;
    out.push(`  ${label}: ${f.count} pairs, mean ${fmt(f.meanDifference)}, RMS ${fmt(f.rmsDifference)}, within 1/10 ${fmt(f.within1Share === null ? null : f.within1Share * 100, 0)} %, within 2/10 ${fmt(f.within2Share === null ? null : f.within2Share * 100, 0)} %`);
  }
  for (const c of r.cautions) out.push(`  Caution: ${c}`);
  return out;
}

export const summaryCommand: Command = {
  name: 'summary',
  summary: 'cruise statistics of a log file (and agreement with ice charts and grids)',
  usage,
  async run(args: string[], io: CliIO): Promise<number> {
    const { values, positionals } = parseOptions(args, { json: { type: 'boolean' }, ...ICEINFO_OPTIONS }, true);
    if (positionals.length !== 1) throw new UsageError('give exactly one FILE');
    const log = loadLog(positionals[0] as string);
    if (!log.ok) {
      printProblems(io, log);
      return EXIT_FAILURE;
    }
    const s = summarise(log.bundle);
    let report: IceInfoReport | undefined;
    if (values.chart !== undefined || values.grid !== undefined) {
      const info = await loadIceInfo(values, io);
      if (!info) return EXIT_FAILURE;
      report = iceInfoReport(log.bundle.observations, collocateLoaded(log.bundle.observations, info), info.products, info.limits, info.method);
    }
    if (values.json) io.stdout(JSON.stringify(report ? { ...s, iceInfo: report } : s));
    else for (const line of [...summaryLines(s), ...(report ? agreementLines(report) : [])]) io.stdout(visible(line));
    return EXIT_OK;
  },
};

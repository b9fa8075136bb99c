// The observations that disagree most with an ice chart or a satellite grid, as entries of the
// Review's findings list: a kind of our own, one code per product, a note rather than a fault (the
// observer may well be right: the product is hours old and coarse). The threshold is the outer
// figure of the agreement table: more than 2/10 apart.
import type { Observation } from '../model.ts';
import { reviewFor, type ReviewFinding } from '../stats/findings.ts';
import type { AgreementPair } from './agreement.ts';
import type { Collocation } from './collocate.ts';
import type { IceInfoReport } from './report.ts';

export const DISAGREEMENT_CODES = {
  'chart-disagreement': { summary: 'Observed total concentration more than 2/10 from the ice chart' },
  'grid-disagreement': { summary: 'Observed total concentration more than 2/10 from the satellite grid' },
} as const;

export type DisagreementCode = keyof typeof DISAGREEMENT_CODES;

/** Differences beyond this many tenths (either sign) become findings. */
export const DISAGREEMENT_TENTHS = 2;
// Grid values are fractions of a tenth; a difference of exactly 2.0 is not beyond 2/10.
const EPS = 1e-9;

const signed = (d: number) => `${d > 0 ? '+' : ''}${d.toFixed(1)}`;

function message(p: AgreementPair, c: Collocation | undefined, kind: 'chart' | 'grid', gridMethod: string): string {
  if (kind === 'chart') {
    const ch = c?.chart;
    return `Observed ${p.observed}/10, chart "${ch?.sourceName ?? '?'}" (valid ${ch?.chartTime ?? '?'}) CT ${ch?.ctCode ?? '?'}, read as ${p.product}/10: difference ${signed(p.difference)} tenths.`;
  }
  const g = c?.grid;
  return `Observed ${p.observed}/10, grid "${g?.sourceName ?? '?'}" (valid ${g?.gridTime ?? '?'}) ${Math.round(p.product * 100) / 10} % (${gridMethod}): difference ${signed(p.difference)} tenths.`;
}

/**
 * Findings for the pairs among the report's largest differences that lie more than 2/10 apart,
 * largest first within each product; reviews recorded on the observation are attached as for
 * any other finding (matched by code and path).
 */
export function disagreementFindings(
  report: Pick<IceInfoReport, 'chart' | 'grid' | 'gridMethod'>,
  collocation: ReadonlyMap<string, Collocation>,
  observations: ReadonlyMap<string, Pick<Observation, 'reviews'>>,
): ReviewFinding[] {
  const out: ReviewFinding[] = [];
  for (const [kind, a] of [['chart', report.chart], ['grid', report.grid]] as const) {
    const code: DisagreementCode = kind === 'chart' ? 'chart-disagreement' : 'grid-disagreement';
    for (const p of a.largest) {
      if (Math.abs(p.difference) <= DISAGREEMENT_TENTHS + EPS) continue;
      const f = { severity: 'info' as const, code, path: 'totalConcentration', message: message(p, collocation.get(p.observationId), kind, report.gridMethod) };
      const obs = observations.get(p.observationId);
      out.push({ ...f, observationId: p.observationId, time: p.time, observerId: p.observerId, scope: 'observation', key: `${p.observationId}|${code}|${f.path}`, review: obs ? reviewFor(obs, f) : null });
    }
  }
  return out;
}

/** The rule findings and the disagreement findings in one list, in time order (stable within a time). */
export function withDisagreements(findings: readonly ReviewFinding[], extra: readonly ReviewFinding[]): ReviewFinding[] {
  if (extra.length === 0) return [...findings];
  return [...findings, ...extra].sort((a, b) => (a.time < b.time ? -1 : a.time > b.time ? 1 : 0));
}

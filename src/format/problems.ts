// What a rejected file reports: each problem names its place (a JSON path such as
// `$.observations[3].time`, and a line and column where known) and the reason.
import { MAX_LISTED_PROBLEMS } from './limits';

export interface Problem {
  /** JSON path into the document, `$` for the whole file. */
  path: string;
  /** 1-based line and column in the file text, where the problem could be located. */
  line?: number;
  column?: number;
  message: string;
}

export interface ProblemReport {
  /** The first problems, in file order where known. */
  listed: Problem[];
  /** How many further problems were found but not listed. */
  more: number;
}

export function report(problems: Problem[], max = MAX_LISTED_PROBLEMS): ProblemReport {
  return { listed: problems.slice(0, max), more: Math.max(0, problems.length - max) };
}

/** One line per problem: `line 12, column 5: $.observations[0].time: must be ...`. */
export function formatProblem(p: Problem): string {
  const where = p.line !== undefined ? `line ${p.line}${p.column !== undefined ? `, column ${p.column}` : ''}: ` : '';
  return `${where}${p.path}: ${p.message}`;
}

export function formatReport(r: ProblemReport): string[] {
  const lines = r.listed.map(formatProblem);
  if (r.more > 0) lines.push(`... and ${r.more} more problem${r.more === 1 ? '' : 's'}`);
  return lines;
}

/** A JSON Pointer (`/observations/3/time`) as a JSON path (`$.observations[3].time`). */
export function pointerToPath(pointer: string): string {
  if (pointer === '') return '$';
  let out = '$';
  for (const raw of pointer.slice(1).split('/')) {
    const seg = raw.replace(/~1/g, '/').replace(/~0/g, '~');
    if (/^(0|[1-9]\d*)$/.test(seg)) out += `[${seg}]`;
    else if (/^[A-Za-z_$][\w$]*$/.test(seg)) out += `.${seg}`;
    else out += `[${JSON.stringify(seg)}]`;
  }
  return out;
}

/** Thrown by decoding steps; carries the problems so callers can list them. */
export class RejectedFile extends Error {
  readonly problems: Problem[];
  constructor(problems: Problem[]) {
    super(problems.length === 0 ? 'file rejected' : formatReport(report(problems)).join('\n'));
    this.name = 'RejectedFile';
    this.problems = problems;
  }
}

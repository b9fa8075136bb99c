// The import's stages and how much of the progress bar each one takes.
import type { ApplyResult, ImportSummary } from '../../db';
import type { ProblemReport } from '../../format/problems';
import type { ReadStage } from '../../format/read';

/** `pieces`: read and checked piece by piece (the usual way); `apply`: written into the store. */
export type ParseStage = 'read' | 'pieces' | 'apply' | ReadStage;

/** What the preview found: the counts of what an apply would write, or the file's problems. */
export type PreviewOutcome = { ok: true; fileName: string; summary: ImportSummary } | { ok: false; fileName: string; problems: ProblemReport };

/** A file to preview (a new import; the worker forgets any earlier one), or the apply of the last preview. */
export type WorkerRequest = { type?: 'preview'; file: Blob; fileName: string } | { type: 'apply' };
export type WorkerMessage =
  | { type: 'progress'; stage: ParseStage; fraction: number }
  | { type: 'done'; result: PreviewOutcome }
  | { type: 'applied'; result: ApplyResult }
  /** `stale`: the store or the file changed since the preview (nothing was written). */
  | { type: 'error'; message: string; stale?: boolean };

/** Share of the bar each stage takes, in order. */
const STAGE_SPAN: Record<ParseStage, [number, number]> = {
  pieces: [0, 1],
  apply: [0, 1],
  read: [0, 0.35],
  scan: [0.35, 0.45],
  parse: [0.45, 0.65],
  schema: [0.65, 0.85],
  check: [0.85, 0.9],
  rules: [0.9, 1],
};

export function overallProgress(stage: ParseStage, fraction: number): number {
  const [a, b] = STAGE_SPAN[stage];
  return a + (b - a) * Math.min(1, Math.max(0, fraction));
}


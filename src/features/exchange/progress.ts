// The import's stages and how much of the progress bar each one takes.
import type { ProblemReport } from '../../format/problems';
import type { ReadStage, ReadWarning } from '../../format/read';
import type { LogBundle, PhotoBytes } from '../../format/types';

export type ParseStage = 'read' | ReadStage;

export type ParsedFile =
  | { ok: true; fileName: string; bundle: LogBundle; photos: PhotoBytes; fromVersion: number; warnings: ReadWarning[] }
  | { ok: false; fileName: string; problems: ProblemReport };

export type WorkerRequest = { file: Blob; fileName: string };
export type WorkerMessage = { type: 'progress'; stage: ParseStage; fraction: number } | { type: 'done'; result: ParsedFile } | { type: 'error'; message: string };

/** Share of the bar each stage takes, in order. */
const STAGE_SPAN: Record<ParseStage, [number, number]> = {
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


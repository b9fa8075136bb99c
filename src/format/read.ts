// Reading a log file: limits, a structural scan, JSON.parse, the schema of the file's version,
// migration to the current version, the checks a schema cannot make, then the domain rules.
// Any problem rejects the whole file; nothing is returned half-read.
import type { Cruise, Finding, Observation } from '../domain/model';
import { validateObservation } from '../domain/rules';
import { decodeLog } from './decode';
import type { SchemaError } from './generated/validate-log-1.js';
import { LIMITS } from './limits';
import { locatePointer } from './locate';
import { MIGRATIONS, OLDEST_VERSION, VALIDATORS, migrateToCurrent } from './migrate';
import { lineColumn, scanText } from './scan';
import { findSyntaxError } from './syntax';
import { otherFormat } from './text';
import { MAX_LISTED_PROBLEMS } from './limits';
import { pointerToPath, report, type Problem, type ProblemReport } from './problems';
import { CURRENT_VERSION, FORMAT_NAME, type LogBundle } from './types';

export type RuleCheck = (o: Observation, cruise: Cruise) => Finding[];

export interface ReadOptions {
  /**
   * Domain rules run on every saved version; findings of severity `error` reject the file.
   * Defaults to the domain's validateObservation; null skips them (format-only checks).
   */
  rules?: RuleCheck | null;
  onProgress?: (stage: ReadStage, fraction: number) => void;
  /** For tests: smaller limits. */
  limits?: Partial<Record<keyof typeof LIMITS, number>>;
}

export type ReadStage = 'scan' | 'parse' | 'schema' | 'check' | 'rules';

export interface ReadWarning {
  path: string;
  message: string;
}

export type ReadResult =
  | { ok: true; bundle: LogBundle; fromVersion: number; warnings: ReadWarning[]; archivePaths: Map<string, string> }
  | { ok: false; problems: ProblemReport };

/** `uncounted`: further problems found but not kept (the validators keep MAX_SCHEMA_ERRORS). */
function reject(problems: Problem[], uncounted = 0): ReadResult {
  const r = report(problems);
  return { ok: false, problems: { ...r, more: r.more + uncounted } };
}

const hasOwn = (o: object, k: string) => Object.prototype.hasOwnProperty.call(o, k);

function valueAt(data: unknown, pointer: string): unknown {
  if (pointer === '') return data;
  let cur: unknown = data;
  for (const raw of pointer.slice(1).split('/')) {
    const seg = raw.replace(/~1/g, '/').replace(/~0/g, '~');
    if (cur === null || typeof cur !== 'object' || !hasOwn(cur, seg)) return undefined;
    cur = (cur as Record<string, unknown>)[seg];
  }
  return cur;
}

function show(v: unknown): string {
  const s = typeof v === 'string' ? JSON.stringify(v) : v === undefined ? 'nothing' : Array.isArray(v) ? 'an array' : v !== null && typeof v === 'object' ? 'an object' : String(v);
  return s.length > 60 ? `${s.slice(0, 57)}...` : s;
}

const TYPE_WORDS: Record<string, string> = {
  string: 'a string',
  number: 'a number',
  integer: 'a whole number',
  boolean: 'true or false',
  object: 'an object',
  array: 'an array',
  null: 'null',
};

function describeType(t: unknown): string {
  const list = Array.isArray(t) ? t : [t];
  return list.map((x) => TYPE_WORDS[String(x)] ?? String(x)).join(' or ');
}

/** One schema error as a problem with a JSON path and a plain reason. */
export function schemaProblem(e: SchemaError, data: unknown): Problem {
  const path = pointerToPath(e.instancePath);
  const value = valueAt(data, e.instancePath);
  const p = e.params;
  switch (e.keyword) {
    case 'required':
      return { path: `${path}.${String(p.missingProperty)}`, message: 'is required but missing' };
    case 'additionalProperties':
      return { path, message: `has a field ${JSON.stringify(String(p.additionalProperty))} that this format does not have` };
    case 'type':
      return { path, message: `must be ${describeType(p.type)}, not ${show(value)}` };
    case 'enum': {
      const allowed = (p.allowedValues as unknown[]) ?? [];
      const list = allowed.slice(0, 8).map((x) => JSON.stringify(x)).join(', ');
      return { path, message: `${show(value)} is not one of ${list}${allowed.length > 8 ? `, ... (${allowed.length} values)` : ''}` };
    }
    case 'const':
      return { path, message: `must be ${JSON.stringify(p.allowedValue)}, not ${show(value)}` };
    case 'minimum':
    case 'exclusiveMinimum':
      return { path, message: `${show(value)} is below the smallest allowed value ${String(p.limit)}` };
    case 'maximum':
    case 'exclusiveMaximum':
      return { path, message: `${show(value)} is above the largest allowed value ${String(p.limit)}` };
    case 'maxItems':
      return { path, message: `has more than ${String(p.limit)} items` };
    case 'minItems':
      return { path, message: `has fewer than ${String(p.limit)} items` };
    case 'maxLength':
      return { path, message: `is longer than ${String(p.limit)} characters` };
    case 'minLength':
      return { path, message: 'must not be empty' };
    case 'items':
    case 'unevaluatedItems':
      return { path, message: 'has more items than the format allows' };
    case 'pattern': {
      const pattern = String(p.pattern);
      if (pattern.includes('T([01][0-9]')) return { path, message: `${show(value)} is not a UTC time in ISO 8601 form such as 2026-03-04T05:00:00Z` };
      if (pattern.startsWith('^[A-Za-z0-9][A-Za-z0-9._:@-]')) return { path, message: `${show(value)} is not an id (letters, digits and . _ : @ - only)` };
      return { path, message: `${show(value)} does not have the expected form` };
    }
    default:
      return { path, message: e.message ?? `fails the "${e.keyword}" rule of the schema` };
  }
}

function locate(text: string, problems: Problem[], pointers: string[]) {
  for (let i = 0; i < Math.min(problems.length, MAX_LISTED_PROBLEMS); i++) {
    const ptr = pointers[i];
    if (ptr === undefined) continue;
    const at = lineColumn(text, locatePointer(text, ptr));
    (problems[i] as Problem).line = at.line;
    (problems[i] as Problem).column = at.column;
  }
}

/** Converts a JSON path back to the pointer the locator understands (`$.a[0]` -> `/a/0`). */
function pathToPointer(path: string): string {
  let out = '';
  const re = /\.([A-Za-z_$][\w$]*)|\[(\d+)\]|\[("(?:[^"\\]|\\.)*")\]/g;
  for (let m = re.exec(path); m; m = re.exec(path)) {
    const seg = m[1] ?? m[2] ?? (JSON.parse(m[3] as string) as string);
    out += '/' + seg.replace(/~/g, '~0').replace(/\//g, '~1');
  }
  return out;
}

function parseError(text: string, err: unknown): Problem {
  const found = findSyntaxError(text);
  if (found) return { path: '$', ...lineColumn(text, found.offset), message: `not valid JSON: ${found.reason}` };
  return { path: '$', message: `not valid JSON (${err instanceof Error ? err.message : String(err)})` };
}

/** The domain rules on one saved version at `where` (a JSON path): errors to `problems`, the rest to `warnings`. */
export function ruleFindings(rules: RuleCheck, o: Observation, cruise: Cruise, where: string, problems: Problem[], warnings: ReadWarning[]): void {
  for (const f of rules(o, cruise)) {
    const path = `${where}${f.path ? `.${f.path.replace(/\.(\d+)(?=\.|$)/g, '[$1]')}` : ''}`;
    if (f.severity === 'error') problems.push({ path, message: `${f.message} (rule ${f.code})` });
    else warnings.push({ path, message: `${f.message} (rule ${f.code})` });
  }
}

/** Photo ids that name no photo of the file: `refs` are [observation index, its photo ids]. */
export function photoWarnings(refs: Iterable<readonly [number, readonly string[]]>, photoIds: ReadonlySet<string>, warnings: ReadWarning[]): void {
  for (const [i, ids] of refs)
    ids.forEach((id, k) => {
      if (!photoIds.has(id)) warnings.push({ path: `$.observations[${i}].photoIds[${k}]`, message: `names photo ${JSON.stringify(id)}, which is not in this file` });
    });
}

/** Reads log text of any supported version. `byteLength` is the file's size, when known. */
export function readLogText(input: string, opts: ReadOptions = {}, byteLength?: number): ReadResult {
  const limits = { ...LIMITS, ...opts.limits };
  const size = byteLength ?? input.length;
  if (size > limits.maxFileBytes) {
    return reject([{ path: '$', message: `the file has ${size} bytes, more than the limit of ${limits.maxFileBytes}` }]);
  }
  const text = input.charCodeAt(0) === 0xfeff ? input.slice(1) : input;
  if (text.trim() === '') return reject([{ path: '$', message: 'the file is empty' }]);

  const scanned = scanText(text, limits, (f) => opts.onProgress?.('scan', f));
  if (scanned) return reject([scanned]);

  opts.onProgress?.('parse', 0);
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (err) {
    const other = otherFormat(text);
    return reject([other ? { path: '$', line: 1, column: 1, message: other } : parseError(text, err)]);
  }
  opts.onProgress?.('parse', 1);

  if (data === null || typeof data !== 'object' || Array.isArray(data)) {
    return reject([{ path: '$', line: 1, column: 1, message: 'a log file is a JSON object; this is not' }]);
  }
  const doc = data as Record<string, unknown>;
  if (!hasOwn(doc, 'format') || doc.format !== FORMAT_NAME) {
    return reject([{ path: '$.format', message: `must be "${FORMAT_NAME}": ${otherFormat(text, doc) ?? 'this is not a Floe Ledger log file'}` }]);
  }
  const version = doc.formatVersion;
  if (typeof version !== 'number' || !Number.isInteger(version) || version < OLDEST_VERSION) {
    return reject([{ path: '$.formatVersion', message: `must be a whole number from ${OLDEST_VERSION} to ${CURRENT_VERSION}, not ${show(version)}` }]);
  }
  if (version > CURRENT_VERSION) {
    return reject([{ path: '$.formatVersion', message: `version ${version} was written by a newer Floe Ledger; this one reads versions ${OLDEST_VERSION} to ${CURRENT_VERSION}` }]);
  }
  const validate = VALIDATORS[version];
  if (!validate || (version < CURRENT_VERSION && !MIGRATIONS[version])) {
    return reject([{ path: '$.formatVersion', message: `version ${version} cannot be read` }]);
  }

  opts.onProgress?.('schema', 0);
  if (!validate(data)) {
    const errors = validate.errors ?? [];
    const problems = errors.map((e) => schemaProblem(e, data));
    locate(text, problems, problems.map((p) => pathToPointer(p.path)));
    return reject(problems, validate.droppedErrors ?? 0);
  }
  opts.onProgress?.('schema', 1);

  let current = data;
  if (version < CURRENT_VERSION) {
    current = migrateToCurrent(data, version);
    const again = VALIDATORS[CURRENT_VERSION] as (typeof VALIDATORS)[number];
    if (!again(current)) {
      // A migration that produces an invalid file is a bug in this program, not in the file.
      const problems = (again.errors ?? []).map((e) => schemaProblem(e, current));
      return reject(problems.map((p) => ({ ...p, message: `after migrating from version ${version}: ${p.message}` })), again.droppedErrors ?? 0);
    }
  }

  opts.onProgress?.('check', 0);
  const problems: Problem[] = [];
  const archivePaths = new Map<string, string>();
  const bundle = decodeLog(current as Parameters<typeof decodeLog>[0], problems, archivePaths);
  if (problems.length > 0) {
    if (version === CURRENT_VERSION) locate(text, problems, problems.map((p) => pathToPointer(p.path)));
    return reject(problems);
  }

  const warnings: ReadWarning[] = [];
  // A photo id with no photo in the file: the image was left out (a JSON log of a cruise whose
  // photos were never exported) or the id is wrong. Imported, but said.
  photoWarnings(
    bundle.observations.map((o, i) => [i, o.photoIds] as const),
    new Set(bundle.photos.map((p) => p.id)),
    warnings,
  );
  const rules = opts.rules === undefined ? validateObservation : opts.rules;
  if (rules) {
    opts.onProgress?.('rules', 0);
    const index = new Map<string, number>();
    bundle.observations.forEach((o, i) => index.set(o.id, i));
    const ruleProblems: Problem[] = [];
    const check = (o: Observation, where: string) => ruleFindings(rules, o, bundle.cruise, where, ruleProblems, warnings);
    bundle.observations.forEach((o, i) => check(o, `$.observations[${i}]`));
    const historyCount = new Map<string, number>();
    for (const h of bundle.history) {
      const i = index.get(h.id) ?? 0;
      const j = historyCount.get(h.id) ?? 0;
      historyCount.set(h.id, j + 1);
      check(h, `$.observations[${i}].history[${j}]`);
    }
    if (ruleProblems.length > 0) {
      if (version === CURRENT_VERSION) locate(text, ruleProblems, ruleProblems.map((p) => pathToPointer(p.path)));
      return reject(ruleProblems);
    }
    opts.onProgress?.('rules', 1);
  }
  return { ok: true, bundle, fromVersion: version, warnings, archivePaths };
}

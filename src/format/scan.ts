// A single pass over the file text before JSON.parse: enforces nesting depth, string length and
// array length limits, spots keys that could reach an object's prototype and keys given twice in
// one object (JSON.parse keeps the last, other readers the first: a file must not mean two
// things), and reports a truncated file with its line. JSON.parse itself would happily build a 5 GB array or recurse
// until the stack overflows; this pass refuses such files while they are still only text.
import { LIMITS } from './limits';
import type { Problem } from './problems';

export interface ScanLimits {
  maxDepth: number;
  maxStringLength: number;
  maxArrayLength: number;
}

const DANGEROUS_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

/** 1-based line and column of a character offset. */
export function lineColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let lastBreak = -1;
  const end = Math.min(offset, text.length);
  for (let i = text.indexOf('\n'); i !== -1 && i < end; i = text.indexOf('\n', i + 1)) {
    line++;
    lastBreak = i;
  }
  return { line, column: end - lastBreak };
}

function at(text: string, offset: number, path: string, message: string): Problem {
  return { path, ...lineColumn(text, offset), message };
}

/**
 * Returns the first structural problem, or null. It does not check JSON syntax in full (that is
 * JSON.parse's job) but every limit it enforces holds for any text JSON.parse accepts.
 */
export function scanText(text: string, limits: ScanLimits = LIMITS, onProgress?: (fraction: number) => void): Problem | null {
  const maxDepth = limits.maxDepth;
  const isArray = new Uint8Array(maxDepth + 1);
  const commas = new Float64Array(maxDepth + 1);
  // Per open object: whether the next string is a key, and the keys seen (made on the first key).
  const expectKey = new Uint8Array(maxDepth + 1);
  const keys: (Set<string> | null)[] = new Array<Set<string> | null>(maxDepth + 1).fill(null);
  let depth = 0;
  const n = text.length;
  const progressStep = 1 << 22;
  let nextProgress = progressStep;
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if (i >= nextProgress) {
      onProgress?.(i / n);
      nextProgress += progressStep;
    }
    if (c === 34 /* " */) {
      const start = i;
      i++;
      for (; i < n; i++) {
        const d = text.charCodeAt(i);
        if (d === 92 /* \ */) i++;
        else if (d === 34) break;
      }
      if (i >= n) return at(text, start, '$', 'the file ends inside a string: it is truncated or not JSON');
      const len = i - start - 1;
      if (len > limits.maxStringLength) {
        return at(text, start, '$', `a string of ${len} characters is longer than the limit of ${limits.maxStringLength}`);
      }
      if (depth > 0 && isArray[depth] === 0 && (len === 9 || len === 11)) {
        const key = text.slice(start + 1, i);
        if (DANGEROUS_KEYS.has(key)) {
          let j = i + 1;
          while (j < n && (text.charCodeAt(j) === 32 || text.charCodeAt(j) === 10 || text.charCodeAt(j) === 13 || text.charCodeAt(j) === 9)) j++;
          if (text.charCodeAt(j) === 58 /* : */) return at(text, start, '$', `the key "${key}" is not allowed anywhere in a log file`);
        }
      }
      if (depth > 0 && isArray[depth] === 0 && expectKey[depth] === 1) {
        expectKey[depth] = 0;
        const raw = text.slice(start + 1, i);
        let key = raw;
        if (raw.includes('\\')) {
          try {
            key = JSON.parse(`"${raw}"`) as string;
          } catch {
            continue; // a bad escape: JSON.parse reports it with its place
          }
        }
        const seen = keys[depth] ?? (keys[depth] = new Set<string>());
        if (seen.has(key)) return at(text, start, '$', `the key ${JSON.stringify(key)} appears twice in one object`);
        seen.add(key);
      }
      continue;
    }
    if (c === 91 /* [ */ || c === 123 /* { */) {
      depth++;
      if (depth > maxDepth) return at(text, i, '$', `nesting deeper than ${maxDepth} levels`);
      isArray[depth] = c === 91 ? 1 : 0;
      commas[depth] = 0;
      expectKey[depth] = c === 123 ? 1 : 0;
      keys[depth] = null;
    } else if (c === 93 /* ] */ || c === 125 /* } */) {
      if (depth === 0) return at(text, i, '$', `unexpected "${String.fromCharCode(c)}"`);
      depth--;
    } else if (c === 44 /* , */) {
      if (depth > 0 && isArray[depth] === 0) expectKey[depth] = 1;
      if (depth > 0 && isArray[depth] === 1) {
        const count = (commas[depth] = (commas[depth] ?? 0) + 1) + 1;
        if (count > limits.maxArrayLength) return at(text, i, '$', `an array with more than ${limits.maxArrayLength} elements`);
      }
    }
  }
  if (depth > 0) return at(text, n, '$', 'the file ends before all arrays and objects are closed: it is truncated');
  onProgress?.(1);
  return null;
}

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

/** Where a scan stopped on a problem: the offset in the text and the reason. */
export interface ScanFault {
  offset: number;
  message: string;
}

/**
 * What the scanner tells a piece-by-piece reader (offsets into the text it was given):
 * `key` a member name at depth 1 or 2 (`at`: its opening quote); `open` an array or object
 * opening at depth 1-3 (`at`: the bracket) under the keys `path`; `cut` a comma at the depth of
 * a watched array after every `every` elements (see watchArray); `close` the end of a watched array (`at`: `]`).
 */
export type ScanEvent =
  | { type: 'key'; depth: number; at: number; key: string }
  | { type: 'open'; depth: number; at: number; array: boolean; path: readonly string[]; watched: boolean }
  | { type: 'cut'; at: number }
  | { type: 'close'; at: number };

/**
 * The structural scan as a machine that can be fed text in pieces: `scan(text, final)` walks
 * `text` from where it stopped, and when `final` is false it stops before a string (or a key's
 * colon) that the text does not finish, to be called again with the text extended. The
 * offsets it keeps refer to the text given; `rebase(n)` tells it the first n characters were
 * dropped. One machine serves scanText (one piece) and the piece-by-piece reader (readStream.ts).
 */
export class JsonScanner {
  /** Next offset to look at. */
  pos = 0;
  private readonly maxDepth: number;
  private readonly isArray: Uint8Array;
  private readonly commas: Float64Array;
  // Per open object: whether the next string is a key, and the keys seen (made on the first key).
  private readonly expectKey: Uint8Array;
  private readonly keys: (Set<string> | null)[];
  private readonly lastKey: string[];
  private depth = 0;
  /** Depth of the array whose elements are counted for `cut` events, and the batch size. */
  private watchDepth = -1;
  private every = 0;
  private sinceCut = 0;
  readonly events: ScanEvent[] = [];
  /**
   * Set by the reader: stop right after the `[` of a watched array (its `open` event the last
   * one), so that the reader can take the array's elements without a character scan
   * (listRuns.ts); it then hands back with resumeInList or resumeAfterList.
   */
  pauseOnWatch = false;
  /** Whether the scan stopped at a watched array's opening (pauseOnWatch). */
  paused = false;

  constructor(
    private readonly limits: ScanLimits = LIMITS,
    /** Whether to record events (the piece reader); scanText does not. */
    private readonly withEvents = false,
  ) {
    this.maxDepth = limits.maxDepth;
    this.isArray = new Uint8Array(this.maxDepth + 1);
    this.commas = new Float64Array(this.maxDepth + 1);
    this.expectKey = new Uint8Array(this.maxDepth + 1);
    this.keys = new Array<Set<string> | null>(this.maxDepth + 1).fill(null);
    this.lastKey = new Array<string>(this.maxDepth + 1).fill('');
  }

  /** Where a string not yet finished starts (-1: none), and where its scan goes on. */
  private strStart = -1;
  private strAt = 0;

  /** The first offset the caller must keep: an unfinished string's start, or the next offset. */
  get keepFrom(): number {
    return this.strStart >= 0 ? this.strStart : this.pos;
  }

  /** The first `dropped` characters of the text were dropped (no earlier than keepFrom). */
  rebase(dropped: number): void {
    this.pos -= dropped;
    if (this.strStart >= 0) {
      this.strStart -= dropped;
      this.strAt -= dropped;
    }
  }

  /** The first problem found, or null (also when it stopped early for more text). */
  scan(text: string, final: boolean, onProgress?: (offset: number) => void): ScanFault | null {
    const { limits, maxDepth, isArray, commas, expectKey, keys, lastKey, events, withEvents } = this;
    let depth = this.depth;
    const n = text.length;
    const progressStep = 1 << 22;
    let nextProgress = this.pos + progressStep;
    let i = this.pos;
    // A string the previous text did not finish: it goes on from where that text ended.
    let resume = this.strStart;
    this.strStart = -1;
    const fault = (offset: number, message: string): ScanFault => {
      this.depth = depth;
      this.pos = i;
      return { offset, message };
    };
    for (; i < n; i++) {
      const c = resume >= 0 ? 34 : text.charCodeAt(i);
      if (i >= nextProgress) {
        onProgress?.(i);
        nextProgress += progressStep;
      }
      if (c === 34 /* " */) {
        const start = resume >= 0 ? resume : i;
        i = resume >= 0 ? this.strAt : i + 1;
        resume = -1;
        for (; i < n; i++) {
          const d = text.charCodeAt(i);
          if (d === 92 /* \ */) i++;
          else if (d === 34) break;
        }
        if (i >= n) {
          if (!final) {
            if (i - start - 1 > limits.maxStringLength) return fault(start, `a string is longer than the limit of ${limits.maxStringLength} characters`);
            this.strStart = start;
            this.strAt = i;
            i = n;
            break;
          }
          return fault(start, 'the file ends inside a string: it is truncated or not JSON');
        }
        const len = i - start - 1;
        if (len > limits.maxStringLength) {
          return fault(start, `a string of ${len} characters is longer than the limit of ${limits.maxStringLength}`);
        }
        if (depth > 0 && isArray[depth] === 0 && (len === 9 || len === 11)) {
          const key = text.slice(start + 1, i);
          if (DANGEROUS_KEYS.has(key)) {
            let j = i + 1;
            while (j < n && (text.charCodeAt(j) === 32 || text.charCodeAt(j) === 10 || text.charCodeAt(j) === 13 || text.charCodeAt(j) === 9)) j++;
            if (j >= n && !final) {
              i = start;
              break;
            }
            if (text.charCodeAt(j) === 58 /* : */) return fault(start, `the key "${key}" is not allowed anywhere in a log file`);
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
          if (seen.has(key)) return fault(start, `the key ${JSON.stringify(key)} appears twice in one object`);
          seen.add(key);
          lastKey[depth] = key;
          if (withEvents && depth <= 2) events.push({ type: 'key', depth, at: start, key });
        }
        continue;
      }
      if (c === 91 /* [ */ || c === 123 /* { */) {
        depth++;
        if (depth > maxDepth) return fault(i, `nesting deeper than ${maxDepth} levels`);
        isArray[depth] = c === 91 ? 1 : 0;
        commas[depth] = 0;
        expectKey[depth] = c === 123 ? 1 : 0;
        keys[depth] = null;
        if (withEvents && depth <= 3 && (this.watchDepth < 0 || depth <= this.watchDepth)) {
          const path: string[] = [];
          for (let k = 1; k < depth; k++) path.push(isArray[k] === 1 ? '[]' : (lastKey[k] as string));
          // The reader decides at once whether to watch this array (a batch size) or not (0).
          const every = c === 91 ? (this.watchArray?.(depth, path) ?? 0) : 0;
          events.push({ type: 'open', depth, at: i, array: c === 91, path, watched: every > 0 });
          if (every > 0) {
            this.watchDepth = depth;
            this.every = every;
            this.sinceCut = 0;
            if (this.pauseOnWatch) {
              this.paused = true;
              i++;
              break;
            }
          }
        }
      } else if (c === 93 /* ] */ || c === 125 /* } */) {
        if (depth === 0) return fault(i, `unexpected "${String.fromCharCode(c)}"`);
        if (depth === this.watchDepth) {
          // A `}` here closes the array with the wrong bracket: the reader refuses it.
          events.push({ type: 'close', at: i });
          this.watchDepth = -1;
        }
        depth--;
      } else if (c === 44 /* , */) {
        if (depth > 0 && isArray[depth] === 0) expectKey[depth] = 1;
        if (depth > 0 && isArray[depth] === 1) {
          const count = (commas[depth] = (commas[depth] ?? 0) + 1) + 1;
          if (count > limits.maxArrayLength) return fault(i, `an array with more than ${limits.maxArrayLength} elements`);
          if (depth === this.watchDepth && ++this.sinceCut >= this.every) {
            this.sinceCut = 0;
            events.push({ type: 'cut', at: i });
          }
        }
      }
    }
    if (resume >= 0) this.strStart = resume;
    this.depth = depth;
    this.pos = i;
    if (this.paused) return null;
    if (final && depth > 0) return { offset: n, message: 'the file ends before all arrays and objects are closed: it is truncated' };
    return null;
  }

  /**
   * Scan the paused watched array again from `pos`, a place between its elements (just after
   * the `[` or after a comma between two elements) with `elements` before it, the last
   * `sinceCut` of them not yet handed out in a piece.
   */
  resumeInList(pos: number, elements: number, sinceCut: number): void {
    this.pos = pos;
    this.commas[this.watchDepth] = elements;
    this.sinceCut = sinceCut;
    this.paused = false;
  }

  /** Go on after the paused watched array: `pos` is its closing `]`, scanned as any other. */
  resumeAfterList(pos: number): void {
    this.pos = pos;
    this.watchDepth = -1;
    this.paused = false;
  }

  /** For an array opening at depth 1-3 under `path`: elements per `cut`, or 0 not to watch it. */
  watchArray?: (depth: number, path: readonly string[]) => number;
}

/**
 * Returns the first structural problem, or null. It does not check JSON syntax in full (that is
 * JSON.parse's job) but every limit it enforces holds for any text JSON.parse accepts.
 */
export function scanText(text: string, limits: ScanLimits = LIMITS, onProgress?: (fraction: number) => void): Problem | null {
  const n = text.length;
  const f = new JsonScanner(limits).scan(text, true, onProgress && ((offset) => onProgress(offset / n)));
  if (f) return at(text, f.offset, '$', f.message);
  onProgress?.(1);
  return null;
}

// The elements of a long list (the observations, the track's rows) taken a run at a time
// without walking every character: the character scan (scan.ts) is the largest single cost of
// reading a full-size log, twice per import. A log as this program writes it (encode.ts), and
// as most tools indent JSON, puts each element of the long lists on a line of its own, and
// JSON forbids a raw line break inside a string; so a comma that ends a line (blanks aside)
// is a candidate boundary between two elements, and JSON.parse of the text from a known
// boundary up to the candidate succeeds only if the candidate is a boundary at the list's own
// depth: cut inside a string, the string is left open; cut deeper, a bracket is left open.
//
// What the scan also guarantees is checked here on the run's text, or the run is handed back
// to the scan (`scan`), which then reads the rest of the list character by character:
//   - a string longer than the limit: no line is longer than the limit (strings never span lines);
//   - keys that reach a prototype, and keys with blanks before their colon: not in the text;
//   - a key given twice in one object: the keys of the parsed elements, counted object by
//     object, equal the key tokens of the text (a `"` followed by `:` that closes a string;
//     an ambiguous one, a string that opens with a colon, hands the run back);
//   - nesting depth and array length: a line under the string limit holds no long array, and
//     the schema that checks every run (readStream.ts) admits no nesting deeper than it names.
// A run the reader trusts (the second reading of a text whose hash it knows) skips the checks.

/** What the next run of a list gives. */
export type ListRun =
  /** Not enough text yet to find a boundary. */
  | { kind: 'more' }
  /** Elements up to a comma between elements; the next run starts at `next` (after the comma). */
  | { kind: 'run'; items: unknown[]; next: number }
  /** The list's last elements (none for an empty list); its `]` is at `close`. */
  | { kind: 'last'; items: unknown[]; close: number }
  /** The layout does not allow it: the caller scans from the same place. */
  | { kind: 'scan' };

export interface ListRunOptions {
  /** The text is the one an earlier reading checked: parse only. */
  trusted: boolean;
  maxStringLength: number;
  /** Deepest nesting allowed inside one element (deeper: handed to the scan, which names it). */
  maxDepth: number;
  /** Text the run waits for before it looks for a boundary (unless the text is complete). */
  minChars: number;
  /**
   * Text past which a run without a boundary is handed to the scan (a line longer than the
   * string limit goes to the scan anyway).
   */
  maxChars: number;
  /** Whether `from` follows a comma (an element must come, not the list's end). */
  afterComma: boolean;
}

// A line that closes the list: blanks, then `]`.
const CLOSE = /\n[ \t\r]*\]/g;
// Keys that reach a prototype, and blanks between a string and a colon (a key spelt loosely).
const SUSPECT = /"(?:__proto__|constructor|prototype)"|"[ \t\r\n]+:/;

function isBlank(c: number): boolean {
  return c === 32 || c === 9 || c === 13 || c === 10;
}

/**
 * The next run of list elements from `from`, a boundary in `text` (just after the `[`, or just
 * after a comma between elements). `final`: the text holds the rest of the file.
 */
export function nextListRun(text: string, from: number, final: boolean, o: ListRunOptions): ListRun {
  const n = text.length;
  let p = from;
  while (p < n && isBlank(text.charCodeAt(p))) p++;
  if (p >= n) return final ? { kind: 'scan' } : { kind: 'more' };
  if (text.charCodeAt(p) === 93 /* ] */) return o.afterComma ? { kind: 'scan' } : { kind: 'last', items: [], close: p };
  if (!final && n - from < o.minChars) return { kind: 'more' };
  CLOSE.lastIndex = from;
  const m = CLOSE.exec(text);
  if (m) {
    const items = runItems(text, from, m.index, o);
    return items ? { kind: 'last', items, close: m.index + m[0].length - 1 } : { kind: 'scan' };
  }
  // The last line end in the text that follows a comma.
  let tries = 64;
  for (let nl = text.lastIndexOf('\n'); nl > from && tries > 0; nl = text.lastIndexOf('\n', nl - 1), tries--) {
    let k = nl - 1;
    while (k > from && isBlank(text.charCodeAt(k))) k--;
    if (text.charCodeAt(k) !== 44 /* , */ || k <= from) continue;
    const items = runItems(text, from, k, o);
    return items ? { kind: 'run', items, next: k + 1 } : { kind: 'scan' };
  }
  return !final && n - from < o.maxChars ? { kind: 'more' } : { kind: 'scan' };
}

/** The elements of text[from, to), checked as the header says; null: hand it to the scan. */
function runItems(text: string, from: number, to: number, o: ListRunOptions): unknown[] | null {
  const run = text.slice(from, to);
  let keys = 0;
  if (!o.trusted) {
    if (SUSPECT.test(run)) return null;
    for (let a = -1, b = run.indexOf('\n'); ; a = b, b = run.indexOf('\n', b + 1)) {
      if ((b === -1 ? run.length : b) - a > o.maxStringLength) return null;
      if (b === -1) break;
    }
    keys = keyTokens(run);
    if (keys < 0) return null;
  }
  let items: unknown;
  try {
    items = JSON.parse(`[${run}]`);
  } catch {
    return null;
  }
  if (!Array.isArray(items)) return null;
  if (!o.trusted && keys > 0 && ownKeys(items, o.maxDepth + 1) !== keys) return null;
  return items;
}

/**
 * Key tokens directly followed by a colon in JSON text (that JSON.parse accepts), or -1 when
 * one `":` cannot be told from the start of a string that begins with a colon.
 */
function keyTokens(run: string): number {
  let count = 0;
  for (let p = run.indexOf('":'); p !== -1; p = run.indexOf('":', p + 2)) {
    let b = 0;
    while (p - b - 1 >= 0 && run.charCodeAt(p - b - 1) === 92 /* \ */) b++;
    // An escaped quote is inside a string; after escaped backslashes it closes the string.
    if (b % 2 === 1) continue;
    if (b === 0) {
      if (p === 0) return -1;
      const c = run.charCodeAt(p - 1);
      // An opening quote follows one of these; a closing one may too (a key ending in ":").
      if (c === 58 || c === 44 || c === 91 || c === 123 || isBlank(c)) return -1;
    }
    count++;
  }
  return count;
}

/**
 * Own keys of every object in a parsed JSON value, counted object by object; -1 when it nests
 * deeper than `depth` (the count would not be taken, so the run goes to the scan).
 */
function ownKeys(v: unknown, depth: number): number {
  if (depth <= 0) return -1;
  let n = 0;
  if (Array.isArray(v)) {
    for (const x of v) {
      if (x === null || typeof x !== 'object') continue;
      const k = ownKeys(x, depth - 1);
      if (k < 0) return -1;
      n += k;
    }
    return n;
  }
  const o = v as Record<string, unknown>;
  for (const key in o) {
    n++;
    const x = o[key];
    if (x === null || typeof x !== 'object') continue;
    const k = ownKeys(x, depth - 1);
    if (k < 0) return -1;
    n += k;
  }
  return n;
}

// Finds where in the file text the value at a JSON Pointer begins, so a schema problem can be
// reported with its line and column. Only run for the few problems that are listed, on text that
// JSON.parse has already accepted.

function skipWs(t: string, i: number): number {
  for (;;) {
    const c = t.charCodeAt(i);
    if (c === 32 || c === 10 || c === 13 || c === 9) i++;
    else return i;
  }
}

/** Index just past the string that starts at `i` (which is a quote). */
function skipString(t: string, i: number): number {
  for (i++; i < t.length; i++) {
    const c = t.charCodeAt(i);
    if (c === 92) i++;
    else if (c === 34) return i + 1;
  }
  return t.length;
}

/** Index just past the value that starts at `i`. */
function skipValue(t: string, i: number): number {
  const c = t.charCodeAt(i);
  if (c === 34) return skipString(t, i);
  if (c === 123 || c === 91) {
    let depth = 0;
    for (; i < t.length; i++) {
      const d = t.charCodeAt(i);
      if (d === 34) {
        i = skipString(t, i) - 1;
      } else if (d === 123 || d === 91) depth++;
      else if (d === 125 || d === 93) {
        depth--;
        if (depth === 0) return i + 1;
      }
    }
    return t.length;
  }
  while (i < t.length) {
    const d = t.charCodeAt(i);
    if (d === 44 || d === 125 || d === 93 || d === 32 || d === 10 || d === 13 || d === 9) return i;
    i++;
  }
  return i;
}

/** Offset where the value at `pointer` starts, or the offset of its deepest existing parent. */
export function locatePointer(text: string, pointer: string): number {
  const segments = pointer === '' ? [] : pointer.slice(1).split('/').map((s) => s.replace(/~1/g, '/').replace(/~0/g, '~'));
  let i = skipWs(text, text.charCodeAt(0) === 0xfeff ? 1 : 0);
  for (const seg of segments) {
    const c = text.charCodeAt(i);
    if (c === 123) {
      let j = skipWs(text, i + 1);
      let found = -1;
      while (j < text.length && text.charCodeAt(j) === 34) {
        const end = skipString(text, j);
        const key = JSON.parse(text.slice(j, end)) as string;
        j = skipWs(text, end);
        j = skipWs(text, j + 1); // the colon
        if (key === seg) {
          found = j;
          break;
        }
        j = skipWs(text, skipValue(text, j));
        if (text.charCodeAt(j) === 44) j = skipWs(text, j + 1);
      }
      if (found < 0) return i;
      i = found;
    } else if (c === 91) {
      const index = Number(seg);
      let j = skipWs(text, i + 1);
      for (let k = 0; k < index && j < text.length; k++) {
        j = skipWs(text, skipValue(text, j));
        if (text.charCodeAt(j) !== 44) return i;
        j = skipWs(text, j + 1);
      }
      i = j;
    } else {
      return i;
    }
  }
  return i;
}

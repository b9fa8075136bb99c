// Locates the first JSON syntax error, for the message of a file JSON.parse refused (V8's own
// message often gives no position). Only runs on that failure path, on text whose nesting the
// scan has already limited, so the recursion is shallow.

export interface SyntaxProblem {
  offset: number;
  reason: string;
}

const WS = new Set([32, 9, 10, 13]);

export function findSyntaxError(t: string): SyntaxProblem | null {
  let i = 0;
  const fail = (reason: string): never => {
    throw { offset: i, reason } satisfies SyntaxProblem;
  };
  const ws = () => {
    while (i < t.length && WS.has(t.charCodeAt(i))) i++;
  };
  const describe = () => (i >= t.length ? 'the file ends here: it is truncated' : `unexpected ${JSON.stringify(t[i])}`);
  const string = () => {
    i++;
    while (i < t.length) {
      const c = t.charCodeAt(i);
      if (c === 34) {
        i++;
        return;
      }
      if (c < 32) fail('a control character inside a string');
      if (c === 92) {
        const e = t[i + 1];
        if (e === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(t.slice(i + 2, i + 6))) fail('a bad \\u escape in a string');
          i += 6;
        } else if (e !== undefined && '"\\/bfnrt'.includes(e)) i += 2;
        else fail('a bad escape in a string');
      } else i++;
    }
    fail('the file ends inside a string: it is truncated');
  };
  const number = () => {
    const m = /^-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?/.exec(t.slice(i, i + 400));
    if (!m || m[0] === '-') fail(describe());
    i += (m as RegExpExecArray)[0].length;
  };
  const value = (): void => {
    ws();
    const c = t[i];
    if (c === '{') {
      i++;
      ws();
      if (t[i] === '}') {
        i++;
        return;
      }
      for (;;) {
        ws();
        if (t[i] !== '"') fail(i >= t.length ? describe() : `expected a field name in quotes, found ${JSON.stringify(t[i])}`);
        string();
        ws();
        if (t[i] !== ':') fail(i >= t.length ? describe() : `expected ":" after the field name, found ${JSON.stringify(t[i])}`);
        i++;
        value();
        ws();
        if (t[i] === ',') {
          i++;
          continue;
        }
        if (t[i] === '}') {
          i++;
          return;
        }
        fail(i >= t.length ? describe() : `expected "," or "}", found ${JSON.stringify(t[i])}`);
      }
    } else if (c === '[') {
      i++;
      ws();
      if (t[i] === ']') {
        i++;
        return;
      }
      for (;;) {
        value();
        ws();
        if (t[i] === ',') {
          i++;
          continue;
        }
        if (t[i] === ']') {
          i++;
          return;
        }
        fail(i >= t.length ? describe() : `expected "," or "]", found ${JSON.stringify(t[i])}`);
      }
    } else if (c === '"') string();
    else if (c === 't' && t.startsWith('true', i)) i += 4;
    else if (c === 'f' && t.startsWith('false', i)) i += 5;
    else if (c === 'n' && t.startsWith('null', i)) i += 4;
    else if (c === '-' || (c !== undefined && c >= '0' && c <= '9')) number();
    else fail(c === undefined ? describe() : `${describe()} where a value should be (JSON has no NaN, Infinity, comments or single quotes)`);
  };
  try {
    value();
    ws();
    if (i < t.length) fail(`more text after the end of the document: ${describe()}`);
    return null;
  } catch (e) {
    if (e && typeof e === 'object' && 'offset' in e) return e as SyntaxProblem;
    throw e;
  }
}

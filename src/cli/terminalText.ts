// Text from a log file (cruise, vessel and observer names, notes, ids in messages) is shown on a
// terminal. Raw, an ANSI escape sequence could recolour or clear the screen or rewrite earlier
// lines, a NUL or carriage return hide text, and a right-to-left override make one file name
// read as another. Text output therefore shows every such character as a visible \u escape.
// JSON output (summary --json) is left exact: JSON.stringify already escapes C0 controls and
// a JSON reader should get the real characters.

// C0 controls (tab included), DEL, C1 controls, and the invisible format characters that
// change how text around them is displayed: the bidirectional marks, embeddings, overrides and
// isolates, zero-width characters, the line and paragraph separators, the byte order mark.
// eslint-disable-next-line no-control-regex -- matching control characters is the point
const HIDDEN = /[\u0000-\u001f\u007f-\u009f\u061c\u200b-\u200f\u2028-\u202e\u2060-\u2069\ufeff]/g;

export function visible(text: string): string {
  return text.replace(HIDDEN, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

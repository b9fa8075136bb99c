// A result for user input: parsers return this instead of throwing, so a form or the CLI can
// show the message beside the field that caused it.

export type Result<T, E = string> = { ok: true; value: T } | { ok: false; error: E };

export function ok<T>(value: T): { ok: true; value: T } {
  return { ok: true, value };
}

export function err<E = string>(error: E): { ok: false; error: E } {
  return { ok: false, error };
}

// A refusal of a chart or grid file: one message that says what is wrong and where, so the
// Exchange screen and the CLI can show it as it is. Nothing is stored when a reader refuses.
export class IceInfoError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'IceInfoFileError';
  }
}

export type ReadResult<T> = { ok: true; value: T; warnings: string[] } | { ok: false; message: string };

export function refuse(message: string): never {
  throw new IceInfoError(message);
}

/** Runs a reader and turns its refusal (or a library's exception) into a result. */
export async function attempt<T>(what: string, read: () => Promise<{ value: T; warnings: string[] }> | { value: T; warnings: string[] }): Promise<ReadResult<T>> {
  try {
    const r = await read();
    return { ok: true, value: r.value, warnings: r.warnings };
  } catch (e) {
    if (e instanceof IceInfoError) return { ok: false, message: e.message };
    return { ok: false, message: `${what} could not be read: ${e instanceof Error ? e.message : String(e)}` };
  }
}

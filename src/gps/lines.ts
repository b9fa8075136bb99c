// Bytes to lines for NMEA 0183 streams. A sentence ends with CR LF, but devices and log files
// use CR, LF or CR LF, and a serial line can drop the terminator; `$` and `!` are reserved as
// sentence starts in NMEA 0183, so a new start also ends the previous (broken) line.

/** Anything longer than this without a terminator is noise, not a sentence: cut it off. */
export const MAX_LINE_LENGTH = 1024;

export class LineSplitter {
  // latin1 keeps every byte as one character, so noise never turns into multi-byte surprises.
  private readonly decoder = new TextDecoder('latin1');
  private buffer = '';

  /** Feed a chunk; returns the complete, non-empty lines it finished. */
  push(chunk: Uint8Array | string): string[] {
    this.buffer += typeof chunk === 'string' ? chunk : this.decoder.decode(chunk, { stream: true });
    const out: string[] = [];
    let start = 0;
    for (let i = 0; i < this.buffer.length; i++) {
      const ch = this.buffer[i];
      if (ch === '\r' || ch === '\n') {
        if (i > start) out.push(this.buffer.slice(start, i));
        start = i + 1;
      } else if ((ch === '$' || ch === '!') && i > start) {
        out.push(this.buffer.slice(start, i));
        start = i;
      } else if (i - start >= MAX_LINE_LENGTH) {
        out.push(this.buffer.slice(start, i));
        start = i;
      }
    }
    this.buffer = this.buffer.slice(start);
    return out.filter((l) => l.trim() !== '');
  }

  /** The last unterminated line, if any (at end of file or when the port closes). */
  flush(): string[] {
    const rest = this.buffer + this.decoder.decode();
    this.buffer = '';
    return rest.trim() === '' ? [] : [rest];
  }
}

/** Read a byte stream as lines, ending with whatever was left unterminated. */
export async function* readLines(stream: ReadableStream<Uint8Array>): AsyncGenerator<string> {
  const splitter = new LineSplitter();
  const reader = stream.getReader();
  try {
    for (;;) {
      const { value, done } = await reader.read();
      if (done) break;
      yield* splitter.push(value);
    }
    yield* splitter.flush();
  } finally {
    reader.releaseLock();
  }
}

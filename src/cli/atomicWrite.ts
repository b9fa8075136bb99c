// Output files are replaced whole or not at all. The content goes to a temporary file beside the
// target (same directory, so the rename cannot cross file systems), is flushed to the disk with
// fsync, and only then renamed over the target. A write that fails part way (disk full, a
// file-size limit, a vanished directory) removes the temporary file and leaves whatever was at
// the target, which may be one of the command's own inputs, exactly as it was.
import { closeSync, fsyncSync, openSync, renameSync, unlinkSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';

/** A failed write: the message names the file and says that the old one is intact. */
export class WriteFailed extends Error {
  override name = 'WriteFailed';
}

function reason(e: unknown): string {
  return e instanceof Error ? e.message.replace(/^[A-Z]+: /, '') : String(e);
}

/** writeSync may write less than it was given (a file-size limit stops it part way): loop. */
function writeAll(fd: number, bytes: Uint8Array) {
  let off = 0;
  while (off < bytes.length) off += writeSync(fd, bytes, off, bytes.length - off);
}

export function writeFileAtomic(file: string, content: readonly string[] | Uint8Array): void {
  const temp = join(dirname(file), `.${basename(file)}.${process.pid}.${Date.now().toString(36)}.partial`);
  let fd: number | null = null;
  try {
    fd = openSync(temp, 'wx', 0o644);
    if (content instanceof Uint8Array) writeAll(fd, content);
    else for (const part of content) writeAll(fd, Buffer.from(part, 'utf8'));
    fsyncSync(fd);
    closeSync(fd);
    fd = null;
    renameSync(temp, file);
  } catch (e) {
    if (fd !== null) {
      try {
        closeSync(fd);
      } catch {
        // already failing; the first error is the one to report
      }
    }
    try {
      unlinkSync(temp);
    } catch {
      // the temporary file was never created
    }
    throw new WriteFailed(`cannot write ${file} (${reason(e)}); nothing was written and any file that was there is unchanged`);
  }
}

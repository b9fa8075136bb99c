// h5wasm in Node: its Node build reads host files directly (Emscripten NODERAWFS), so the bytes
// go to a private temporary file for the reader and the file is removed when it is closed.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import h5wasm from 'h5wasm/node';
import type { Hdf5FileLike, Hdf5Opener } from '../iceinfo/gridRead.ts';
import { openHdf5View } from '../iceinfo/hdf5File.ts';

export const nodeHdf5: Hdf5Opener = {
  async open(bytes: Uint8Array): Promise<Hdf5FileLike> {
    await h5wasm.ready;
    const dir = mkdtempSync(join(tmpdir(), 'floe-ledger-h5-'));
    const path = join(dir, 'grid.h5');
    writeFileSync(path, bytes);
    return openHdf5View(
      () => new h5wasm.File(path, 'r'),
      () => rmSync(dir, { recursive: true, force: true }),
    );
  },
};

// h5wasm in the app (the import worker): its browser build carries the WebAssembly inside the
// JavaScript, so the bundler emits one lazy chunk (about 4 MB, precached like every other file)
// that is fetched only when a NetCDF-4 / HDF5 file is imported. The bytes go to Emscripten's
// in-memory file system under a name of their own and are removed when the file is closed.
// Compiling the WebAssembly needs 'wasm-unsafe-eval' in the security policy (index.html).
import type { Hdf5FileLike, Hdf5Opener } from './gridRead.ts';
import { openHdf5View } from './hdf5File.ts';

let opened = 0;

export const browserHdf5: Hdf5Opener = {
  async open(bytes: Uint8Array): Promise<Hdf5FileLike> {
    let h5wasm: typeof import('h5wasm').default;
    let FS: Awaited<typeof h5wasm.ready>['FS'];
    try {
      h5wasm = (await import('h5wasm')).default;
      ({ FS } = await h5wasm.ready);
    } catch (e) {
      // A missing chunk or a policy without 'wasm-unsafe-eval' ends here; say which part failed.
      throw new Error(`the NetCDF-4 / HDF5 reader could not be started (${e instanceof Error ? e.message : String(e)})`, { cause: e });
    }
    opened += 1;
    const path = `/floe-ledger-grid-${opened}.h5`;
    FS.writeFile(path, bytes);
    return openHdf5View(
      () => new h5wasm.File(path, 'r'),
      () => {
        try {
          FS.unlink(path);
        } catch {
          // Already gone: nothing is left to free.
        }
      },
    );
  },
};

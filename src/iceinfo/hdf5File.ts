// The one view of an open h5wasm file that the grid reader uses, shared by the command line's
// opener (h5wasm's Node build, a temporary host file) and the app's (its browser build, a file in
// Emscripten's in-memory file system). Only where the bytes live differs between the two.
import type { Hdf5FileLike } from './gridRead.ts';

/** What h5wasm's `File` offers that we use; both builds have the same class. */
export interface H5wasmFile {
  keys(): string[];
  get(name: string): unknown;
  close(): unknown;
}

/**
 * Opens `path` with `open` and gives the reader's view of it; `cleanup` removes the bytes when the
 * file is closed, or at once when h5wasm refuses the file (so a bad file leaves nothing behind).
 */
export function openHdf5View(open: () => H5wasmFile, cleanup: () => void): Hdf5FileLike {
  let file: H5wasmFile;
  try {
    file = open();
  } catch (e) {
    cleanup();
    throw e;
  }
  return {
    keys: () => file.keys(),
    get: (name) => file.get(name) as ReturnType<Hdf5FileLike['get']>,
    close: () => {
      try {
        file.close();
      } finally {
        cleanup();
      }
    },
  };
}

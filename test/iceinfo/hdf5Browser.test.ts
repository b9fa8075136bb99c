// The app's NetCDF-4 / HDF5 route: h5wasm's browser build (the one Vite bundles into the import
// worker's lazy chunk, WebAssembly inside the JavaScript, files in Emscripten's memory) read
// through the same CF reader as the command line. The files are written with h5wasm's Node build
// (gridFiles.ts); the expected cells are the ones the GeoTIFF and classic NetCDF tests read.
import h5wasm from 'h5wasm';
import { describe, expect, it } from 'vitest';
import { readIceInfoFile, type IceInfoRequest, type IceInfoStage } from '../../src/features/exchange/iceInfoRead';
import { nodeHdf5 } from '../../src/cli/hdf5Node';
import { readGridFile } from '../../src/iceinfo/gridRead';
import { browserHdf5 } from '../../src/iceinfo/hdf5Browser';
import { ICEINFO_LIMITS } from '../../src/iceinfo/limits';
import { centre, gridNc4, PERCENT } from './gridFiles';

const request = (bytes: Uint8Array, fileName: string): IceInfoRequest => ({
  file: new Blob([bytes as BlobPart]),
  fileName,
  sourceName: 'Frostwren test grid',
  time: '',
  preset: 'percent',
  id: 'g-nc4',
  importedAt: '2026-03-05T00:00:00Z',
});

/** Files left in h5wasm's in-memory root: every read must remove its own. */
async function memoryFiles(): Promise<string[]> {
  const { FS } = await h5wasm.ready;
  return FS.readdir('/').filter((n: string) => n.startsWith('floe-ledger-grid-'));
}

describe("NetCDF-4 in the app (h5wasm's browser build, in memory)", () => {
  it('imports the known grid through the app reader: cells, CF flags, fill, km axes, time', async () => {
    const stages: IceInfoStage[] = [];
    const r = await readIceInfoFile(request(await gridNc4(), 'grid.nc'), (s) => stages.push(s));
    if (!r.ok || r.kind !== 'grid') throw new Error(`expected a grid, got ${JSON.stringify(r).slice(0, 200)}`);
    expect(stages).toEqual(['read', 'decode', 'done']);
    expect(r.grid.epsg).toBe(3413);
    expect(Array.from(r.grid.cells)).toEqual(PERCENT);
    // 20516.5 days after 1970-01-01 is 2026-03-04T12:00Z (worked in grids.test.ts).
    expect(r.grid.gridTime).toBe('2026-03-04T12:00:00Z');
    expect([r.grid.x0, r.grid.y0, r.grid.dx, r.grid.dy]).toEqual([...centre(0, 0), 25_000, -25_000]);
    expect(await memoryFiles()).toEqual([]);
  });

  it('gives the same grid as the command line reads, also for a file stored south row first', async () => {
    for (const southFirst of [false, true]) {
      const bytes = await gridNc4({ southFirst });
      const meta = { id: 'g', sourceName: 's', fileName: 'grid.nc', importedAt: '2026-03-05T00:00:00Z' };
      const app = await readGridFile(bytes, meta, browserHdf5);
      const cli = await readGridFile(bytes, meta, nodeHdf5);
      expect(app).toEqual(cli);
    }
  });

  it('refuses bad files with a message naming the file, and keeps nothing in memory', async () => {
    const noCoord = await readIceInfoFile(request(await gridNc4({ noCoordinates: true }), 'nocoord.nc'), () => {});
    expect(noCoord).toEqual({ ok: false, message: expect.stringMatching(/^nocoord\.nc has no x coordinate variable .* the grid cannot be placed/) });
    const huge = await readIceInfoFile(request(await gridNc4({ hugeShape: [60_000, 60_000] }), 'huge.nc'), () => {});
    expect(huge).toEqual({ ok: false, message: expect.stringContaining(`huge.nc: the grid has 60000 x 60000 cells, more than this program reads (at most ${ICEINFO_LIMITS.maxGridCells.toLocaleString('en')} cells`) });
    // The HDF5 signature followed by nothing an HDF5 library can read (a file cut short).
    const cut = (await gridNc4()).slice(0, 600);
    const broken = await readIceInfoFile(request(cut, 'cut.nc'), () => {});
    expect(broken).toEqual({ ok: false, message: expect.stringMatching(/^cut\.nc could not be read: /) });
    expect(await memoryFiles()).toEqual([]);
  });
});

import { describe, expect, it } from 'vitest';
import { collocate, GRID_FLAG, sampleGrid } from '../../src/domain/collocation';
import { nodeHdf5 } from '../../src/cli/hdf5Node';
import { readGridFile, type GridMeta, type GridReadResult } from '../../src/iceinfo/gridRead';
import { ICEINFO_LIMITS } from '../../src/iceinfo/limits';
import { KNOWN_GRID_CRS, planeOf } from '../../src/iceinfo/projections';
import { centre, gridNc4, gridNcClassic, gridTiff, H, PERCENT, W } from './gridFiles';
import { writeClassicNetcdf } from './netcdfClassic';

const meta = (over: Partial<GridMeta> = {}): GridMeta => ({ id: 'g1', sourceName: 'Frostwren test grid', gridTime: '2026-03-04T12:00:00Z', fileName: 'grid.tif', importedAt: '2026-03-05T00:00:00Z', ...over });
const plane = planeOf(KNOWN_GRID_CRS[3413]!.proj4);

describe('GeoTIFF grid (written with geotiff)', () => {
  it('reads the known cells, flags and pole hole in place', async () => {
    const { grid, counts } = await readGridFile(await gridTiff(), meta());
    expect([grid.width, grid.height, grid.epsg]).toEqual([W, H, 3413]);
    expect(Array.from(grid.cells)).toEqual(PERCENT);
    expect(counts).toMatchObject({ value: 24, poleHole: 2, coast: 1, land: 2, missing: 1 });
    expect(sampleGrid(grid, ...centre(1, 1))).toMatchObject({ kind: 'value', nearestPercent: 100 });
    expect(sampleGrid(grid, ...centre(2, 1))).toMatchObject({ kind: 'flag', flag: 'poleHole' });
    expect(sampleGrid(grid, ...centre(1, 3))).toMatchObject({ kind: 'flag', flag: 'land' });
    expect(sampleGrid(grid, ...centre(3, 2))).toMatchObject({ kind: 'flag', flag: 'missing' });
  });
  it('gives an observation at a cell centre that cell, through the projection', async () => {
    const { grid } = await readGridFile(await gridTiff(), meta());
    const [lon, lat] = plane.toLonLat(...centre(3, 4)) as [number, number];
    const c = collocate([{ id: 'o', time: '2026-03-04T15:00:00Z', position: { lon, lat, source: 'manual' } }], [], [{ grid, toPlane: plane.toPlane }]);
    expect(c.get('o')?.grid?.sample).toMatchObject({ kind: 'value', nearestPercent: 5, row: 3, col: 4 });
    expect(c.get('o')?.grid?.hoursApart).toBe(3);
  });
  it('reads the NSIDC per-mille preset and refuses a projection it does not know', async () => {
    const perMille = PERCENT.map((p) => (p > 100 ? p * 10 : p * 10));
    const buf = await writeUint16Tiff(perMille);
    const { grid } = await readGridFile(buf, meta({ preset: 'per-mille' }));
    expect(Array.from(grid.cells)).toEqual(PERCENT);
    await expect(readGridFile(await gridTiff(PERCENT, { ProjectedCSTypeGeoKey: 3995 }), meta())).rejects.toThrow(/projection EPSG:3995 is not one of the supported grids/);
  });
});

async function writeUint16Tiff(values: number[]): Promise<Uint8Array> {
  const { writeArrayBuffer } = await import('geotiff');
  const { CELL, LEFT, TOP } = await import('./gridFiles');
  return new Uint8Array(await writeArrayBuffer(Uint16Array.from(values), { width: W, height: H, ModelPixelScale: [CELL, CELL, 0], ModelTiepoint: [0, 0, 0, LEFT, TOP, 0], GTModelTypeGeoKey: 1, ProjectedCSTypeGeoKey: 3413 } as never));
}

/** The NetCDF files' grid (gridFiles.ts) as read: cells, CF flags and fill, scale, km axes, time. */
function expectKnownCfGrid({ grid, counts }: GridReadResult): void {
  expect(grid.epsg).toBe(3413);
  expect(Array.from(grid.cells)).toEqual(PERCENT);
  expect(counts).toMatchObject({ poleHole: 2, coast: 1, land: 2, missing: 1 });
  // 20516.5 days after 1970-01-01 is 2026-03-04T12:00Z (20516 = 56 years of 365 days + 14 leap days + 62 days).
  expect(grid.gridTime).toBe('2026-03-04T12:00:00Z');
  expect([grid.x0, grid.y0, grid.dx, grid.dy]).toEqual([...centre(0, 0), 25_000, -25_000]);
}

describe('NetCDF-4 grid (written with h5wasm, CF attributes)', () => {
  it('reads cells, CF flags, fill value, scale, km coordinates and the time variable', async () => {
    expectKnownCfGrid(await readGridFile(await gridNc4(), meta({ gridTime: undefined, fileName: 'grid.nc' }), nodeHdf5));
  });
  it('turns a grid stored south row first', async () => {
    const { grid } = await readGridFile(await gridNc4({ southFirst: true }), meta({ fileName: 'grid.nc' }), nodeHdf5);
    expect(Array.from(grid.cells)).toEqual(PERCENT);
    expect(grid.y0).toBe(centre(0, 0)[1]);
  });
  it('refuses a NetCDF without coordinates, and one with absurd dimensions, naming the limit', async () => {
    await expect(readGridFile(await gridNc4({ noCoordinates: true }), meta({ fileName: 'nocoord.nc' }), nodeHdf5)).rejects.toThrow(/nocoord\.nc has no x coordinate variable .* the grid cannot be placed/);
    await expect(readGridFile(await gridNc4({ hugeShape: [60_000, 60_000] }), meta({ fileName: 'huge.nc' }), nodeHdf5)).rejects.toThrow(
      new RegExp(`huge\\.nc: the grid has 60000 x 60000 cells, more than this program reads \\(at most ${ICEINFO_LIMITS.maxGridCells.toLocaleString('en')} cells`),
    );
  });
  it('says so when NetCDF-4 cannot be read here (no HDF5 reader given)', async () => {
    await expect(readGridFile(await gridNc4(), meta({ fileName: 'grid.nc' }))).rejects.toThrow(/grid\.nc is NetCDF-4 \/ HDF5, which this program cannot read here/);
  });
});

describe('classic NetCDF grid (written by our CDF-1/CDF-2 writer, read with netcdfjs)', () => {
  it('writes the header as the NetCDF Classic Format Specification lays it out', () => {
    // magic "CDF" 1, numrecs 0, NC_DIMENSION (10) with 1 dimension "x" (length 1, name padded to
    // 4 bytes) of size 2, ABSENT global attributes (two zero words), NC_VARIABLE (11) with one
    // variable "v": 1 dimension (id 0), ABSENT attributes, NC_SHORT (3), vsize 4, begin 80 (the
    // magic and 19 words of header), then the data 1, -2 as big-endian shorts.
    const b = writeClassicNetcdf({ version: 1, dims: [{ name: 'x', size: 2 }], vars: [{ name: 'v', dims: ['x'], type: 'short', data: [1, -2] }] });
    const words = Array.from({ length: b.length / 4 }, (_, i) => new DataView(b.buffer, b.byteOffset).getInt32(i * 4));
    expect(Array.from(b.slice(0, 4))).toEqual([0x43, 0x44, 0x46, 1]);
    expect(words.slice(1)).toEqual([0, 10, 1, 1, 0x78000000, 2, 0, 0, 11, 1, 1, 0x76000000, 1, 0, 0, 0, 3, 4, 80, 0x0001fffe]);
    // CDF-2 differs only in the magic's version byte and an 8-byte begin.
    const b2 = writeClassicNetcdf({ version: 2, dims: [{ name: 'x', size: 2 }], vars: [{ name: 'v', dims: ['x'], type: 'short', data: [1, -2] }] });
    expect(b2[3]).toBe(2);
    expect(b2.length).toBe(b.length + 4);
  });
  it('reads cells, CF flags, fill value, scale, km coordinates and the time variable (CDF-1)', async () => {
    expectKnownCfGrid(await readGridFile(gridNcClassic(), meta({ gridTime: undefined, fileName: 'grid.nc' })));
  });
  it('reads the 64-bit offset form (CDF-2) stored south row first, and locates a cell through the projection', async () => {
    const { grid } = await readGridFile(gridNcClassic({ version: 2, southFirst: true }), meta({ fileName: 'grid64.nc' }));
    expect(Array.from(grid.cells)).toEqual(PERCENT);
    expect(grid.y0).toBe(centre(0, 0)[1]);
    // Row 3, column 0 holds 40 %: an observation at that cell's centre gets 40.
    const [lon, lat] = plane.toLonLat(...centre(3, 0)) as [number, number];
    const c = collocate([{ id: 'o', time: '2026-03-04T12:00:00Z', position: { lat, lon, source: 'manual' } }], [], [{ grid, toPlane: plane.toPlane }]);
    expect(c.get('o')?.grid?.sample).toMatchObject({ kind: 'value', nearestPercent: 40 });
  });
  it('refuses a classic NetCDF without coordinates, one with absurd dimensions, and a broken one', async () => {
    await expect(readGridFile(gridNcClassic({ noCoordinates: true }), meta({ fileName: 'nocoord.nc' }))).rejects.toThrow(/nocoord\.nc has no x coordinate variable .* the grid cannot be placed/);
    await expect(readGridFile(gridNcClassic({ hugeShape: [60_000, 60_000] }), meta({ fileName: 'huge.nc' }))).rejects.toThrow(
      new RegExp(`huge\\.nc: the grid has 60000 x 60000 cells, more than this program reads \\(at most ${ICEINFO_LIMITS.maxGridCells.toLocaleString('en')} cells`),
    );
    const cut = gridNcClassic().slice(0, 40);
    await expect(readGridFile(cut, meta({ fileName: 'cut.nc' }))).rejects.toThrow(/cut\.nc: the NetCDF file cannot be read/);
  });
});

describe('hostile grid files', () => {
  it('a GeoTIFF claiming absurd dimensions is refused before its cells are read', async () => {
    const tif = await gridTiff();
    // Patch the ImageWidth and ImageLength entries (tags 256 and 257) of the first IFD: TIFF 6.0
    // (Adobe, 1992), an IFD entry is tag, type, count and a value that fits in 4 bytes.
    const v = new DataView(tif.buffer, tif.byteOffset, tif.byteLength);
    const le = v.getUint16(0) === 0x4949;
    const ifd = v.getUint32(4, le);
    const n = v.getUint16(ifd, le);
    for (let i = 0; i < n; i++) {
      const e = ifd + 2 + 12 * i;
      const tag = v.getUint16(e, le);
      const type = v.getUint16(e + 2, le);
      if (tag === 256 || tag === 257) {
        if (type === 3) v.setUint16(e + 8, 50_000, le);
        else v.setUint32(e + 8, 50_000, le);
      }
    }
    await expect(readGridFile(tif, meta({ fileName: 'huge.tif' }))).rejects.toThrow(/huge\.tif: the grid has 50000 x 50000 cells, more than this program reads/);
  });
  it('a file that is no grid at all, and a missing time', async () => {
    await expect(readGridFile(new TextEncoder().encode('{"type":"FeatureCollection"}'), meta({ fileName: 'x.json' }))).rejects.toThrow(/x\.json is not a GeoTIFF, NetCDF or HDF5 file/);
    await expect(readGridFile(await gridTiff(), meta({ gridTime: undefined }))).rejects.toThrow(/carries no time: type the product's date and time/);
  });
  it('GRID_FLAG keeps the NSIDC byte values (NSIDC-0051 user guide, from memory)', () => {
    expect(GRID_FLAG).toMatchObject({ poleHole: 251, coast: 253, land: 254, missing: 255 });
  });
});

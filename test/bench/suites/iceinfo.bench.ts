// Ice information (issue 14): a 25 km grid of the whole Arctic (NSIDC north, 304 x 448 cells on
// EPSG:3413) written with geotiff and imported, against geotiff's bare decode of the same file;
// and 50,000 observations collocated with it and a chart, against bare proj4 projection of the
// same positions (the least any collocation must do); and the same with a chart of 1,600 polygons
// against the chart of 3, which the polygon index keeps near flat (a scan grew with the count);
// and the map's image of that grid (gridImage: every pixel of a 1024-wide Web Mercator image
// projected into the grid's plane) against a bare loop giving each cell its colour once.
import { fromArrayBuffer, writeArrayBuffer } from 'geotiff';
import { collocate, type ChartLocator, type GridLocator } from '../../../src/domain/collocation/index.ts';
import { readChartFile } from '../../../src/iceinfo/chartRead.ts';
import { readGridFile } from '../../../src/iceinfo/gridRead.ts';
import { KNOWN_GRID_CRS, planeOf } from '../../../src/iceinfo/projections.ts';
import { gridImage } from '../../../src/features/map/iceInfoLayers.ts';
import { gridColourTable, ICEINFO_PALETTES } from '../../../src/features/map/iceInfoColours.ts';
import { chartGeoJson } from '../../iceinfo/chartFiles.ts';
import { compare, ratioRow, type BenchSuite } from '../bench-kit';

const W = 304;
const H = 448;
const N = 50_000;

async function arcticTiff(): Promise<Uint8Array> {
  const cells = new Uint8Array(W * H);
  for (let r = 0; r < H; r++) for (let c = 0; c < W; c++) cells[r * W + c] = (r * 7 + c * 3) % 120 > 100 ? 254 : (r + c) % 101;
  return new Uint8Array(await writeArrayBuffer(cells, { width: W, height: H, ModelPixelScale: [25_000, 25_000, 0], ModelTiepoint: [0, 0, 0, -3_850_000, 5_850_000, 0], GTModelTypeGeoKey: 1, ProjectedCSTypeGeoKey: 3413 } as never));
}

export const suite: BenchSuite = {
  name: 'ice information',
  async run() {
    const tif = await arcticTiff();
    const meta = { id: 'g', sourceName: 'bench', gridTime: '2026-03-04T12:00:00Z', fileName: 'bench.tif', importedAt: '2026-03-05T00:00:00Z' };
    const imp = await compare(
      () => readGridFile(tif, meta),
      async () => (await (await fromArrayBuffer(tif.buffer.slice(0) as ArrayBuffer)).getImage()).readRasters(),
      7,
    );
    const { grid } = await readGridFile(tif, meta);
    const plane = planeOf(KNOWN_GRID_CRS[3413]!.proj4);
    const { chart } = await readChartFile(new TextEncoder().encode(JSON.stringify(chartGeoJson())), { id: 'c', sourceName: 'bench', chartTime: '2026-03-04T18:00:00Z', fileName: 'c.geojson', importedAt: meta.importedAt });
    const charts: ChartLocator[] = [{ chart, toPlane: planeOf(chart.crs).toPlane }];
    const grids: GridLocator[] = [{ grid, toPlane: plane.toPlane }];
    const obs = Array.from({ length: N }, (_, i) => ({ id: `o${i}`, time: '2026-03-04T14:00:00Z', position: { lon: -180 + ((i * 7.3) % 360), lat: 60 + ((i * 0.37) % 29), source: 'manual' as const } }));
    const col = await compare(
      () => collocate(obs, charts, grids),
      () => {
        let s = 0;
        for (const o of obs) s += (plane.toPlane(o.position.lon, o.position.lat)?.[0] ?? 0) > 0 ? 1 : 0;
        return s;
      },
      5,
    );
    // 40 x 40 boxes of 1 degree longitude by 0.5 degree latitude, 20 W to 20 E, 60 N to 80 N.
    const many = {
      ...chart,
      polygons: Array.from({ length: 1600 }, (_, k) => {
        const lon = -20 + (k % 40);
        const lat = 60 + Math.floor(k / 40) * 0.5;
        return { rings: [[lon, lat, lon + 1, lat, lon + 1, lat + 0.5, lon, lat + 0.5, lon, lat]], bbox: [lon, lat, lon + 1, lat + 0.5] as [number, number, number, number], attributes: chart.polygons[0]!.attributes };
      }),
    };
    const manyCharts: ChartLocator[] = [{ chart: many, toPlane: planeOf(chart.crs).toPlane }];
    const big = await compare(
      () => collocate(obs, manyCharts, grids),
      () => collocate(obs, charts, grids),
      5,
    );
    const palette = ICEINFO_PALETTES.day;
    let drawnHeight = 0;
    const draw = await compare(
      () => {
        drawnHeight = gridImage(grid, palette)?.height ?? 0;
      },
      () => {
        // The least any drawing does: one RGBA pixel per cell, coloured as the map colours it.
        const table = gridColourTable(palette);
        const rgba = new Uint8ClampedArray(grid.width * grid.height * 4);
        for (let k = 0; k < grid.cells.length; k++) {
          const t = (grid.cells[k] as number) * 4;
          rgba[k * 4] = table[t]!;
          rgba[k * 4 + 1] = table[t + 1]!;
          rgba[k * 4 + 2] = table[t + 2]!;
          rgba[k * 4 + 3] = table[t + 3]!;
        }
        return rgba;
      },
      7,
    );
    return [
      ratioRow(`import a ${W} x ${H} GeoTIFF grid vs bare geotiff decode`, imp.subject, imp.baseline, 'ms', 2),
      ratioRow(`collocate ${N.toLocaleString('en')} observations (chart + grid) vs bare proj4 projection`, col.subject, col.baseline, 'ms', 8),
      ratioRow(`collocate ${N.toLocaleString('en')} observations with a 1,600-polygon chart vs a 3-polygon chart`, big.subject, big.baseline, 'ms', 2),
      ratioRow(`draw the ${W} x ${H} grid as a 1024 x ${drawnHeight} map image vs one colour per cell`, draw.subject, draw.baseline, 'ms', 100),
    ];
  },
};

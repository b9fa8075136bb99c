import { describe, expect, it } from 'vitest';
import { GRID_FLAG, type ConcentrationGrid, type IceChart } from '../../../src/domain/collocation';
import { ICEINFO_PALETTES, gridColour, gridColourTable } from '../../../src/features/map/iceInfoColours';
import { chartFeatures, gridBox, gridImage } from '../../../src/features/map/iceInfoLayers';
import { KNOWN_GRID_CRS } from '../../../src/iceinfo/projections';

const attrs = { CA: null, SA: '93', FA: null, CB: null, SB: null, FB: null, CC: null, SC: null, FC: null, CN: null, CD: null };

describe('chart polygons for the map', () => {
  it('colours by CT in the WMO/TD-No. 1215 colours and leaves land out', () => {
    const chart: IceChart = {
      id: 'c', sourceName: 's', chartTime: '2026-03-04T18:00:00Z', importedAt: '2026-03-05T00:00:00Z', fileName: 'f', crs: 'EPSG:4326', geographic: true,
      polygons: [
        { rings: [[0, 70, 10, 70, 10, 80, 0, 70]], bbox: [0, 70, 10, 80], attributes: { ...attrs, POLY_TYPE: 'I', CT: '92' } },
        { rings: [[10, 70, 20, 70, 20, 80, 10, 70]], bbox: [10, 70, 20, 80], attributes: { ...attrs, POLY_TYPE: 'I', CT: '46' } },
        { rings: [[20, 70, 30, 70, 30, 80, 20, 70]], bbox: [20, 70, 30, 80], attributes: { ...attrs, POLY_TYPE: 'L', CT: null } },
      ],
    };
    const fc = chartFeatures([chart]);
    // WMO/TD-No. 1215: 9-10/10 red (255, 0, 0), 4-6/10 yellow (255, 255, 0).
    expect(fc.features.map((f) => f.properties?.colour)).toEqual(['#ff0000', '#ffff00']);
    expect(fc.features[0]?.properties?.egg).toBe('92 93');
  });
});

describe('grid image for the map', () => {
  const grid: ConcentrationGrid = {
    id: 'g', sourceName: 's', gridTime: '2026-03-04T12:00:00Z', importedAt: '2026-03-05T00:00:00Z', fileName: 'f', crs: KNOWN_GRID_CRS[3413]!.proj4, epsg: 3413,
    width: 2, height: 2, x0: -12_500, y0: 12_500, dx: 25_000, dy: -25_000, cells: Uint8Array.from([100, GRID_FLAG.land, 10, GRID_FLAG.poleHole]),
  };
  it('spans every longitude when the pole is inside, and stays inside Web Mercator', () => {
    // A 6,000 km square round the pole: its corners, 4,200 km out, lie in the 50s N (a rough figure
    // from 111 km a degree; the bounds below are loose for that reason).
    const box = gridBox({ ...grid, width: 2, height: 2, x0: -1_500_000, y0: 1_500_000, dx: 3_000_000, dy: -3_000_000 });
    expect([box?.west, box?.east]).toEqual([-180, 180]);
    expect(box?.north).toBe(85);
    expect(box?.south).toBeGreaterThan(50);
    expect(box?.south).toBeLessThan(70);
  });
  it('gives no box and no image for a grid wholly beyond the Mercator latitudes', () => {
    // A 50 km square round the pole lies north of 89.5 N, where Web Mercator tiles (85.05 N) do
    // not reach: MapLibre's image source threw on such a box, and the map never reported idle.
    expect(gridBox(grid)).toBeNull();
    expect(gridImage(grid, ICEINFO_PALETTES.day, 64)).toBeNull();
  });
  it('colours valid cells by the grid scale, leaves land and low values clear', () => {
    const big: ConcentrationGrid = { ...grid, width: 3, height: 3, x0: -3_000_000, y0: 3_000_000, dx: 3_000_000, dy: -3_000_000, cells: Uint8Array.from([100, 100, 100, 100, GRID_FLAG.poleHole, 100, 100, GRID_FLAG.land, 10]) };
    const img = gridImage(big, ICEINFO_PALETTES.day, 64);
    if (!img) throw new Error('the grid reaches below 85 N, so it has an image');
    const seen = new Set<string>();
    for (let i = 0; i < img.rgba.length; i += 4) seen.add(Array.from(img.rgba.slice(i, i + 4)).join(','));
    expect(seen.has(gridColour(100, ICEINFO_PALETTES.day).join(','))).toBe(true);
    expect(seen.has('0,0,0,0')).toBe(true);
    expect(gridColour(10, ICEINFO_PALETTES.day)[3]).toBe(0); // below the 15 % edge: clear (common practice)
  });
  it('looks every cell byte up in one table: the scale for percent, grey for the pole hole, other flags clear', () => {
    for (const theme of ['day', 'night', 'red'] as const) {
      const p = ICEINFO_PALETTES[theme];
      const table = gridColourTable(p);
      for (let v = 0; v <= 100; v++) expect(Array.from(table.slice(v * 4, v * 4 + 4))).toEqual([...gridColour(v, p)]);
      expect(Array.from(table.slice(GRID_FLAG.poleHole * 4, GRID_FLAG.poleHole * 4 + 4))).toEqual([...p.poleHole, p.gridAlpha]);
      for (const flag of [GRID_FLAG.land, GRID_FLAG.coast, GRID_FLAG.missing, GRID_FLAG.unknownFlag]) expect(table[flag * 4 + 3]).toBe(0);
    }
  });
});

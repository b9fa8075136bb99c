// An invented chart and grid as the store keeps them (no file reading): a geographic chart with
// one triangle of 10/10 (SIGRID-3 CT 92, WMO/TD-No. 1214) and a 2 x 2 grid of 25 km cells on the
// NSIDC polar stereographic north grid (EPSG:3413) with its corner at the pole.
import type { ConcentrationGrid, IceChart } from '../../src/domain/collocation';

/** EPSG:3413 as NSIDC defines it: latitude of true scale 70 N, central meridian 45 W, WGS 84. */
export const EPSG_3413 = '+proj=stere +lat_0=90 +lat_ts=70 +lon_0=-45 +k=1 +x_0=0 +y_0=0 +datum=WGS84 +units=m +no_defs';

export const storedChart = (over: Partial<IceChart> = {}): IceChart => ({
  id: 'chart-1',
  sourceName: 'Frostwren test chart',
  chartTime: '2026-03-04T18:00:00Z',
  importedAt: '2026-03-05T00:00:00Z',
  fileName: 'chart.zip',
  crs: 'EPSG:4326',
  geographic: true,
  polygons: [{ rings: [[0, 70, 10, 70, 10, 80, 0, 70]], bbox: [0, 70, 10, 80], attributes: { POLY_TYPE: 'I', CT: '92', CA: null, SA: '93', FA: null, CB: null, SB: null, FB: null, CC: null, SC: null, FC: null, CN: null, CD: null } }],
  ...over,
});

export const storedGrid = (over: Partial<ConcentrationGrid> = {}): ConcentrationGrid => ({
  id: 'grid-1',
  sourceName: 'Frostwren test grid',
  gridTime: '2026-03-04T12:00:00Z',
  importedAt: '2026-03-05T00:00:00Z',
  fileName: 'grid.tif',
  crs: EPSG_3413,
  epsg: 3413,
  width: 2,
  height: 2,
  x0: 0,
  y0: 0,
  dx: 25_000,
  dy: -25_000,
  cells: Uint8Array.from([0, 50, 251, 254]),
  ...over,
});

// Charts and grids turned into what MapLibre draws: chart polygons as GeoJSON in longitude and
// latitude (edges of projected charts densified so they bend as in the chart's plane), and a grid
// as an RGBA image on a longitude/latitude box, resampled in Web Mercator rows. Pure.
import type { Feature, FeatureCollection, Polygon } from 'geojson';
import type { ConcentrationGrid, IceChart } from '../../domain/collocation/chartModel';
import { readConcentrationCode, readPolyType } from '../../domain/collocation/sigrid3';
import { planeOf } from '../../iceinfo/projections';
import { bandOfTenths, band, hexColour } from './concentrationBands';
import { gridColourTable, type IceInfoPalette } from './iceInfoColours';

/** Longest edge drawn straight, in the chart plane (metres). */
const DENSIFY_M = 20_000;
// A little inside Web Mercator's 85.0511: MapLibre refuses an image whose corner rounds past the tile edge.
const MERCATOR_MAX_LAT = 85;

function ringToLonLat(ring: readonly number[], chart: Pick<IceChart, 'crs' | 'geographic'>): number[][] {
  if (chart.geographic) {
    const out: number[][] = [];
    for (let i = 0; i < ring.length; i += 2) out.push([ring[i] as number, ring[i + 1] as number]);
    return out;
  }
  const inv = planeOf(chart.crs).toLonLat;
  const out: number[][] = [];
  let prevLon: number | null = null;
  const push = (x: number, y: number) => {
    const p = inv(x, y);
    if (!p) return;
    let lon = p[0];
    // Continuous longitudes, so MapLibre draws across the antimeridian instead of round the world.
    if (prevLon !== null) {
      while (lon - prevLon > 180) lon -= 360;
      while (lon - prevLon < -180) lon += 360;
    }
    prevLon = lon;
    out.push([lon, p[1]]);
  };
  for (let i = 0; i + 3 < ring.length; i += 2) {
    const [x0, y0, x1, y1] = [ring[i] as number, ring[i + 1] as number, ring[i + 2] as number, ring[i + 3] as number];
    const n = Math.max(1, Math.ceil(Math.hypot(x1 - x0, y1 - y0) / DENSIFY_M));
    for (let k = 0; k < n; k++) push(x0 + ((x1 - x0) * k) / n, y0 + ((y1 - y0) * k) / n);
  }
  push(ring[ring.length - 2] as number, ring[ring.length - 1] as number);
  return out;
}

/** Every polygon of the charts, coloured by its total concentration (WMO/TD-No. 1215). */
export function chartFeatures(charts: readonly IceChart[]): FeatureCollection<Polygon> {
  const features: Feature<Polygon>[] = [];
  for (const chart of charts) {
    chart.polygons.forEach((p, i) => {
      const type = readPolyType(p.attributes.POLY_TYPE);
      if (type === 'L' || type === 'N') return;
      const ct = readConcentrationCode(p.attributes.CT);
      const tenths = type === 'W' && !ct ? 0 : (ct?.tenths ?? null);
      const colour = tenths === null ? null : hexColour(band(bandOfTenths(tenths, type !== 'W' && tenths === 0)).rgb);
      features.push({
        type: 'Feature',
        id: `${chart.id}:${i}`,
        geometry: { type: 'Polygon', coordinates: p.rings.map((r) => ringToLonLat(r, chart)) },
        properties: { chartId: chart.id, colour: colour ?? '#00000000', egg: `${p.attributes.CT ?? '--'} ${p.attributes.SA ?? ''}`.trim() },
      });
    });
  }
  return { type: 'FeatureCollection', features };
}

export interface GridImage {
  width: number;
  height: number;
  rgba: Uint8ClampedArray;
  /** Corners for MapLibre's image source: top-left, top-right, bottom-right, bottom-left. */
  coordinates: [[number, number], [number, number], [number, number], [number, number]];
}

const mercY = (lat: number) => Math.log(Math.tan(Math.PI / 4 + (lat * Math.PI) / 360));
const latOfMercY = (y: number) => (360 / Math.PI) * Math.atan(Math.exp(y)) - 90;

export interface LonLatBox {
  west: number;
  east: number;
  south: number;
  north: number;
}

/**
 * The grid's box in longitude/latitude, from points along its outer edge (and the pole), cut to
 * the latitudes Web Mercator tiles reach; null when no part of the grid lies within them (a small
 * grid round the pole), since MapLibre cannot place an image there: a box upside down made its
 * image source throw while loading, which stopped the map's rendering before it reported idle.
 */
export function gridBox(grid: ConcentrationGrid): LonLatBox | null {
  const plane = planeOf(grid.crs);
  let south = 90;
  let north = -90;
  let west = 180;
  let east = -180;
  const add = (x: number, y: number) => {
    const p = plane.toLonLat(x, y);
    if (!p) return;
    south = Math.min(south, p[1]);
    north = Math.max(north, p[1]);
    west = Math.min(west, p[0]);
    east = Math.max(east, p[0]);
  };
  const left = grid.x0 - grid.dx / 2;
  const top = grid.y0 - grid.dy / 2;
  const right = left + grid.dx * grid.width;
  const bottom = top + grid.dy * grid.height;
  for (let k = 0; k <= 64; k++) {
    const t = k / 64;
    add(left + (right - left) * t, top);
    add(left + (right - left) * t, bottom);
    add(left, top + (bottom - top) * t);
    add(right, top + (bottom - top) * t);
  }
  const pole = plane.toPlane(0, grid.epsg === 3976 || grid.epsg === 3412 || grid.epsg === 6932 ? -90 : 90);
  const poleInside = pole && (pole[0] - left) * (pole[0] - right) <= 0 && (pole[1] - top) * (pole[1] - bottom) <= 0;
  if (poleInside) {
    west = -180;
    east = 180;
    if (pole[1] !== undefined && grid.epsg !== 3976 && grid.epsg !== 3412 && grid.epsg !== 6932) north = 90;
    else south = -90;
  }
  south = Math.max(south, -MERCATOR_MAX_LAT);
  north = Math.min(north, MERCATOR_MAX_LAT);
  return north > south && east > west ? { west, east, south, north } : null;
}

/**
 * The grid resampled (nearest cell) into an image whose rows are evenly spaced in Web Mercator;
 * null when the grid lies wholly beyond the Mercator latitudes (see gridBox).
 */
export function gridImage(grid: ConcentrationGrid, palette: IceInfoPalette, width = 1024): GridImage | null {
  const box = gridBox(grid);
  if (!box) return null;
  const yTop = mercY(box.north);
  const yBottom = mercY(box.south);
  const height = Math.max(16, Math.min(2048, Math.round((width * (yTop - yBottom)) / (((box.east - box.west) * Math.PI) / 180))));
  const rgba = new Uint8ClampedArray(width * height * 4);
  const to = planeOf(grid.crs).toPlane;
  const table = gridColourTable(palette);
  for (let j = 0; j < height; j++) {
    const lat = latOfMercY(yTop + ((j + 0.5) / height) * (yBottom - yTop));
    for (let i = 0; i < width; i++) {
      const lon = box.west + ((i + 0.5) / width) * (box.east - box.west);
      const p = to(lon, lat);
      if (!p) continue;
      const c = Math.round((p[0] - grid.x0) / grid.dx);
      const r = Math.round((p[1] - grid.y0) / grid.dy);
      if (c < 0 || r < 0 || c >= grid.width || r >= grid.height) continue;
      const t = (grid.cells[r * grid.width + c] as number) * 4;
      const o = (j * width + i) * 4;
      rgba[o] = table[t]!;
      rgba[o + 1] = table[t + 1]!;
      rgba[o + 2] = table[t + 2]!;
      rgba[o + 3] = table[t + 3]!;
    }
  }
  return { width, height, rgba, coordinates: [[box.west, box.north], [box.east, box.north], [box.east, box.south], [box.west, box.south]] };
}

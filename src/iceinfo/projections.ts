// Projections of charts and grids, with proj4. The grid products name an EPSG code; a chart's
// .prj holds OGC or ESRI WKT. proj4 misreads some ESRI polar stereographic WKT (it gave a point
// 2,000 km off for "Stereographic_North_Pole" in our check), so the WKT is translated here into a
// proj4 definition for the families we support: polar stereographic, Lambert conformal conic,
// Lambert azimuthal equal-area and geographic.
import proj4 from 'proj4';
import type { ToPlane } from '../domain/collocation/collocate.ts';
import { refuse } from './problems.ts';

/**
 * The grids we read, as proj4 definitions. Parameters as the EPSG Geodetic Parameter Registry
 * defines the codes (checked in test/iceinfo/projections.test.ts against NSIDC's published grid
 * corners and Snyder 1987):
 * - 3413 WGS 84 / NSIDC Sea Ice Polar Stereographic North: true scale at 70 N, meridian 45 W;
 * - 3976 WGS 84 / NSIDC Sea Ice Polar Stereographic South: true scale at 70 S, meridian 0;
 * - 3411 / 3412: the same planes on the Hughes 1980 ellipsoid (a = 6378273 m, b = 6356889.449 m),
 *   as the older NSIDC products use them;
 * - 6931 / 6932 WGS 84 / NSIDC EASE-Grid 2.0 North / South: Lambert azimuthal equal-area at the pole.
 */
export const KNOWN_GRID_CRS: Readonly<Record<number, { name: string; proj4: string }>> = {
  3413: { name: 'NSIDC Sea Ice Polar Stereographic North (EPSG:3413)', proj4: '+proj=stere +lat_0=90 +lat_ts=70 +lon_0=-45 +k=1 +x_0=0 +y_0=0 +datum=WGS84 +units=m +no_defs' },
  3976: { name: 'NSIDC Sea Ice Polar Stereographic South (EPSG:3976)', proj4: '+proj=stere +lat_0=-90 +lat_ts=-70 +lon_0=0 +k=1 +x_0=0 +y_0=0 +datum=WGS84 +units=m +no_defs' },
  3411: { name: 'NSIDC Sea Ice Polar Stereographic North, Hughes 1980 (EPSG:3411)', proj4: '+proj=stere +lat_0=90 +lat_ts=70 +lon_0=-45 +k=1 +x_0=0 +y_0=0 +a=6378273 +b=6356889.449 +units=m +no_defs' },
  3412: { name: 'NSIDC Sea Ice Polar Stereographic South, Hughes 1980 (EPSG:3412)', proj4: '+proj=stere +lat_0=-90 +lat_ts=-70 +lon_0=0 +k=1 +x_0=0 +y_0=0 +a=6378273 +b=6356889.449 +units=m +no_defs' },
  6931: { name: 'NSIDC EASE-Grid 2.0 North (EPSG:6931)', proj4: '+proj=laea +lat_0=90 +lon_0=0 +x_0=0 +y_0=0 +datum=WGS84 +units=m +no_defs' },
  6932: { name: 'NSIDC EASE-Grid 2.0 South (EPSG:6932)', proj4: '+proj=laea +lat_0=-90 +lon_0=0 +x_0=0 +y_0=0 +datum=WGS84 +units=m +no_defs' },
};

export const GEOGRAPHIC = 'EPSG:4326';

/** Forward and inverse functions of a plane, WGS 84 degrees on the other side. */
export interface Plane {
  toPlane: ToPlane;
  toLonLat: (x: number, y: number) => readonly [number, number] | null;
}

const cache = new Map<string, Plane>();

export function planeOf(def: string): Plane {
  const hit = cache.get(def);
  if (hit) return hit;
  let plane: Plane;
  if (def === GEOGRAPHIC) {
    plane = { toPlane: (lon, lat) => [lon, lat], toLonLat: (x, y) => [x, y] };
  } else {
    const conv = proj4(GEOGRAPHIC, def);
    const finite = (p: number[]): readonly [number, number] | null => (Number.isFinite(p[0]) && Number.isFinite(p[1]) ? [p[0] as number, p[1] as number] : null);
    plane = {
      toPlane: (lon, lat) => finite(conv.forward([lon, lat])),
      toLonLat: (x, y) => finite(conv.inverse([x, y])),
    };
  }
  cache.set(def, plane);
  return plane;
}

// --- WKT -------------------------------------------------------------------------------------

interface WktNode {
  name: string;
  args: (string | number | WktNode)[];
}

/** A small WKT1 parser: KEYWORD[ "text" | number | KEYWORD[...] , ... ]. */
export function parseWkt(text: string): WktNode {
  let i = 0;
  const s = text.trim();
  const ws = () => {
    while (i < s.length && /\s/.test(s[i] as string)) i++;
  };
  const node = (): WktNode => {
    ws();
    const m = /^[A-Za-z_][A-Za-z0-9_]*/.exec(s.slice(i));
    if (!m) refuse(`the .prj file is not WKT: expected a keyword at character ${i + 1}`);
    i += m[0].length;
    ws();
    const open = s[i];
    if (open !== '[' && open !== '(') refuse(`the .prj file is not WKT: expected "[" after ${m[0]} at character ${i + 1}`);
    const close = open === '[' ? ']' : ')';
    i++;
    const args: WktNode['args'] = [];
    for (;;) {
      ws();
      const c = s[i];
      if (c === undefined) refuse(`the .prj file is not WKT: ${m[0]} is not closed`);
      if (c === close) {
        i++;
        break;
      }
      if (c === ',') {
        i++;
        continue;
      }
      if (c === '"') {
        const end = s.indexOf('"', i + 1);
        if (end < 0) refuse('the .prj file is not WKT: a quoted name is not closed');
        args.push(s.slice(i + 1, end));
        i = end + 1;
      } else if (/[-+0-9.]/.test(c)) {
        const n = /^[-+]?[0-9.]+(?:[eE][-+]?\d+)?/.exec(s.slice(i));
        if (!n) refuse(`the .prj file is not WKT: bad number at character ${i + 1}`);
        args.push(Number(n[0]));
        i += n[0].length;
      } else args.push(node());
    }
    return { name: m[0].toUpperCase(), args };
  };
  return node();
}

const child = (n: WktNode, name: string): WktNode | undefined => n.args.find((a): a is WktNode => typeof a === 'object' && a.name === name);

function parameters(n: WktNode): Map<string, number> {
  const out = new Map<string, number>();
  for (const a of n.args) if (typeof a === 'object' && a.name === 'PARAMETER' && typeof a.args[0] === 'string' && typeof a.args[1] === 'number') out.set(a.args[0].toLowerCase(), a.args[1]);
  return out;
}

function ellipsoidOf(geog: WktNode | undefined): string {
  const datum = geog ? child(geog, 'DATUM') : undefined;
  const sph = datum ? child(datum, 'SPHEROID') : undefined;
  const a = sph?.args[1];
  const rf = sph?.args[2];
  if (typeof a !== 'number' || typeof rf !== 'number' || !(a > 6_000_000 && a < 7_000_000)) refuse('the .prj file names no usable SPHEROID (semi-major axis and inverse flattening)');
  return rf === 0 ? `+a=${a} +b=${a}` : `+a=${a} +rf=${rf}`;
}

/** The EPSG code of a WKT's outermost AUTHORITY, if any. */
function authorityCode(n: WktNode): number | null {
  const auth = child(n, 'AUTHORITY');
  return auth && String(auth.args[0]).toUpperCase() === 'EPSG' ? Number(auth.args[1]) : null;
}

/**
 * The proj4 definition of a chart's .prj (WKT1, OGC or ESRI flavour). Refuses, naming it, a
 * projection outside the supported families.
 */
export function wktToProj4(text: string): { def: string; geographic: boolean; name: string } {
  const root = parseWkt(text);
  if (root.name === 'GEOGCS') return { def: GEOGRAPHIC, geographic: true, name: String(root.args[0] ?? 'geographic') };
  if (root.name !== 'PROJCS') refuse(`the .prj file describes ${root.name}, not a projected (PROJCS) or geographic (GEOGCS) system`);
  const code = authorityCode(root);
  const known = code === null ? undefined : KNOWN_GRID_CRS[code];
  if (known) return { def: known.proj4, geographic: false, name: known.name };
  const name = String(root.args[0] ?? 'unnamed');
  const projection = String(child(root, 'PROJECTION')?.args[0] ?? '').toLowerCase();
  const p = parameters(root);
  const get = (...keys: string[]): number | undefined => {
    for (const k of keys) if (p.has(k)) return p.get(k);
    return undefined;
  };
  const unit = child(root, 'UNIT')?.args[1];
  const toMetre = typeof unit === 'number' ? unit : 1;
  const ell = ellipsoidOf(child(root, 'GEOGCS'));
  const x0 = (get('false_easting') ?? 0) * toMetre;
  const y0 = (get('false_northing') ?? 0) * toMetre;
  const lon0 = get('central_meridian', 'longitude_of_center', 'longitude_of_origin', 'straight_vertical_longitude_from_pole') ?? 0;
  const tail = `+x_0=${x0} +y_0=${y0} ${ell} +units=m +to_meter=${toMetre} +no_defs`.replace(' +to_meter=1 ', ' ');
  let def: string;
  if (projection.includes('stereographic') && (projection.includes('polar') || projection.includes('pole'))) {
    const south = projection.includes('south');
    const ts = get('standard_parallel_1', 'latitude_of_origin', 'latitude_of_true_scale');
    const north = !south && (ts === undefined || ts >= 0);
    if (ts !== undefined && Math.abs(ts) !== 90) def = `+proj=stere +lat_0=${north ? 90 : -90} +lat_ts=${ts} +lon_0=${lon0} ${tail}`;
    else def = `+proj=stere +lat_0=${north ? 90 : -90} +lon_0=${lon0} +k_0=${get('scale_factor') ?? 1} ${tail}`;
  } else if (projection.includes('lambert_conformal_conic')) {
    const s1 = get('standard_parallel_1');
    const s2 = get('standard_parallel_2') ?? s1;
    const lat0 = get('latitude_of_origin', 'latitude_of_center') ?? s1 ?? 0;
    if (s1 === undefined) refuse('the .prj file gives a Lambert conformal conic projection without standard_parallel_1');
    def = `+proj=lcc +lat_1=${s1} +lat_2=${s2} +lat_0=${lat0} +lon_0=${lon0} +k_0=${get('scale_factor') ?? 1} ${tail}`;
  } else if (projection.includes('lambert_azimuthal_equal_area')) {
    const lat0 = get('latitude_of_origin', 'latitude_of_center') ?? 90;
    def = `+proj=laea +lat_0=${lat0} +lon_0=${lon0} ${tail}`;
  } else {
    refuse(`the chart's projection "${String(child(root, 'PROJECTION')?.args[0] ?? 'none')}" is not supported (polar stereographic, Lambert conformal conic, Lambert azimuthal equal-area or geographic)`);
  }
  return { def, geographic: false, name };
}

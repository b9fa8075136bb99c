import { describe, expect, it } from 'vitest';
import { KNOWN_GRID_CRS, planeOf, wktToProj4 } from '../../src/iceinfo/projections';

const lonLat = (code: number, x: number, y: number) => planeOf((KNOWN_GRID_CRS[code] as { proj4: string }).proj4).toLonLat(x, y) as [number, number];
const normLon = (l: number) => ((((l + 180) % 360) + 360) % 360) - 180;

describe('NSIDC polar stereographic grids', () => {
  // Corner coordinates of the 25 km grids (outer edges of the corner cells), NSIDC "Polar
  // Stereographic Projections and Grids" documentation, table of grid corners (values from memory,
  // to 0.01 degree): North x -3850..3750 km, y 5850..-5350 km; South x -3950..3950 km,
  // y 4350..-3950 km. The documented products use the Hughes 1980 ellipsoid (EPSG:3411/3412).
  const north: [number, number, number, number][] = [
    [-3850e3, 5850e3, 30.98, 168.35],
    [3750e3, 5850e3, 31.37, 102.34],
    [3750e3, -5350e3, 34.35, -9.97],
    [-3850e3, -5350e3, 33.92, -80.74],
  ];
  const south: [number, number, number, number][] = [
    [-3950e3, 4350e3, -39.23, -42.24],
    [3950e3, 4350e3, -39.23, 42.24],
    [3950e3, -3950e3, -41.45, 135.0],
    [-3950e3, -3950e3, -41.45, -135.0],
  ];
  it.each(north)('north corner (%d, %d) is at %f N %f E (EPSG:3411)', (x, y, lat, lon) => {
    const [l, p] = lonLat(3411, x, y);
    expect(p).toBeCloseTo(lat, 2);
    expect(normLon(l)).toBeCloseTo(lon, 2);
  });
  it.each(south)('south corner (%d, %d) is at %f N %f E (EPSG:3412)', (x, y, lat, lon) => {
    const [l, p] = lonLat(3412, x, y);
    expect(p).toBeCloseTo(lat, 2);
    expect(normLon(l)).toBeCloseTo(lon, 2);
  });
  it('EPSG:3413 and 3411 differ only by the ellipsoid (within 0.01 degree at the corners)', () => {
    const [l1, p1] = lonLat(3413, -3850e3, 5850e3);
    expect(p1).toBeCloseTo(30.98, 1);
    expect(normLon(l1)).toBeCloseTo(168.35, 1);
  });
  it('the pole is the origin, and 45 W runs down the negative y axis (EPSG:3413, lon_0 = -45)', () => {
    const to = planeOf((KNOWN_GRID_CRS[3413] as { proj4: string }).proj4).toPlane;
    const [x, y] = to(0, 90) as [number, number];
    expect(Math.hypot(x, y)).toBeLessThan(1e-6);
    const [x2, y2] = to(-45, 70) as [number, number];
    expect(Math.abs(x2)).toBeLessThan(1e-6);
    expect(y2).toBeLessThan(0);
  });
});

describe('Snyder 1987 worked example (USGS Professional Paper 1395, polar stereographic, ellipsoid)', () => {
  it('International ellipsoid, true scale at 71 S, central meridian 100 W: 75 S 150 E', () => {
    // Snyder's numerical example: x = -1,540,033.6 m, y = -560,526.4 m (values from memory).
    const p = planeOf('+proj=stere +lat_0=-90 +lat_ts=-71 +lon_0=-100 +ellps=intl +units=m +no_defs').toPlane(150, -75) as [number, number];
    expect(p[0]).toBeCloseTo(-1540033.6, 0);
    expect(p[1]).toBeCloseTo(-560526.4, 0);
  });
});

describe('EASE-Grid 2.0 (EPSG:6931 / 6932, Lambert azimuthal equal-area)', () => {
  it('puts the equator at sqrt(2) x the authalic radius from the pole', () => {
    // Snyder 1987, polar aspect of the ellipsoidal LAEA: rho = a sqrt(qp - q); at the equator q = 0
    // so rho = sqrt(2) R_q, with the WGS 84 authalic radius R_q = 6,371,007.181 m (from memory).
    const rho = Math.SQRT2 * 6371007.181;
    const n = planeOf((KNOWN_GRID_CRS[6931] as { proj4: string }).proj4).toPlane(0, 0) as [number, number];
    expect(n[0]).toBeCloseTo(0, 3);
    expect(n[1]).toBeCloseTo(-rho, 0);
    const s = planeOf((KNOWN_GRID_CRS[6932] as { proj4: string }).proj4).toPlane(90, 0) as [number, number];
    expect(Math.hypot(s[0], s[1])).toBeCloseTo(rho, 0);
  });
  it('is equal-area: the 25 km cell at the pole and one at 60 N cover the same ground (within 0.1 %)', () => {
    // Area of a small lon/lat box on the WGS 84 ellipsoid is compared through the inverse: the
    // same 1 km x 1 km plane square maps to the same ellipsoidal area wherever it lies (equal-area).
    const inv = planeOf((KNOWN_GRID_CRS[6931] as { proj4: string }).proj4).toLonLat;
    const area = (x: number, y: number) => {
      // Spherical approximation of the cell's ground area from its corners (good to ~0.3 %).
      const [l0, p0] = inv(x, y) as [number, number];
      const [l1, p1] = inv(x + 1000, y) as [number, number];
      const [l2, p2] = inv(x, y + 1000) as [number, number];
      const k = Math.PI / 180;
      const e = [(l1 - l0) * Math.cos(p0 * k), p1 - p0];
      const f = [(l2 - l0) * Math.cos(p0 * k), p2 - p0];
      return Math.abs(e[0]! * f[1]! - e[1]! * f[0]!);
    };
    const a1 = area(100_000, 100_000);
    const a2 = area(0, -3_300_000);
    expect(Math.abs(a1 / a2 - 1)).toBeLessThan(0.01);
  });
});

describe('.prj WKT to proj4', () => {
  const sameAs = (a: string, b: string, lon: number, lat: number) => {
    const p = planeOf(a).toPlane(lon, lat) as [number, number];
    const q = planeOf(b).toPlane(lon, lat) as [number, number];
    expect(p[0]).toBeCloseTo(q[0], 3);
    expect(p[1]).toBeCloseTo(q[1], 3);
  };
  it('reads OGC polar stereographic WKT with an EPSG authority as the registry definition', () => {
    // WKT of EPSG:3413 as the EPSG registry prints it (OGC WKT 1; from memory).
    const wkt = 'PROJCS["WGS 84 / NSIDC Sea Ice Polar Stereographic North",GEOGCS["WGS 84",DATUM["WGS_1984",SPHEROID["WGS 84",6378137,298.257223563]],PRIMEM["Greenwich",0],UNIT["degree",0.0174532925199433]],PROJECTION["Polar_Stereographic"],PARAMETER["latitude_of_origin",70],PARAMETER["central_meridian",-45],PARAMETER["scale_factor",1],PARAMETER["false_easting",0],PARAMETER["false_northing",0],UNIT["metre",1],AUTHORITY["EPSG","3413"]]';
    expect(wktToProj4(wkt).def).toBe(KNOWN_GRID_CRS[3413]?.proj4);
    // The same without the authority is translated from its parameters.
    const bare = wkt.replace(',AUTHORITY["EPSG","3413"]', '');
    sameAs(wktToProj4(bare).def, KNOWN_GRID_CRS[3413]!.proj4, 10, 75);
  });
  it('reads ESRI polar stereographic WKT (proj4 alone misplaces it)', () => {
    const esri = 'PROJCS["Ice_Chart_North",GEOGCS["GCS_WGS_1984",DATUM["D_WGS_1984",SPHEROID["WGS_1984",6378137.0,298.257223563]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]],PROJECTION["Stereographic_North_Pole"],PARAMETER["False_Easting",0.0],PARAMETER["False_Northing",0.0],PARAMETER["Central_Meridian",-45.0],PARAMETER["Standard_Parallel_1",70.0],UNIT["Meter",1.0]]';
    sameAs(wktToProj4(esri).def, KNOWN_GRID_CRS[3413]!.proj4, 10, 75);
    sameAs(wktToProj4(esri).def, KNOWN_GRID_CRS[3413]!.proj4, -170, 62);
  });
  it('reads Lambert conformal conic and geographic WKT', () => {
    const lcc = 'PROJCS["Chart_Lambert",GEOGCS["GCS_WGS_1984",DATUM["D_WGS_1984",SPHEROID["WGS_1984",6378137.0,298.257223563]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]],PROJECTION["Lambert_Conformal_Conic"],PARAMETER["False_Easting",0.0],PARAMETER["False_Northing",0.0],PARAMETER["Central_Meridian",-100.0],PARAMETER["Standard_Parallel_1",49.0],PARAMETER["Standard_Parallel_2",77.0],PARAMETER["Latitude_Of_Origin",40.0],UNIT["Meter",1.0]]';
    sameAs(wktToProj4(lcc).def, '+proj=lcc +lat_1=49 +lat_2=77 +lat_0=40 +lon_0=-100 +x_0=0 +y_0=0 +datum=WGS84 +units=m', -80, 60);
    // LCC: the scale is true on both standard parallels, so a meridian arc there has its ground
    // length (Snyder 1987: k = 1 on the standard parallels). 0.01 degree of latitude at 49 N on
    // WGS 84 is 1112.2 m (meridian radius of curvature, about 6,372.5 km there; computed, not from a table).
    const to = planeOf(wktToProj4(lcc).def).toPlane;
    const a = to(-100, 49) as [number, number];
    const b = to(-100, 49.01) as [number, number];
    expect(Math.hypot(b[0] - a[0], b[1] - a[1])).toBeCloseTo(1112.2, 0);
    const geo = 'GEOGCS["GCS_WGS_1984",DATUM["D_WGS_1984",SPHEROID["WGS_1984",6378137,298.257223563]],PRIMEM["Greenwich",0],UNIT["Degree",0.017453292519943295]]';
    expect(wktToProj4(geo)).toMatchObject({ def: 'EPSG:4326', geographic: true });
  });
  it('refuses an unsupported projection by name, and text that is no WKT', () => {
    const merc = 'PROJCS["World_Mercator",GEOGCS["GCS_WGS_1984",DATUM["D_WGS_1984",SPHEROID["WGS_1984",6378137.0,298.257223563]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]],PROJECTION["Mercator"],PARAMETER["Central_Meridian",0.0],UNIT["Meter",1.0]]';
    expect(() => wktToProj4(merc)).toThrow(/"Mercator" is not supported/);
    expect(() => wktToProj4('hello')).toThrow(/not WKT/);
  });
});

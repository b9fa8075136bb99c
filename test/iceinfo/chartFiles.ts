// Ice charts for the tests, written with the shapefile format's own writer (@mapbox/shp-write)
// and as GeoJSON: an invented chart of our own scenario with known polygons and attributes.
import * as shpwrite from '@mapbox/shp-write';
import { unzipSync, zipSync } from 'fflate';
import type { FeatureCollection, Position } from 'geojson';
import { KNOWN_GRID_CRS, planeOf } from '../../src/iceinfo/projections';

/** EPSG:3413 in OGC WKT 1 as the EPSG registry prints it (from memory), with its authority. */
export const WKT_3413 =
  'PROJCS["WGS 84 / NSIDC Sea Ice Polar Stereographic North",GEOGCS["WGS 84",DATUM["WGS_1984",SPHEROID["WGS 84",6378137,298.257223563]],PRIMEM["Greenwich",0],UNIT["degree",0.0174532925199433]],PROJECTION["Polar_Stereographic"],PARAMETER["latitude_of_origin",70],PARAMETER["central_meridian",-45],PARAMETER["scale_factor",1],PARAMETER["false_easting",0],PARAMETER["false_northing",0],UNIT["metre",1],AUTHORITY["EPSG","3413"]]';

const box = (w: number, s: number, e: number, n: number): Position[][] => [[[w, s], [e, s], [e, n], [w, n], [w, s]]];

/**
 * Three polygons in longitude/latitude: pack ice 10-20 E 78-80 N (CT 92, SA 93 thick first-year),
 * open water beside it 20-30 E (POLY_TYPE W, CT 01), and 4-6/10 young ice across the antimeridian
 * 170 E to 170 W, 70-72 N (CT 46, SA 83), written with longitudes 170..190.
 */
export function chartGeoJson(): FeatureCollection {
  return {
    type: 'FeatureCollection',
    features: [
      { type: 'Feature', properties: { POLY_TYPE: 'I', CT: '92', CA: '', SA: '93', FA: '05', CB: '', SB: '', FB: '' }, geometry: { type: 'Polygon', coordinates: box(10, 78, 20, 80) } },
      { type: 'Feature', properties: { POLY_TYPE: 'W', CT: '01', CA: '', SA: '', FA: '', CB: '', SB: '', FB: '' }, geometry: { type: 'Polygon', coordinates: box(20, 78, 30, 80) } },
      { type: 'Feature', properties: { POLY_TYPE: 'I', CT: '46', CA: '', SA: '83', FA: '02', CB: '', SB: '', FB: '' }, geometry: { type: 'Polygon', coordinates: box(170, 70, 190, 72) } },
    ],
  };
}

/** The same chart's first two polygons in the EPSG:3413 plane (corners projected, edges straight there). */
export function chartGeoJson3413(): FeatureCollection {
  const to = planeOf(KNOWN_GRID_CRS[3413]!.proj4).toPlane;
  const fc = chartGeoJson();
  fc.features = fc.features.slice(0, 2).map((f) => ({
    ...f,
    geometry: { type: 'Polygon', coordinates: (f.geometry as { coordinates: Position[][] }).coordinates.map((r) => r.map(([lon, lat]) => [...(to(lon as number, lat as number) as [number, number])])) },
  }));
  return fc;
}

export async function shapefileZip(fc: FeatureCollection, prj?: string): Promise<Uint8Array> {
  const zipped = (await shpwrite.zip(fc, { outputType: 'uint8array', compression: 'STORE' } as never)) as unknown as Uint8Array;
  if (!prj) return zipped;
  const files = unzipSync(zipped);
  const name = Object.keys(files).find((n) => n.endsWith('.prj')) as string;
  files[name] = new TextEncoder().encode(prj);
  return zipSync(files);
}

/** Replaces one file of a zip (by extension) through a function of its bytes. */
export function patchZip(zip: Uint8Array, ext: string, patch: (b: Uint8Array) => Uint8Array): Uint8Array {
  const files = unzipSync(zip);
  const name = Object.keys(files).find((n) => n.toLowerCase().endsWith(ext)) as string;
  files[name] = new Uint8Array(patch(files[name] as Uint8Array));
  return zipSync(files);
}

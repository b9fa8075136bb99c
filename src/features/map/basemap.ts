// The bundled basemap data. The coarse Natural Earth land (1:110m, about 20 kB gzip) is in the
// JavaScript so the map draws at once and offline; the fine land (1:50m, about 170 kB gzip) is
// a separate asset the map worker fetches and fixes, so it neither weighs on the app's
// JavaScript nor blocks the main thread. (The offline cache must hold that asset too.)
import type { FeatureCollection, MultiLineString, MultiPolygon } from 'geojson';
import type { Topology } from 'topojson-specification';
import land110 from 'world-atlas/land-110m.json';
import { landFromTopology } from './land';
import { graticuleLines } from './graticule';

let coarse: { land: FeatureCollection<MultiPolygon>; coast: FeatureCollection<MultiLineString> } | null = null;

export function coarseLand(): { land: FeatureCollection<MultiPolygon>; coast: FeatureCollection<MultiLineString> } {
  coarse ??= landFromTopology(land110 as unknown as Topology);
  return coarse;
}

let graticule: ReturnType<typeof graticuleLines> | null = null;

export function graticuleData(): ReturnType<typeof graticuleLines> {
  graticule ??= graticuleLines();
  return graticule;
}

/**
 * Absolute URL of the fine land topology, for the worker to fetch. Written as `new URL` on the
 * file (not a `?url` import) so the bundler emits it as an asset and tests that merely import
 * this module never load it.
 */
export function fineLandUrl(): string {
  return new URL('../../../node_modules/world-atlas/land-50m.json', import.meta.url).href;
}

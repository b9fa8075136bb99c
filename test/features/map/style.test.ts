// The offline style: valid against the MapLibre style specification (its own validator), no
// network URL anywhere, the layers the issue asks for, and the filters shared with the list.
import { describe, expect, it } from 'vitest';
import { validateStyleMin } from '@maplibre/maplibre-gl-style-spec';
import type { FeatureCollection } from 'geojson';
import { buildStyle, eggFilter, observationLayerFilter, CLUSTER_MAX_ZOOM, EGG_MIN_ZOOM, FINE_LAND_ZOOM, LAYER, observationFilter, PALETTES, SRC } from '../../../src/features/map/style';
import { BAND_RANK } from '../../../src/features/map/geojson';
import { graticuleFilter, graticuleLabels, graticuleLines, graticuleStep, graticuleSteps, formatLat, formatLon, GRATICULE_LEVELS, MAX_LABELS, scaleZoom } from '../../../src/features/map/graticule';

const empty: FeatureCollection = { type: 'FeatureCollection', features: [] };
const style = buildStyle({ theme: 'day', projection: 'globe', land110: empty, coast110: empty, graticule: graticuleLines() });

describe('offline style', () => {
  it('validates against the MapLibre style specification', () => {
    expect(validateStyleMin(style)).toEqual([]);
    for (const theme of ['night', 'red'] as const) {
      expect(validateStyleMin(buildStyle({ theme, projection: 'mercator', land110: empty, coast110: empty, graticule: empty }))).toEqual([]);
    }
  });

  it('needs no network: no glyphs, no sprite, no URL in any source, no text layers', () => {
    expect(style.glyphs).toBeUndefined();
    expect(style.sprite).toBeUndefined();
    expect(JSON.stringify(style)).not.toMatch(/https?:|mapbox:|\{z\}/);
    for (const l of style.layers) if (l.type === 'symbol') expect(l.layout && 'text-field' in l.layout).toBe(false);
  });

  it('draws the coarse land at small zooms and the fine land at larger ones, coastlines from line sources', () => {
    const byId = new Map(style.layers.map((l) => [l.id, l]));
    expect(byId.get('land-coarse')).toMatchObject({ type: 'fill', source: SRC.land110, maxzoom: FINE_LAND_ZOOM });
    expect(byId.get('land-fine')).toMatchObject({ type: 'fill', source: SRC.land50, minzoom: FINE_LAND_ZOOM });
    expect(byId.get('coast-coarse')).toMatchObject({ type: 'line', source: SRC.coast110 });
    expect(byId.get('coast-fine')).toMatchObject({ type: 'line', source: SRC.coast50 });
    // No polygon outline: it would draw the seam on the globe.
    expect(byId.get('land-coarse')).toMatchObject({ paint: { 'fill-antialias': false } });
    expect(style.layers[0]).toMatchObject({ type: 'background', paint: { 'background-color': PALETTES.day.ocean } });
    expect(style.projection).toEqual({ type: 'globe' });
  });

  it('keys observations by id for feature state, colours them by band and draws egg codes from a zoom', () => {
    expect(style.sources[SRC.observations]).toMatchObject({ type: 'geojson', promoteId: 'id' });
    const obs = style.layers.find((l) => l.id === LAYER.observations);
    // By day the disc colours are the WMO/TD-No. 1215 total-concentration colours, by band.
    const colour = (obs?.paint as Record<string, unknown>)['circle-color'] as unknown[];
    expect(colour.slice(0, 2)).toEqual(['match', ['get', 'band']]);
    const pairs = new Map<unknown, unknown>();
    for (let i = 2; i + 1 < colour.length; i += 2) pairs.set(colour[i], colour[i + 1]);
    expect(pairs.get('c4-6')).toBe('#ffff00'); // WMO/TD-No. 1215: 4-6/10 yellow 255,255,0
    expect(pairs.get('c7-8')).toBe('#ff7d07'); // WMO/TD-No. 1215: 7-8/10 orange 255,125,7
    expect(pairs.get('ice-free')).toBe('#0064ff'); // WMO/TD-No. 1215: ice free 0,100,255
    expect(JSON.stringify(obs)).toContain('feature-state');
    expect(style.layers.find((l) => l.id === LAYER.egg)).toMatchObject({ type: 'symbol', minzoom: EGG_MIN_ZOOM, layout: { 'icon-image': ['get', 'egg'] } });
    // The egg codes have a source of their own, fed only from their zoom on.
    expect(style.layers.find((l) => l.id === LAYER.egg)).toMatchObject({ source: SRC.eggs });
    // Small zooms group close observations; a group takes the colour of its highest band
    // (WMO/TD-No. 1215 colours: 9-10/10 red, 255,0,0).
    expect(style.sources[SRC.observations]).toMatchObject({ cluster: true, clusterMaxZoom: CLUSTER_MAX_ZOOM, clusterProperties: { rank: ['max', ['get', 'rank']] } });
    const groups = style.layers.find((l) => l.id === LAYER.clusters);
    expect(JSON.stringify(groups)).toContain(`${BAND_RANK.indexOf('c9-10')},"#ff0000"`);
    const order = style.layers.map((l) => l.id);
    expect(order.indexOf(LAYER.clusters)).toBeLessThan(order.indexOf(LAYER.observations));
    expect(order.indexOf(LAYER.miz)).toBeLessThan(order.indexOf(LAYER.observations));
    expect(order.indexOf('land-fine')).toBeLessThan(order.indexOf(LAYER.observations));
  });
});

describe('observation filters', () => {
  it('builds time and observer filters', () => {
    expect(observationFilter({ fromMs: null, toMs: null, observerIds: [] })).toBeNull();
    expect(observationFilter({ fromMs: 5, toMs: null, observerIds: [] })).toEqual(['>=', ['get', 't'], 5]);
    expect(observationFilter({ fromMs: 5, toMs: 9, observerIds: ['a'] })).toEqual([
      'all', ['>=', ['get', 't'], 5], ['<=', ['get', 't'], 9], ['in', ['get', 'observerId'], ['literal', ['a']]],
    ]);
    // Observations beyond the Mercator limit are left to the polar overlay.
    const notPolar = ['!=', ['get', 'polar'], true];
    expect(eggFilter({ fromMs: null, toMs: null, observerIds: [] })).toEqual(['all', ['!=', ['get', 'egg'], ''], notPolar]);
    // Groups of observations (point_count) have their own layer.
    const single = ['!', ['has', 'point_count']];
    expect(observationLayerFilter({ fromMs: null, toMs: null, observerIds: [] })).toEqual(['all', single, notPolar]);
    expect(observationLayerFilter({ fromMs: 1, toMs: null, observerIds: [] })).toEqual(['all', single, notPolar, ['>=', ['get', 't'], 1]]);
  });
});

describe('graticule', () => {
  it('spaces the lines by zoom', () => {
    expect([0, 1.9, 2, 4, 5.5, 6.5, 12].map(graticuleStep)).toEqual([30, 30, 10, 5, 2, 1, 1]);
  });

  it('spaces them by the ground scale: closer parallels and wider meridians towards the pole', () => {
    // Mercator and the globe both scale the centre by 1/cos(lat): at 60 degrees, twice.
    expect(scaleZoom(3, 60)).toBeCloseTo(4, 9);
    expect(scaleZoom(3, -60)).toBeCloseTo(4, 9);
    expect(graticuleSteps(1, 0)).toEqual({ lat: 30, lon: 30 });
    // At 85 N, zoom 1 shows what zoom 4.5 shows at the equator; a degree of longitude there is
    // cos(85) = 0.087 of a degree of latitude, so meridians go 30 degrees apart.
    expect(graticuleSteps(1, 85)).toEqual({ lat: 5, lon: 30 });
    expect(graticuleSteps(4, 70)).toEqual({ lat: 2, lon: 10 });
    expect(JSON.stringify(graticuleFilter({ lat: 5, lon: 30 }))).toBe(
      JSON.stringify(['any', ['all', ['==', ['get', 'kind'], 'lat'], ['<=', ['get', 'level'], 2]], ['all', ['==', ['get', 'kind'], 'lon'], ['<=', ['get', 'level'], 0]]]),
    );
  });

  it('tags each line with the coarsest spacing it belongs to', () => {
    const lines = graticuleLines().features;
    const meridian = (lon: number) => lines.find((f) => f.geometry.coordinates[0]?.[0] === lon && f.geometry.coordinates[1]?.[0] === lon);
    expect(meridian(0)?.properties.level).toBe(0);
    expect(meridian(-150)?.properties.level).toBe(0);
    expect(meridian(20)?.properties.level).toBe(1);
    expect(meridian(25)?.properties.level).toBe(2);
    expect(meridian(7)?.properties.level).toBe(GRATICULE_LEVELS.length - 1);
    expect(lines).toHaveLength(360 + 179);
  });

  it('labels with hemisphere letters', () => {
    expect([formatLat(80), formatLat(-75), formatLat(0)]).toEqual(['80°N', '75°S', '0°']);
    expect([formatLon(20), formatLon(-30), formatLon(180), formatLon(190), formatLon(0)]).toEqual(['20°E', '30°W', '180°', '170°W', '0°']);
  });

  it('makes labels for the lines in view only, and never too many', () => {
    const fc = graticuleLabels({ west: 0, south: 70, east: 30, north: 85 }, { lat: 5, lon: 5 });
    const texts = new Set(fc.features.map((f) => f.properties.text));
    expect(texts).toEqual(new Set(['70°N', '75°N', '80°N', '85°N', '0°', '5°E', '10°E', '15°E', '20°E', '25°E', '30°E']));
    for (const f of fc.features) {
      const [lon, lat] = f.geometry.coordinates as [number, number];
      expect(lon).toBeGreaterThanOrEqual(0);
      expect(lon).toBeLessThanOrEqual(35);
      expect(lat).toBeGreaterThanOrEqual(70);
    }
    expect(graticuleLabels({ west: -180, south: -89, east: 180, north: 89 }, { lat: 1, lon: 1 }).features.length).toBeLessThanOrEqual(MAX_LABELS);
  });
});

// The ice information layers on the MapLibre map: chart polygons (fill in the WMO/TD-No. 1215
// colours and outlines) and each grid as an image, all drawn under the marginal ice zone, the
// track and the observations. Kept apart from mapController so the controller only hands data.
import type { GeoJSONSource, Map as MapLibreMap } from 'maplibre-gl';
import type { ConcentrationGrid, IceChart } from '../../domain/collocation/chartModel';
import { ICEINFO_PALETTES } from './iceInfoColours';
import { chartFeatures, gridImage, type GridImage } from './iceInfoLayers';
import { LAYER, type MapTheme } from './style';

export const ICEINFO_SRC = { charts: 'iceinfo-charts' } as const;
export const ICEINFO_LAYER = { chartFill: 'iceinfo-chart-fill', chartLine: 'iceinfo-chart-line', gridPrefix: 'iceinfo-grid-' } as const;

async function blobUrl(img: GridImage): Promise<string> {
  const canvas = document.createElement('canvas');
  canvas.width = img.width;
  canvas.height = img.height;
  const ctx = canvas.getContext('2d');
  if (!ctx) throw new Error('no 2D canvas for the grid image');
  ctx.putImageData(new ImageData(new Uint8ClampedArray(img.rgba), img.width, img.height), 0, 0);
  const blob = await new Promise<Blob | null>((ok) => canvas.toBlob(ok, 'image/png'));
  if (!blob) throw new Error('the grid image could not be encoded');
  return URL.createObjectURL(blob);
}

export class IceInfoLayers {
  private charts: readonly IceChart[] = [];
  private grids: readonly ConcentrationGrid[] = [];
  private gridIds: string[] = [];
  private urls: string[] = [];
  private run = 0;

  constructor(
    private readonly map: MapLibreMap,
    private theme: MapTheme,
  ) {}

  private before(): string | undefined {
    return this.map.getLayer(LAYER.miz) ? LAYER.miz : undefined;
  }

  set(charts: readonly IceChart[], grids: readonly ConcentrationGrid[]): void {
    // The stored lists come back as new arrays after every change to their tables: redraw only
    // when the products themselves differ, and leave the map alone while there are none.
    const key = (xs: readonly (IceChart | ConcentrationGrid)[]) => xs.map((x) => `${x.id}@${x.importedAt}`).join('|');
    if (key(charts) === key(this.charts) && key(grids) === key(this.grids)) return;
    this.charts = charts;
    this.grids = grids;
    this.draw();
  }

  setTheme(theme: MapTheme): void {
    this.theme = theme;
    this.draw();
  }

  private draw(): void {
    const m = this.map;
    const p = ICEINFO_PALETTES[this.theme];
    const src = m.getSource(ICEINFO_SRC.charts) as GeoJSONSource | undefined;
    if (!src && this.charts.length === 0 && this.grids.length === 0 && this.gridIds.length === 0) return;
    const fc = chartFeatures(this.charts);
    if (src) src.setData(fc);
    else m.addSource(ICEINFO_SRC.charts, { type: 'geojson', data: fc });
    if (!m.getLayer(ICEINFO_LAYER.chartFill)) {
      m.addLayer({ id: ICEINFO_LAYER.chartFill, type: 'fill', source: ICEINFO_SRC.charts, paint: { 'fill-color': ['get', 'colour'], 'fill-opacity': p.chartOpacity, 'fill-antialias': false } }, this.before());
      m.addLayer({ id: ICEINFO_LAYER.chartLine, type: 'line', source: ICEINFO_SRC.charts, paint: { 'line-color': p.chartOutline, 'line-width': 1 } }, this.before());
    } else {
      m.setPaintProperty(ICEINFO_LAYER.chartFill, 'fill-opacity', p.chartOpacity);
      m.setPaintProperty(ICEINFO_LAYER.chartLine, 'line-color', p.chartOutline);
    }
    void this.drawGrids();
  }

  private async drawGrids(): Promise<void> {
    const run = ++this.run;
    const drawn = this.grids.flatMap((g) => {
      const img = gridImage(g, ICEINFO_PALETTES[this.theme]);
      return img ? [{ id: g.id, img }] : [];
    });
    const images = await Promise.all(drawn.map(async ({ id, img }) => ({ id, url: await blobUrl(img), coordinates: img.coordinates })));
    if (run !== this.run) {
      for (const i of images) URL.revokeObjectURL(i.url);
      return;
    }
    const m = this.map;
    for (const id of this.gridIds) {
      if (m.getLayer(ICEINFO_LAYER.gridPrefix + id)) m.removeLayer(ICEINFO_LAYER.gridPrefix + id);
      if (m.getSource(ICEINFO_LAYER.gridPrefix + id)) m.removeSource(ICEINFO_LAYER.gridPrefix + id);
    }
    for (const u of this.urls) URL.revokeObjectURL(u);
    this.gridIds = images.map((i) => i.id);
    this.urls = images.map((i) => i.url);
    for (const i of images) {
      m.addSource(ICEINFO_LAYER.gridPrefix + i.id, { type: 'image', url: i.url, coordinates: i.coordinates });
      // Grids go under the charts, so a chart's outlines stay readable over them.
      m.addLayer({ id: ICEINFO_LAYER.gridPrefix + i.id, type: 'raster', source: ICEINFO_LAYER.gridPrefix + i.id, paint: { 'raster-opacity': 0.85, 'raster-resampling': 'nearest' } }, ICEINFO_LAYER.chartFill);
    }
  }

  destroy(): void {
    this.run++;
    for (const u of this.urls) URL.revokeObjectURL(u);
  }
}

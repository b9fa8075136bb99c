// The imperative side of the map: one MapLibre instance, its sources fed only when their data
// changes, selection through feature state, filters as layer filters, images drawn on demand.
// React components (MapView.tsx) create one controller and call it; nothing else touches
// MapLibre.
import { importScriptInWorkers, Map as MapLibreMap, NavigationControl, ScaleControl, type GeoJSONSource, type MapGeoJSONFeature, type StyleImageMetadata } from 'maplibre-gl';
import 'maplibre-gl/dist/maplibre-gl.css';
import type { FeatureCollection } from 'geojson';
import type { Observation, Observer, TrackPoint } from '../../domain/model';
import { deriveEggCode, eggCodeDrawing } from '../../domain/eggCode';
import { coarseLand, fineLandUrl, graticuleData } from './basemap';
import { BANDS } from './concentrationBands';
import { observationZones, packObservations, shipFeature, featureCollection } from './geojson';
import { graticuleFilter, graticuleLabels, graticuleSteps } from './graticule';
import { eggImage, IMAGE_PIXEL_RATIO, markImage, shipImage, textImage, type RasterImage } from './mapImages';
import { bandSymbol, hasMarks } from './bandSymbols';
import type { BandKey } from './concentrationBands';
import { MapWorker, packTrack, type PreparedPair, type SourceData } from './mapWorkerClient';
import { beyondMercator, MERCATOR_LIMIT_LAT, type TrackArrays } from './trackLevels';
import { PolarOverlay, type PolarPoint } from './polarOverlay';
import { IceInfoLayers } from './iceInfoMap';
import type { ConcentrationGrid, IceChart } from '../../domain/collocation/chartModel';
import { buildStyle, EGG_MIN_ZOOM, eggFilter, LAYER, MARK_PREFIX, markImageRadius, observationLayerFilter, PALETTES, projectionSpec, SHIP_IMAGE, SRC, type MapTheme, type ObservationFilter, type ProjectionKind } from './style';
import { globeCamera, lonLatBounds, sample, type LonLat } from './view';
import workerPatchUrl from './maplibreWorkerPatch.ts?worker&url';

export interface MapControllerOptions {
  theme: MapTheme;
  projection: ProjectionKind;
  onSelect: (id: string | null) => void;
  /** Told when the map is idle (everything drawn) or busy again. */
  onState?: (state: 'loading' | 'idle' | 'busy') => void;
  /** Told when a prepared track has been handed to the map (benchmarks wait for it). */
  onTrackFed?: () => void;
}

export interface MapData {
  observations: readonly Observation[];
  observers: readonly Observer[];
  track: readonly TrackPoint[];
  /** Expected time between observations, which bounds the zone stretches. */
  intervalMinutes: number;
}

const EGG_PREFIX = 'egg:';
/** How far from a symbol a tap still selects it, in CSS pixels (a fingertip is about 10 mm). */
const TOUCH_SLOP_PX = 22;
const LABEL_PREFIX = 'lbl:';
/** How long blob: URLs of a removed map are kept, for a read MapLibre's worker had already begun. */
const RELEASE_GRACE_MS = 10_000;

/**
 * Loads maplibreWorkerPatch.ts into MapLibre's workers once per worker set (MapLibre keeps one
 * pool for every map of the page and may start it afresh when the last map goes).
 * Without it the map still works, only with the big GeoJSON documents parsed on the page.
 */
function patchMapLibreWorkers(): Promise<'ready' | 'failed'> {
  return importScriptInWorkers(new URL(workerPatchUrl, location.href).href).then(
    () => 'ready' as const,
    (e: unknown) => {
      console.warn('Floe Ledger: the map reads its data on the page (the worker helper did not load):', e);
      return 'failed' as const;
    },
  );
}

export class MapController {
  readonly map: MapLibreMap;
  private theme: MapTheme;
  private projection: ProjectionKind;
  private worker = new MapWorker();
  private loaded = false;
  /** Whether MapLibre's workers read blob URLs themselves (maplibreWorkerPatch.ts). */
  workerPatch: 'pending' | 'ready' | 'failed' = 'pending';
  private readonly workerPatchDone: Promise<unknown>;
  private pending: (() => void)[] = [];
  private observations = new Map<string, Observation>();
  private selected: string | null = null;
  private filter: ObservationFilter = { fromMs: null, toMs: null, observerIds: [] };
  private userMoved = false;
  /** Whether the 1:50m land arrived (else the 1:110m serves at every zoom). */
  fineLand: 'pending' | 'loaded' | 'failed' = 'pending';
  private graticuleKey = '';
  private cruiseId: string | null = null;
  private obsPositions: LonLat[] = [];
  private trackPositions: LonLat[] = [];
  private trackRun = 0;
  private obsRun = 0;
  /** The observation points last handed to MapLibre, and what the egg source has. */
  private obsData: SourceData | null = null;
  private eggData: SourceData | null = null;
  private packed: { track: readonly TrackPoint[]; arrays: Promise<TrackArrays> } | null = null;
  /** Frees the blob URLs last given to each pair of sources. */
  private releases = new Map<string, () => void>();
  private releaseWhenIdle: (() => void)[] = [];
  private destroyed = false;
  private overlay: PolarOverlay;
  private iceInfo: IceInfoLayers | null = null;

  constructor(container: HTMLElement, private readonly opts: MapControllerOptions) {
    this.theme = opts.theme;
    this.projection = opts.projection;
    const coarse = coarseLand();
    this.map = new MapLibreMap({
      container,
      style: buildStyle({ theme: this.theme, projection: this.projection, land110: coarse.land, coast110: coarse.coast, graticule: graticuleData() }),
      attributionControl: { compact: true, customAttribution: 'Land: Natural Earth (public domain), via world-atlas' },
      maxPitch: 0,
      dragRotate: false,
      pitchWithRotate: false,
      fadeDuration: 0,
    });
    // Started at once: it is done long before the style has loaded, and the sources are fed
    // only after both.
    this.workerPatchDone = patchMapLibreWorkers().then((state) => (this.workerPatch = state));
    this.map.touchZoomRotate.disableRotation();
    this.overlay = new PolarOverlay(this.map, PALETTES[this.theme], this.theme);
    this.overlay.setEnabled(this.projection === 'globe');
    this.map.addControl(new NavigationControl({ showCompass: false }), 'top-right');
    this.map.addControl(new ScaleControl({ unit: 'nautical', maxWidth: 140 }), 'bottom-left');
    this.map.addControl(new ScaleControl({ unit: 'metric', maxWidth: 140 }), 'bottom-left');
    opts.onState?.('loading');
    this.map.on('styleimagemissing', (e: { id: string }) => this.drawMissingImage(e.id));
    this.map.on('load', () => void this.workerPatchDone.then(() => this.onLoad()));
    this.map.on('idle', () => {
      for (const r of this.releaseWhenIdle.splice(0)) r();
      opts.onState?.('idle');
    });
    this.map.on('dataloading', () => opts.onState?.('busy'));
    this.map.on('movestart', (e: { originalEvent?: Event }) => {
      if (e.originalEvent) this.userMoved = true;
      opts.onState?.('busy');
    });
    this.map.on('moveend', () => {
      this.updateLabels();
      this.feedEggsInZoom();
    });
    this.map.on('click', (e) => this.selectAt(e.point.x, e.point.y, 2));
    // A finger (or a gloved one) covers far more than a symbol: a short tap that did not move
    // selects the nearest observation within a thumb's reach. MapLibre keeps touches for its
    // gestures, so a tap does not always arrive as a click.
    let touch: { x: number; y: number; t: number } | null = null;
    this.map.on('touchstart', (e) => {
      touch = e.points.length === 1 ? { x: e.point.x, y: e.point.y, t: performance.now() } : null;
    });
    this.map.on('touchend', (e) => {
      if (touch && Math.hypot(e.point.x - touch.x, e.point.y - touch.y) < 10 && performance.now() - touch.t < 600) this.selectAt(e.point.x, e.point.y, TOUCH_SLOP_PX);
      touch = null;
    });
    for (const layer of [LAYER.observations, LAYER.clusters]) {
      this.map.on('mouseenter', layer, () => (this.map.getCanvas().style.cursor = 'pointer'));
      this.map.on('mouseleave', layer, () => (this.map.getCanvas().style.cursor = ''));
    }
  }

  /** Selects the observation drawn nearest to a point, within `slop` CSS pixels of its symbol. */
  private selectAt(x: number, y: number, slop: number): void {
    const polar = this.overlay.hit(x, y);
    if (polar) return this.opts.onSelect(polar);
    const group = this.map.queryRenderedFeatures([[x - slop, y - slop], [x + slop, y + slop]], { layers: [LAYER.clusters] })[0] as MapGeoJSONFeature | undefined;
    if (group) return this.openGroup(group);
    const hits = this.map.queryRenderedFeatures([[x - slop, y - slop], [x + slop, y + slop]], { layers: [LAYER.observations] }) as MapGeoJSONFeature[];
    let best: { id: string; d: number } | null = null;
    for (const h of hits) {
      const id = h.properties?.id;
      if (typeof id !== 'string' || h.geometry.type !== 'Point') continue;
      const p = this.map.project(h.geometry.coordinates as [number, number]);
      const d = Math.hypot(p.x - x, p.y - y);
      if (!best || d < best.d) best = { id, d };
    }
    this.opts.onSelect(best?.id ?? null);
  }

  private onLoad(): void {
    if (this.destroyed) return;
    this.loaded = true;
    this.addShipImage();
    this.updateLabels();
    this.worker
      .land(fineLandUrl())
      .then((pair) => {
        // Never handed to MapLibre when the map went away meanwhile: free it at once.
        if (this.destroyed) pair.release();
        else
          this.whenLoaded(() => {
            this.feed(SRC.land50, SRC.coast50, pair);
            this.fineLand = 'loaded';
          });
      })
      // Without the fine land (e.g. offline before it was ever cached) the coarse land serves at every zoom.
      .catch(() =>
        this.whenLoaded(() => {
          this.useCoarseLandEverywhere();
          this.fineLand = 'failed';
        }),
      );
    const queued = this.pending;
    this.pending = [];
    for (const f of queued) f();
  }

  private whenLoaded(f: () => void): void {
    if (this.destroyed) return;
    if (this.loaded) f();
    else this.pending.push(f);
  }

  private source(id: string): GeoJSONSource | undefined {
    return this.map.getSource(id) as GeoJSONSource | undefined;
  }

  private feed(a: string, b: string, pair: PreparedPair): void {
    this.source(a)?.setData(pair.a as FeatureCollection | string);
    this.source(b)?.setData(pair.b as FeatureCollection | string);
    // MapLibre reads a blob URL once; the one this replaces may still be in flight, so it is
    // freed when the map is next idle, when every source has loaded.
    const previous = this.releases.get(a);
    if (previous) this.releaseWhenIdle.push(previous);
    this.releases.set(a, pair.release);
  }

  private useCoarseLandEverywhere(): void {
    this.map.setLayerZoomRange('land-coarse', 0, 24);
    this.map.setLayerZoomRange('coast-coarse', 0, 24);
  }

  private images(): { ink: string; paper: string; halo: string } {
    const p = PALETTES[this.theme];
    return { ink: this.theme === 'day' ? '#10161d' : p.track, paper: this.theme === 'day' ? '#ffffff' : p.ocean, halo: p.ocean };
  }

  private put(id: string, img: RasterImage | null): void {
    if (!img || this.map.hasImage(id)) return;
    const meta: Partial<StyleImageMetadata> = { pixelRatio: IMAGE_PIXEL_RATIO };
    this.map.addImage(id, img, meta);
  }

  private addShipImage(): void {
    if (this.map.hasImage(SHIP_IMAGE)) this.map.removeImage(SHIP_IMAGE);
    this.put(SHIP_IMAGE, shipImage(PALETTES[this.theme].ship, PALETTES[this.theme].ocean));
  }

  private drawMissingImage(id: string): void {
    const c = this.images();
    if (id.startsWith(EGG_PREFIX)) {
      const o = this.observations.get(id.slice(EGG_PREFIX.length));
      if (o) this.put(id, eggImage(eggCodeDrawing(deriveEggCode(o)), c.ink, c.paper));
    } else if (id.startsWith(MARK_PREFIX)) {
      this.put(id, markImage(bandSymbol(this.theme, id.slice(MARK_PREFIX.length) as BandKey), markImageRadius(this.theme)));
    } else if (id.startsWith(LABEL_PREFIX)) {
      this.put(id, textImage(id.slice(LABEL_PREFIX.length), PALETTES[this.theme].label, c.halo));
    }
  }

  /** Graticule spacing and labels for the current view (small: only what is in view). */
  private updateLabels(): void {
    if (!this.loaded) return;
    const b = this.map.getBounds();
    let west = b.getWest();
    let east = b.getEast();
    if (east - west >= 360 || this.poleInView()) {
      west = -180;
      east = 180;
    }
    const steps = graticuleSteps(this.map.getZoom(), this.map.getCenter().lat);
    // A new filter makes MapLibre re-cut the source's tiles: only when the spacing changes.
    const key = `${steps.lat}/${steps.lon}`;
    if (key !== this.graticuleKey) {
      this.graticuleKey = key;
      this.map.setFilter(LAYER.graticule, graticuleFilter(steps));
    }
    const fc = graticuleLabels({ west, east, south: b.getSouth(), north: b.getNorth() }, steps);
    for (const f of fc.features) f.properties.text = LABEL_PREFIX + f.properties.text;
    this.source(SRC.graticuleLabels)?.setData(fc);
  }

  private poleInView(): boolean {
    const { width, height } = this.map.getContainer().getBoundingClientRect();
    for (const lat of [90, -90]) {
      const p = this.map.project([0, lat]);
      if (p.x >= 0 && p.y >= 0 && p.x <= width && p.y <= height && this.projection === 'globe') return true;
    }
    return false;
  }

  /** Zooms in to where a group of observations comes apart. */
  private openGroup(group: MapGeoJSONFeature): void {
    const clusterId = group.properties?.cluster_id;
    const centre = group.geometry.type === 'Point' ? (group.geometry.coordinates as [number, number]) : null;
    const src = this.source(SRC.observations);
    if (typeof clusterId !== 'number' || !centre || !src) return;
    void src.getClusterExpansionZoom(clusterId).then(
      (zoom) => this.map.easeTo({ center: centre, zoom: Math.max(zoom, this.map.getZoom() + 1), duration: 400 }),
      () => this.map.easeTo({ center: centre, zoom: this.map.getZoom() + 2, duration: 400 }),
    );
  }

  /** Another cruise: the next data frames the view afresh. */
  setCruise(id: string | null): void {
    if (id === this.cruiseId) return;
    this.cruiseId = id;
    this.userMoved = false;
  }

  /**
   * New observations (the list changed): packed into columns here (one light loop), written as
   * GeoJSON by the map worker and read by MapLibre's worker from a URL, so no large object is
   * built or copied on the page. The egg images start afresh.
   */
  setObservations(observations: readonly Observation[], observers: readonly Observer[]): void {
    const run = ++this.obsRun;
    this.observations = new Map(observations.map((o) => [o.id, o]));
    const cols = packObservations(observations, observers);
    const positions: LonLat[] = new Array(cols.ids.length);
    const nearPole: PolarPoint[] = [];
    for (let i = 0; i < cols.ids.length; i++) {
      const lon = cols.lon[i] as number;
      const lat = cols.lat[i] as number;
      positions[i] = [lon, lat];
      // The overlay also redraws the map's own symbols just inside the limit, so its lines
      // (which end at the limit) never cover them.
      if (Math.abs(lat) > MERCATOR_LIMIT_LAT - 0.5) {
        const b = BANDS[cols.band[i] as number] as (typeof BANDS)[number];
        nearPole.push({ id: cols.ids[i] as string, lon, lat, band: b.key, t: cols.t[i] as number, observerId: cols.observerIds[cols.observer[i] as number] as string });
      }
    }
    this.obsPositions = positions;
    this.overlay.setPoints(nearPole);
    void this.worker.observations(cols).then((prepared) => {
      if (run !== this.obsRun || this.destroyed) return prepared.release();
      this.whenLoaded(() => {
        for (const id of this.map.listImages()) if (id.startsWith(EGG_PREFIX)) this.map.removeImage(id);
        this.source(SRC.observations)?.setData(prepared.data as FeatureCollection | string);
        const previous = this.releases.get(SRC.observations);
        if (previous) this.releaseWhenIdle.push(previous);
        this.releases.set(SRC.observations, prepared.release);
        this.obsData = prepared.data;
        this.feedEggsInZoom();
        if (this.selected) this.map.setFeatureState({ source: SRC.observations, id: this.selected }, { selected: true });
        this.frameOnce();
      });
    });
  }

  /**
   * The egg codes' source gets the points only once the map is at their zoom: below it the
   * layer is hidden anyway, and MapLibre would still index and tile every point for it.
   */
  private feedEggsInZoom(): void {
    if (this.obsData === null || this.eggData === this.obsData || this.map.getZoom() < EGG_MIN_ZOOM - 0.5) return;
    this.eggData = this.obsData;
    this.source(SRC.eggs)?.setData(this.obsData as FeatureCollection | string);
  }

  /** A new track: packed in slices here, simplified in the worker, handed to MapLibre as a URL. */
  async setTrack(data: MapData): Promise<void> {
    const run = ++this.trackRun;
    const ship = shipFeature(data.track, data.observations);
    const shipBeyond = ship !== null && beyondMercator(ship.geometry.coordinates[1] as number);
    this.overlay.setShip(ship && shipBeyond ? { lon: ship.geometry.coordinates[0] as number, lat: ship.geometry.coordinates[1] as number, heading: ship.properties.heading } : null);
    this.whenLoaded(() => this.source(SRC.ship)?.setData(featureCollection([shipBeyond ? null : ship])));
    this.trackPositions = sample(data.track, 500).map((p) => [p.lon, p.lat] as const);
    if (this.packed?.track !== data.track) this.packed = { track: data.track, arrays: packTrack(data.track) };
    const arrays = await this.packed.arrays;
    if (run !== this.trackRun || this.destroyed) return;
    // The worker takes over the copies; the packed arrays stay for the next run.
    const copy = { t: arrays.t.slice(), lon: arrays.lon.slice(), lat: arrays.lat.slice() };
    const pair = await this.worker.track(copy, observationZones(data.observations), data.intervalMinutes * 60_000);
    if (run !== this.trackRun || this.destroyed) return pair.release();
    this.whenLoaded(() => {
      this.feed(SRC.track, SRC.miz, pair);
      this.overlay.setParts(pair.polar ?? { track: [], miz: [] });
      this.opts.onTrackFed?.();
      this.frameOnce();
    });
  }

  setSelected(id: string | null, pan: boolean): void {
    this.whenLoaded(() => {
      if (this.selected && this.selected !== id) this.map.setFeatureState({ source: SRC.observations, id: this.selected }, { selected: false });
      this.selected = id;
      this.overlay.setSelected(id);
      if (id) {
        this.map.setFeatureState({ source: SRC.observations, id }, { selected: true });
        const o = this.observations.get(id);
        if (pan && o?.position) this.map.easeTo({ center: [o.position.lon, o.position.lat], duration: 300 });
      }
    });
  }

  setFilter(filter: ObservationFilter): void {
    this.filter = filter;
    this.overlay.setFilter((p) => (filter.fromMs === null || p.t >= filter.fromMs) && (filter.toMs === null || p.t <= filter.toMs) && (filter.observerIds.length === 0 || filter.observerIds.includes(p.observerId)));
    this.whenLoaded(() => {
      this.map.setFilter(LAYER.observations, observationLayerFilter(this.filter));
      this.map.setFilter(LAYER.marks, observationLayerFilter(this.filter));
      this.map.setFilter(LAYER.egg, eggFilter(this.filter));
    });
  }

  setProjection(kind: ProjectionKind): void {
    if (kind === this.projection) return;
    this.projection = kind;
    this.overlay.setEnabled(kind === 'globe');
    this.whenLoaded(() => {
      this.map.setProjection(projectionSpec(kind));
      this.frame();
    });
  }

  /** Charts and grids to draw under the observations (the visible ones only). */
  setIceInfo(charts: readonly IceChart[], grids: readonly ConcentrationGrid[]): void {
    this.whenLoaded(() => {
      this.iceInfo ??= new IceInfoLayers(this.map, this.theme);
      this.iceInfo.set(charts, grids);
    });
  }

  /** A theme change repaints: every paint property of the new theme's style is applied. */
  setTheme(theme: MapTheme): void {
    if (theme === this.theme) return;
    this.theme = theme;
    this.overlay.setPalette(PALETTES[theme], theme);
    this.whenLoaded(() => {
      this.iceInfo?.setTheme(theme);
      const style = buildStyle({ theme, projection: this.projection, land110: coarseLand().land, coast110: coarseLand().coast, graticule: graticuleData() });
      for (const layer of style.layers) {
        for (const [prop, value] of Object.entries(layer.paint ?? {})) this.map.setPaintProperty(layer.id, prop, value);
      }
      // The marks layer is the one whose layout differs between displays.
      this.map.setLayoutProperty(LAYER.marks, 'visibility', hasMarks(theme) ? 'visible' : 'none');
      for (const id of this.map.listImages()) if (id.startsWith(EGG_PREFIX) || id.startsWith(LABEL_PREFIX) || id.startsWith(MARK_PREFIX)) this.map.removeImage(id);
      this.addShipImage();
      this.updateLabels();
    });
  }

  /** Every position the cruise view should show: observations and a sample of the track. */
  positions(): LonLat[] {
    return [...this.obsPositions, ...this.trackPositions];
  }

  /** Frames the cruise as its data arrives, until the user moves the map themselves. */
  private frameOnce(): void {
    if (this.userMoved || this.positions().length === 0) return;
    this.frame();
  }

  /** Shows the whole cruise: on the globe by a camera computed on the sphere, in Mercator by its bounds. */
  frame(): void {
    const all = this.positions();
    if (!this.loaded || all.length === 0) return;
    const pts = sample(all, 2000);
    const { width, height } = this.map.getContainer().getBoundingClientRect();
    if (width === 0 || height === 0) return;
    if (this.projection === 'globe') {
      const cam = globeCamera(pts, { width, height }, 0.8);
      this.map.jumpTo({ center: [cam.center[0], cam.center[1]], zoom: cam.zoom, bearing: 0, pitch: 0 });
      this.refineFrame(pts, width, height);
    } else {
      const b = lonLatBounds(pts);
      if (!b) return;
      const clamp = (lat: number) => Math.max(-85, Math.min(85, lat));
      this.map.fitBounds([[b[0], clamp(b[1])], [b[2], clamp(b[3])]], { padding: Math.min(60, width / 8, height / 8), animate: false, maxZoom: 12 });
    }
  }

  /**
   * The camera as MapLibre actually draws it differs from the sphere's ideal (its perspective
   * enlarges the near side, and it keeps the centre off the pole): measure where the points land
   * on screen and correct the zoom and centre until they fill the view. Where the centre cannot
   * move further towards the pole, the zoom alone makes the off-centre cruise fit. (Padding
   * would re-centre the drawing, but MapLibre 5's globe then projects points a few pixels off.)
   */
  private refineFrame(pts: LonLat[], width: number, height: number): void {
    const measure = () => {
      const xy = pts.map((p) => this.map.project([p[0], p[1]]));
      const xs = xy.map((p) => p.x);
      const ys = xy.map((p) => p.y);
      const x0 = Math.min(...xs);
      const x1 = Math.max(...xs);
      const y0 = Math.min(...ys);
      const y1 = Math.max(...ys);
      const cx = width / 2;
      const cy = height / 2;
      return {
        ok: [x0, x1, y0, y1].every(Number.isFinite),
        box: { x0, x1, y0, y1 },
        // Scale that brings the farthest point on each side within 90 % of that half.
        scaleFromCentre: Math.min((cx * 0.9) / Math.max(1, cx - x0, x1 - cx), (cy * 0.9) / Math.max(1, cy - y0, y1 - cy)),
        scale: Math.min((width * 0.85) / Math.max(1, x1 - x0), (height * 0.85) / Math.max(1, y1 - y0)),
      };
    };
    let clamped = false;
    for (let i = 0; i < 6; i++) {
      const m = measure();
      if (!m.ok) return;
      const { x0, x1, y0, y1 } = m.box;
      const dx = (x0 + x1) / 2 - width / 2;
      const dy = (y0 + y1) / 2 - height / 2;
      const scale = clamped ? m.scaleFromCentre : m.scale;
      const centred = clamped || (Math.abs(dx) < width * 0.04 && Math.abs(dy) < height * 0.04);
      if (centred && scale > 0.9 && scale < 1.2) return;
      const zoom = this.map.getZoom() + Math.log2(Math.max(0.25, Math.min(4, scale)));
      if (clamped) {
        this.map.jumpTo({ zoom });
        continue;
      }
      const want = this.map.unproject([width / 2 + dx, height / 2 + dy]);
      this.map.jumpTo({ center: want, zoom });
      clamped = Math.abs(this.map.getCenter().lat - want.lat) > 0.01;
    }
  }

  destroy(): void {
    this.iceInfo?.destroy();
    this.destroyed = true;
    this.worker.dispose();
    this.overlay.destroy();
    // The last blob: URLs handed to setData may not have been read yet: MapLibre's worker fetches
    // them when it gets to the message, so freeing them here made leaving the map quickly log
    // "Failed to load resource: net::ERR_FILE_NOT_FOUND" per URL. Removing the map stops its
    // workers (terminated once no map is left); the URLs are freed after a grace period in which a
    // fetch already under way completes, so the data is held for seconds, not for the session.
    const left = [...this.releases.values(), ...this.releaseWhenIdle.splice(0)];
    this.releases.clear();
    this.map.remove();
    setTimeout(() => {
      for (const r of left) r();
    }, RELEASE_GRACE_MS);
  }
}

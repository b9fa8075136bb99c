// The map controller with MapLibre mocked (it cannot start under jsdom): data goes to the map
// only when it changes; selection uses feature state and filters use layer filters, never a
// data reload; egg codes are drawn from the domain's egg code (WMO-No. 259 fields) on demand.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import type { Observation } from '../../../src/domain/model';
import { deriveEggCode } from '../../../src/domain/eggCode';

type Handler = (e: unknown) => void;

const calls = vi.hoisted(() => ({ log: [] as { fn: string; args: unknown[] }[], maps: [] as unknown[] }));

vi.mock('maplibre-gl', () => {
  class FakeSource {
    constructor(private readonly id: string) {}
    setData(data: unknown) {
      calls.log.push({ fn: 'setData', args: [this.id, data] });
    }
  }
  class FakeMap {
    handlers = new Map<string, Handler[]>();
    images = new Set<string>();
    sources = new Map<string, FakeSource>();
    touchZoomRotate = { disableRotation: () => undefined };
    constructor(public options: { style: { sources: Record<string, unknown> } }) {
      for (const id of Object.keys(options.style.sources)) this.sources.set(id, new FakeSource(id));
      calls.maps.push(this);
    }
    on(type: string, a: Handler | string, b?: Handler) {
      const key = typeof a === 'string' ? `${type}:${a}` : type;
      const h = (typeof a === 'string' ? b : a) as Handler;
      this.handlers.set(key, [...(this.handlers.get(key) ?? []), h]);
      return this;
    }
    off() {
      return this;
    }
    fire(type: string, e: unknown = {}) {
      for (const h of this.handlers.get(type) ?? []) h(e);
    }
    addControl() {
      return this;
    }
    getSource(id: string) {
      return this.sources.get(id);
    }
    getCanvasContainer() {
      return document.createElement('div');
    }
    getCanvas() {
      return document.createElement('canvas');
    }
    getContainer() {
      const el = document.createElement('div');
      el.getBoundingClientRect = () => ({ width: 800, height: 600 }) as DOMRect;
      return el;
    }
    getBounds() {
      return { getWest: () => -10, getEast: () => 30, getSouth: () => 70, getNorth: () => 80 };
    }
    zoom = 4;
    getZoom() {
      return this.zoom;
    }
    getCenter() {
      return { lng: 10, lat: 75 };
    }
    project([x, y]: [number, number]) {
      return { x: 400 + x, y: 300 - y };
    }
    unproject([x, y]: [number, number]) {
      return { lng: x - 400, lat: 300 - y };
    }
    hasImage(id: string) {
      return this.images.has(id);
    }
    addImage(id: string, img: unknown) {
      this.images.add(id);
      calls.log.push({ fn: 'addImage', args: [id, img] });
    }
    removeImage(id: string) {
      this.images.delete(id);
    }
    listImages() {
      return [...this.images];
    }
    triggerRepaint() {}
    setFeatureState(target: unknown, state: unknown) {
      calls.log.push({ fn: 'setFeatureState', args: [target, state] });
    }
    setFilter(layer: string, filter: unknown) {
      calls.log.push({ fn: 'setFilter', args: [layer, filter] });
    }
    setPaintProperty() {}
    setProjection(p: unknown) {
      calls.log.push({ fn: 'setProjection', args: [p] });
    }
    setLayerZoomRange() {}
    jumpTo() {}
    easeTo(o: unknown) {
      calls.log.push({ fn: 'easeTo', args: [o] });
    }
    fitBounds() {}
    queryRenderedFeatures() {
      return [];
    }
    remove() {}
  }
  class Control {}
  return { Map: FakeMap, NavigationControl: Control, ScaleControl: Control, importScriptInWorkers: () => Promise.resolve([]) };
});

// Asset and worker imports are the bundler's; under test they only need to resolve.
vi.mock('../../../src/features/map/basemap', async () => {
  const { graticuleLines } = await import('../../../src/features/map/graticule');
  const empty = { type: 'FeatureCollection', features: [] };
  return { coarseLand: () => ({ land: empty, coast: empty }), graticuleData: graticuleLines, fineLandUrl: () => 'http://127.0.0.1/land-50m.json' };
});
vi.mock('../../../src/features/map/mapWorker.ts?worker&inline', () => ({ default: class {} }));

// Canvas 2D under jsdom: a context that records the text it is asked to draw.
const drawn: string[] = [];
class FakeContext {
  font = '';
  measureText(t: string) {
    return { width: t.length * 8 };
  }
  fillText(t: string) {
    drawn.push(t);
  }
  getImageData(_x: number, _y: number, w: number, h: number) {
    return { data: new Uint8ClampedArray(w * h * 4) };
  }
  [k: string]: unknown;
}
const contextProxy = () =>
  new Proxy(new FakeContext(), { get: (t, k) => (k in t ? (t as unknown as Record<string | symbol, unknown>)[k] : () => undefined), set: () => true });
vi.stubGlobal(
  'OffscreenCanvas',
  class {
    getContext() {
      return contextProxy();
    }
  },
);
vi.stubGlobal('fetch', () => Promise.reject(new Error('no network in unit tests')));

const { MapController } = await import('../../../src/features/map/mapController');

function obs(id: string, total: number): Observation {
  return {
    id, cruiseId: 'c', time: '2026-03-09T01:00:00Z', position: { lat: 80, lon: 10, source: 'manual' }, observerId: 'o1', totalConcentration: total,
    categories: [
      { partialConcentration: 5, stage: 'thick-first-year', floeSize: 'big-floe' },
      { partialConcentration: 3, stage: 'grey-white', floeSize: 'small-floe' },
    ],
    notes: '<img src=x onerror=alert(1)>', photoIds: [], revision: 1, savedAt: '2026-03-09T01:00:00Z', savedBy: 'o1', deviceId: 'd', deleted: false,
  };
}

interface Fake {
  fire: (type: string, e?: unknown) => void;
}

async function setup() {
  calls.log.length = 0;
  drawn.length = 0;
  const select = vi.fn();
  const c = new MapController(document.createElement('div'), { theme: 'day', projection: 'globe', onSelect: select });
  const map = calls.maps[calls.maps.length - 1] as Fake;
  // The worker helper's import settles first (at once here), as it does long before a real
  // style has loaded.
  await Promise.resolve();
  await Promise.resolve();
  expect(c.workerPatch).toBe('ready');
  map.fire('load');
  return { c, map, select };
}

const setDataFor = (source: string) => calls.log.filter((l) => l.fn === 'setData' && l.args[0] === source);

describe('map controller', () => {
  beforeEach(() => {
    calls.log.length = 0;
  });

  it('gives observations to the map once per change, and draws each egg code from the domain', async () => {
    const { c, map } = await setup();
    const list = [obs('a', 8), obs('b', 10)];
    c.setObservations(list, []);
    // Written by the map worker (in place here: jsdom has no Worker), so a moment later.
    await vi.waitFor(() => expect(setDataFor('observations')).toHaveLength(1));
    const points = setDataFor('observations')[0]?.args[1] as { features: { properties: { id: string; rank: number } }[] };
    expect(points.features.map((f) => f.properties.id)).toEqual(['a', 'b']);
    // The egg codes' own source does no work below their zoom (4 here), and gets the points at it.
    expect(setDataFor('egg-points')).toHaveLength(0);
    (map as unknown as { zoom: number }).zoom = 7;
    map.fire('moveend');
    expect(setDataFor('egg-points')).toHaveLength(1);
    map.fire('moveend');
    expect(setDataFor('egg-points')).toHaveLength(1);
    map.fire('styleimagemissing', { id: 'egg:a' });
    const code = deriveEggCode(list[0] as Observation);
    // Every non-blank field of the egg code is drawn, and nothing else (no user text); a stage's
    // dot is drawn as a shape beside its digit (domain/eggCode.ts), not as text.
    const fields = Object.values(code).filter((v) => v !== '').map((v) => (v.length > 1 && v.endsWith('.') ? v.slice(0, -1) : v));
    expect([...drawn].sort()).toEqual([...fields].sort());
    expect(drawn).toContain('8');
    expect(drawn.join(' ')).not.toContain('img');
    expect(calls.log.some((l) => l.fn === 'addImage' && l.args[0] === 'egg:a')).toBe(true);
  });

  it('selects by feature state and filters by layer filter, with no data reload', async () => {
    const { c } = await setup();
    c.setObservations([obs('a', 8), obs('b', 10)], []);
    await vi.waitFor(() => expect(setDataFor('observations')).toHaveLength(1));
    const before = calls.log.filter((l) => l.fn === 'setData').length;
    c.setSelected('a', true);
    c.setSelected('b', false);
    c.setFilter({ fromMs: 0, toMs: null, observerIds: ['o1'] });
    expect(calls.log.filter((l) => l.fn === 'setData').length).toBe(before);
    const states = calls.log.filter((l) => l.fn === 'setFeatureState').map((l) => l.args);
    expect(states).toEqual([
      [{ source: 'observations', id: 'a' }, { selected: true }],
      [{ source: 'observations', id: 'a' }, { selected: false }],
      [{ source: 'observations', id: 'b' }, { selected: true }],
    ]);
    // A selection made in the list brings the observation into view; one made on the map does not.
    expect(calls.log.filter((l) => l.fn === 'easeTo')).toHaveLength(1);
    const filtered = calls.log.filter((l) => l.fn === 'setFilter').map((l) => l.args[0]);
    expect(filtered).toContain('observations');
    expect(filtered).toContain('egg-codes');
  });

  it('switches projection on request only', async () => {
    const { c } = await setup();
    c.setProjection('globe');
    expect(calls.log.filter((l) => l.fn === 'setProjection')).toHaveLength(0);
    c.setProjection('mercator');
    expect(calls.log.filter((l) => l.fn === 'setProjection').map((l) => l.args[0])).toEqual([{ type: 'mercator' }]);
  });

  it('draws graticule labels for the view as images, never as text layers', async () => {
    const { map } = await setup();
    const labels = setDataFor('graticule-labels');
    expect(labels.length).toBeGreaterThan(0);
    map.fire('styleimagemissing', { id: 'lbl:75°N' });
    expect(drawn).toContain('75°N');
  });
});

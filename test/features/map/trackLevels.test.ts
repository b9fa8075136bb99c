// The track work done off the main thread: simplification per zoom level (Douglas-Peucker,
// checked on hand-made lines) and the antimeridian split.
import { describe, expect, it } from 'vitest';
import { beyondMercator, clipAtMercatorLimit, MERCATOR_LIMIT_LAT, mizStretchIndexes, seamPieces, simplifyIndexes, toleranceAtZoom, trackLevels, TRACK_LEVELS } from '../../../src/features/map/trackLevels';

describe('simplification', () => {
  it('keeps the ends and the corners, drops points on a straight run', () => {
    const xs = [0, 1, 2, 3, 3, 3];
    const ys = [0, 0, 0, 0, 1, 2];
    expect(simplifyIndexes(xs, ys, 0, 5, 0.01)).toEqual([0, 3, 5]);
    expect(simplifyIndexes(xs, ys, 0, 5, 10)).toEqual([0, 5]);
  });

  it('keeps a point exactly as far off as the tolerance only when it is farther', () => {
    expect(simplifyIndexes([0, 1, 2], [0, 1, 0], 0, 2, 0.999)).toEqual([0, 1, 2]);
    expect(simplifyIndexes([0, 1, 2], [0, 1, 0], 0, 2, 1)).toEqual([0, 2]);
  });

  it('takes half a pixel of a 512-pixel world as tolerance', () => {
    expect(toleranceAtZoom(0)).toBeCloseTo(1 / 1024, 15);
    expect(toleranceAtZoom(3)).toBeCloseTo(1 / 8192, 15);
  });

  it('simplifies a long zig-zag less at each finer level, and copes with a million points', () => {
    const n = 1_000_000;
    const t = new Float64Array(n);
    const lon = new Float64Array(n);
    const lat = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      t[i] = i * 2000;
      lon[i] = -20 + (40 * i) / n;
      lat[i] = 80 + 0.5 * Math.sin(i / 5000) + ((i % 2) * 2 - 1) * 1e-6;
    }
    const fc = trackLevels({ t, lon, lat });
    expect(fc.features).toHaveLength(TRACK_LEVELS.length);
    const counts = fc.features.map((f) => f.geometry.coordinates.reduce((s, l) => s + l.length, 0));
    for (let i = 1; i < counts.length; i++) expect(counts[i]).toBeGreaterThanOrEqual(counts[i - 1] as number);
    expect(counts[0]).toBeLessThan(2000);
    expect(counts[counts.length - 1]).toBeLessThan(n);
    const first = fc.features[0]?.geometry.coordinates[0];
    expect(first?.[0]).toEqual([-20, lat[0]]);
  }, 60_000);
});

describe('antimeridian pieces', () => {
  it('cuts the track where it steps across 180 degrees', () => {
    expect(seamPieces([170, 179, -179, -170, 179])).toEqual([[0, 1], [2, 3], [4, 4]]);
    const fc = trackLevels({ t: new Float64Array([0, 1, 2]), lon: new Float64Array([178, -178, -176]), lat: new Float64Array([70, 72, 72]) });
    expect(fc.features[3]?.geometry.coordinates).toEqual([[[178, 70], [180, 71]], [[-180, 71], [-178, 72], [-176, 72]]]);
  });
});

describe('marginal ice zone runs', () => {
  it('runs over track points whose nearest observation is in the zone', () => {
    const t = new Float64Array([0, 10, 20, 30, 40, 50]);
    expect(mizStretchIndexes(t, new Float64Array([0, 30]), new Uint8Array([0, 1]), 100)).toEqual([[2, 5]]);
    expect(mizStretchIndexes(t, new Float64Array([0, 30]), new Uint8Array([0, 1]), 12)).toEqual([[2, 4]]);
    expect(mizStretchIndexes(t, new Float64Array([]), new Uint8Array([]), 12)).toEqual([]);
  });
});

describe('the Mercator limit', () => {
  // Web Mercator ends at 85.051129 degrees (atan(sinh(pi))), where MapLibre's tiles end.
  it('is where Web Mercator ends', () => {
    expect(MERCATOR_LIMIT_LAT).toBeCloseTo((Math.atan(Math.sinh(Math.PI)) * 180) / Math.PI, 5);
    expect(beyondMercator(85.1)).toBe(true);
    expect(beyondMercator(-85.1)).toBe(true);
    expect(beyondMercator(85)).toBe(false);
  });

  it('cuts a line at the limit with the crossing interpolated, into the parts inside and beyond', () => {
    const L = MERCATOR_LIMIT_LAT;
    const { inside, beyond } = clipAtMercatorLimit([[0, 84], [10, 86], [20, 84]]);
    const f = (L - 84) / 2;
    expect(inside).toHaveLength(2);
    expect(beyond).toHaveLength(1);
    expect(inside[0]?.[0]).toEqual([0, 84]);
    expect(inside[0]?.[1]?.[0]).toBeCloseTo(10 * f, 9);
    expect(inside[0]?.[1]?.[1]).toBe(L);
    expect(beyond[0]?.map((p) => p[1])).toEqual([L, 86, L]);
    expect(clipAtMercatorLimit([[0, 80], [1, 81]])).toEqual({ inside: [[[0, 80], [1, 81]]], beyond: [] });
    expect(clipAtMercatorLimit([[0, -86], [1, -87]]).beyond).toHaveLength(1);
  });

  it('sends the polar parts of the track to the overlay', () => {
    const polar = { track: [] as number[][][], miz: [] as number[][][] };
    const fc = trackLevels({ t: new Float64Array([0, 1, 2]), lon: new Float64Array([0, 10, 20]), lat: new Float64Array([84, 86, 84]) }, polar);
    expect(polar.track).toHaveLength(1);
    for (const f of fc.features) for (const l of f.geometry.coordinates) for (const p of l) expect(Math.abs(p[1] as number)).toBeLessThanOrEqual(MERCATOR_LIMIT_LAT);
  });
});

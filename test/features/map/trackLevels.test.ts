// The track work done off the main thread: simplification per zoom level (Douglas-Peucker,
// checked on hand-made lines) and the antimeridian split.
import { describe, expect, it } from 'vitest';
import { mizStretchIndexes, seamPieces, simplifyIndexes, toleranceAtZoom, trackLevels, TRACK_LEVELS } from '../../../src/features/map/trackLevels';

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

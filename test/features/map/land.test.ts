// The antimeridian and pole fix for the Natural Earth land (world-atlas 2.0.2, land-110m and
// land-50m). Geographic facts checked here (the South Pole lies on Antarctica, the North Pole
// in the Arctic Ocean, the Caspian Sea is a lake inside Eurasia near 42 N 50 E, Chukotka and
// Wrangel Island straddle 180 degrees) are common geography, checked against the Natural Earth
// data itself.
import { describe, expect, it } from 'vitest';
import type { MultiPolygon, Position } from 'geojson';
import type { Topology } from 'topojson-specification';
import land110 from 'world-atlas/land-110m.json';
import land50 from 'world-atlas/land-50m.json';
import {
  closeRoundPole,
  coastlines,
  continuousRing,
  fixPolygon,
  landFromTopology,
  poleTurns,
  signedArea2,
  turnsIntoWorld,
  unwrapRing,
} from '../../../src/features/map/land';

function inRing(ring: Position[], x: number, y: number): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i] as [number, number];
    const [xj, yj] = ring[j] as [number, number];
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

/** Whether a point is land, counting the world copies either side (the renderer wraps them). */
function isLand(mp: MultiPolygon, lon: number, lat: number): boolean {
  return [lon, lon - 360, lon + 360].some((x) =>
    mp.coordinates.some((poly) => inRing(poly[0] as Position[], x, lat) && !poly.slice(1).some((h) => inRing(h, x, lat))),
  );
}

describe('ring helpers', () => {
  it('makes longitudes continuous across the antimeridian', () => {
    expect(unwrapRing([[179, 0], [-179, 1], [-178, 2], [179, 0]])).toEqual([[179, 0], [181, 1], [182, 2], [179, 0]]);
    expect(unwrapRing([[-179, 0], [179, 1]])).toEqual([[-179, 0], [-181, 1]]);
  });

  it('counts turns round a pole', () => {
    const round = unwrapRing([[-180, -70], [-90, -71], [0, -70], [90, -72], [179, -70], [-180, -70]]);
    expect(Math.abs(poleTurns(round))).toBe(1);
    expect(poleTurns(unwrapRing([[170, 60], [-170, 60], [-170, 65], [170, 60]]))).toBe(0);
  });

  it('closes a polar ring through the pole on its own side', () => {
    const closed = closeRoundPole(unwrapRing([[-180, -70], [-90, -71], [0, -70], [90, -72], [179, -70], [-180, -70]]));
    expect(closed.slice(-3)).toEqual([[180, -90], [-180, -90], [-180, -70]]);
    const north = closeRoundPole([[0, 80], [120, 81], [240, 80], [360, 80]]);
    expect(north.slice(-3)).toEqual([[360, 90], [0, 90], [0, 80]]);
  });

  it('shifts a ring by whole turns into -180..180', () => {
    expect(turnsIntoWorld([[190, 0], [200, 1], [195, 2]])).toBe(-1);
    expect(turnsIntoWorld([[-369, 0], [-170, 1]])).toBe(1);
    expect(turnsIntoWorld([[170, 0], [185, 1]])).toBe(0);
  });

  it('puts a hole beside its outer ring and winds outer rings counter-clockwise, holes clockwise', () => {
    // An outer ring that starts east of the antimeridian and runs west to 10 E: unwrapped it
    // lies at -350..-170; the hole at 50 E must still fall inside it.
    const outer: Position[] = [[-175, 60], [-170, 60], [-170, 70], [-175, 70], [179, 70], [10, 70], [10, 40], [179, 40], [-175, 60]];
    const hole: Position[] = [[45, 45], [55, 45], [55, 50], [45, 50], [45, 45]];
    const [o, h] = fixPolygon([outer, hole]) as [Position[], Position[]];
    expect(signedArea2(o)).toBeGreaterThan(0);
    expect(signedArea2(h)).toBeLessThan(0);
    expect(inRing(o, 50, 47)).toBe(true);
    expect(inRing(h, 50, 47)).toBe(true);
    expect(inRing(o, 187, 65)).toBe(true); // 173 W, east of the seam
  });
});

for (const [name, topo] of [['land-110m', land110], ['land-50m', land50]] as const) {
  describe(`world-atlas ${name}`, () => {
    const { land, coast } = landFromTopology(topo as unknown as Topology);
    const mp = land.features[0]?.geometry as MultiPolygon;

    it('has no ring edge that jumps across the map (the Mercator stripes)', () => {
      const bad: string[] = [];
      for (const poly of mp.coordinates)
        for (const ring of poly)
          for (let i = 1; i < ring.length; i++) {
            const [x0, y0] = ring[i - 1] as [number, number];
            const [x1, y1] = ring[i] as [number, number];
            // The only long edge allowed runs along a pole, where it is a single point.
            const alongPole = Math.abs(y0) === 90 && y1 === y0;
            if (!alongPole && Math.abs(x1 - x0) > 180) bad.push(`${x0},${y0} -> ${x1},${y1}`);
          }
      expect(bad).toEqual([]);
    });

    it('keeps each outer ring in the world and each ring closed', () => {
      for (const poly of mp.coordinates) {
        expect(turnsIntoWorld(poly[0] as Position[])).toBe(0);
        for (const ring of poly) expect(ring[0]).toEqual(ring[ring.length - 1]);
      }
    });

    it('fills the South Pole and Antarctica, leaves the North Pole as sea', () => {
      expect(isLand(mp, 0, -89.5)).toBe(true);
      expect(isLand(mp, 135, -80)).toBe(true);
      expect(isLand(mp, -179.5, -86)).toBe(true); // Ross Ice Shelf at the seam
      expect(isLand(mp, 0, 89.5)).toBe(false);
      expect(isLand(mp, 179.9, 88)).toBe(false);
      expect(isLand(mp, -150, 85)).toBe(false);
    });

    it('keeps land that straddles 180 degrees and the Caspian hole inside Eurasia', () => {
      expect(isLand(mp, -175, 66.5)).toBe(true); // Chukotka, east of the seam
      expect(isLand(mp, 175, 67)).toBe(true); // Chukotka, west of the seam
      expect(isLand(mp, 50, 42)).toBe(false); // the Caspian Sea
      expect(isLand(mp, 60, 50)).toBe(true); // Kazakhstan
      expect(isLand(mp, -179.5, 71.2)).toBe(true); // Wrangel Island
    });

    it('draws coastlines with no seam, pole or jump edges', () => {
      const lines = coast.features.flatMap((f) => f.geometry.coordinates);
      expect(lines.length).toBeGreaterThan(50);
      const bad: string[] = [];
      for (const line of lines) {
        for (let i = 1; i < line.length; i++) {
          const [x0, y0] = line[i - 1] as [number, number];
          const [x1, y1] = line[i] as [number, number];
          if (Math.abs(x1 - x0) > 180) bad.push(`jump ${x0},${y0} -> ${x1},${y1}`);
          if (Math.abs(Math.abs(((x0 + 540) % 360) - 180)) < 1e-9 && x0 === x1 && y0 !== y1) bad.push(`seam ${x0},${y0} -> ${x1},${y1}`);
          if (Math.abs(y0) >= 89.9 && Math.abs(y1) >= 89.9) bad.push(`pole ${x0},${y0} -> ${x1},${y1}`);
        }
      }
      expect(bad).toEqual([]);
    });
  });
}

describe('coastlines of a small ring cut by the seam', () => {
  it('drops the seam edge and keeps the real coast', () => {
    // Wrangel Island's eastern piece as world-atlas has it: the first edge runs along the seam.
    const ring: Position[] = [[-180, 71.516], [180, 70.832], [178.902, 70.782], [178.726, 71.098], [-180, 71.516]];
    const c = coastlines({ type: 'Polygon', coordinates: [ring] });
    expect(c.coordinates).toHaveLength(1);
    expect(c.coordinates[0]).toEqual([[180, 70.832], [178.902, 70.782], [178.726, 71.098], [180, 71.516]]);
    expect(continuousRing(ring).every((p) => (p[0] as number) <= -178)).toBe(true);
  });
});

// The cruise by 1-degree latitude band: where the ship met which ice.
import type { Observation } from '../model.ts';
import { IcePool, type IceFigures } from './icePool.ts';
import type { ObservationFigures } from './observationFigures.ts';

export interface LatitudeBand extends IceFigures {
  /** Southern edge of the band in degrees (the band is [south, south + 1)). */
  south: number;
  north: number;
  /** Hours the band's observations stand for (see attribution.ts). */
  hours: number;
}

export interface LatitudeBandTable {
  /** Bands from south to north; only bands with observations. */
  bands: LatitudeBand[];
  /** Observations without a position, not in any band. */
  withoutPosition: number;
}

/** "79°N-80°N", "66°S-65°S", "0°-1°N" style label for a band's southern edge. */
export function latitudeBandLabel(south: number): string {
  const deg = (v: number): string => (v === 0 ? '0°' : `${Math.abs(v)}°${v > 0 ? 'N' : 'S'}`);
  return `${deg(south)} to ${deg(south + 1)}`;
}

export class LatitudeBandBuilder {
  private readonly pools = new Map<number, { pool: IcePool; hours: number }>();
  private withoutPosition = 0;

  /** Adds an observation, or with sign -1 takes back one added before with the same figures. */
  add(obs: Observation, f: ObservationFigures, hours: number, sign: 1 | -1 = 1): void {
    const lat = obs.position?.lat;
    if (lat === undefined || !Number.isFinite(lat)) {
      this.withoutPosition += sign;
      return;
    }
    // 90°N belongs to the band below it, so the bands stop at the pole.
    const south = Math.min(89, Math.floor(lat));
    let entry = this.pools.get(south);
    if (!entry) {
      entry = { pool: new IcePool(), hours: 0 };
      this.pools.set(south, entry);
    }
    entry.pool.add(obs, f, sign);
    entry.hours += sign * hours;
    if (entry.pool.count === 0) this.pools.delete(south);
  }

  result(): LatitudeBandTable {
    const bands = [...this.pools.entries()]
      .sort((a, b) => a[0] - b[0])
      .map(([south, e]) => ({ ...e.pool.result(), south, north: south + 1, hours: e.hours }));
    return { bands, withoutPosition: this.withoutPosition };
  }
}

import { describe, expect, it } from 'vitest';
import { describeGeolocationError, geoFixFrom, isGeolocationAvailable, watchGeolocation } from '../../src/gps/geolocation';

function position(over: Partial<GeolocationCoordinates> = {}, timestamp = Date.UTC(2026, 2, 9, 12)): GeolocationPosition {
  const coords = { latitude: 82.1, longitude: 15.2, accuracy: 25, altitude: null, altitudeAccuracy: null, heading: null, speed: null, ...over };
  return { coords: coords as GeolocationCoordinates, timestamp, toJSON: () => ({}) } as GeolocationPosition;
}

class FakeGeolocation {
  success: PositionCallback | null = null;
  error: PositionErrorCallback | null = null;
  options: PositionOptions | undefined;
  cleared: number[] = [];
  watchPosition(s: PositionCallback, e?: PositionErrorCallback | null, o?: PositionOptions): number {
    this.success = s;
    this.error = e ?? null;
    this.options = o;
    return 7;
  }
  clearWatch(id: number): void {
    this.cleared.push(id);
  }
  getCurrentPosition(): void {}
}

describe('browser geolocation source', () => {
  it('converts a position with accuracy, age, and speed from m/s to knots', () => {
    const t = Date.UTC(2026, 2, 9, 12);
    // 1 kn = 1852 m / 3600 s (international nautical mile, BIPM SI brochure table 8).
    expect(geoFixFrom(position({ speed: 1852 / 3600 * 6, heading: 45 }), t + 1500)).toEqual({
      time: '2026-03-09T12:00:00Z', lat: 82.1, lon: 15.2, accuracyM: 25, sogKn: 6, cogDeg: 45, ageMs: 1500,
    });
    // Heading is NaN when stationary (W3C Geolocation API).
    expect(geoFixFrom(position({ speed: 0, heading: Number.NaN }), t)).toMatchObject({ sogKn: 0, cogDeg: null, ageMs: 0 });
  });

  it('watches with high accuracy, reports errors in plain words, and stops', () => {
    const geo = new FakeGeolocation();
    const fixes: number[] = [];
    const errors: string[] = [];
    const stop = watchGeolocation({ onFix: (f) => fixes.push(f.accuracyM), onError: (m) => errors.push(m), now: () => Date.UTC(2026, 2, 9, 12) }, geo as unknown as Geolocation);
    expect(geo.options).toEqual({ enableHighAccuracy: true, maximumAge: 30_000, timeout: 60_000 });
    geo.success?.(position({ accuracy: 12 }));
    geo.error?.({ code: 1, message: 'denied', PERMISSION_DENIED: 1, POSITION_UNAVAILABLE: 2, TIMEOUT: 3 } as GeolocationPositionError);
    expect(fixes).toEqual([12]);
    expect(errors[0]).toMatch(/permission was refused/);
    stop();
    expect(geo.cleared).toEqual([7]);
    expect(describeGeolocationError(2)).toMatch(/No position available/);
    expect(describeGeolocationError(3)).toMatch(/too long/);
    expect(isGeolocationAvailable({} as Navigator)).toBe(false);
  });
});

// The automatic night display: while the display is on "Auto (sun)", the theme follows the
// sun's elevation at the ship's latest known position (a fresh GPS fix, else the latest
// observation with a position), by the domain's rule (civil twilight with hysteresis).
import { useEffect } from 'react';
import type { Observation } from '../../domain/model';
import { themeAt } from '../../domain/solar';
import { useGpsStore } from '../../state/gps';
import { useThemeStore } from '../../state/theme';
import { useNow } from './useNow';

/** The ship's latest known position: the GPS fix when there is one, else the latest observation's. */
export function latestShipPosition(
  fix: { lat: number; lon: number } | null,
  observations: readonly Observation[],
): { lat: number; lon: number } | null {
  if (fix) return { lat: fix.lat, lon: fix.lon };
  for (let i = observations.length - 1; i >= 0; i--) {
    const p = observations[i]?.position;
    if (p) return { lat: p.lat, lon: p.lon };
  }
  return null;
}

export function useAutoTheme(observations: readonly Observation[]): void {
  const now = useNow(60_000);
  const fix = useGpsStore((s) => s.fix);
  const mode = useThemeStore((s) => s.mode);
  const where = latestShipPosition(fix, observations);
  const lat = where?.lat;
  const lon = where?.lon;
  useEffect(() => {
    if (lat === undefined || lon === undefined) return;
    const store = useThemeStore.getState();
    const current = store.autoTheme === 'day' ? 'day' : 'night';
    const next = themeAt(now, lat, lon, current);
    if (next !== current || (store.autoTheme === 'red' && next === 'day')) store.setAutoTheme(next);
  }, [now, lat, lon, mode]);
}

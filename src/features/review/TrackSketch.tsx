// A track overview for the printed report: the ship's track and the observations coloured by
// total concentration (WMO/TD-No. 1215 colours by day; the map's symbols in each display), drawn as SVG so it prints
// without WebGL. Plate carrée scaled by the cosine of the mid-latitude, longitudes unwrapped
// across the antimeridian. An overview, not a navigation chart.
import { useMemo } from 'react';
import type { Observation, TrackPoint } from '../../domain/model';
import { effectiveTheme, useThemeStore } from '../../state/theme';
import { BandSwatch } from '../map/BandSwatch';
import { hasMarks } from '../map/bandSymbols';
import { band, bandOfTenths, type BandKey } from '../map/concentrationBands';

const W = 640;
const H = 360;
const PAD = 24;
const MAX_TRACK_POINTS = 2000;

interface Pt { lat: number; lon: number }

/** Longitudes made continuous (no 360° jump at the antimeridian). */
function unwrap(points: Pt[]): Pt[] {
  let prev: number | null = null;
  return points.map((p) => {
    let lon = p.lon;
    if (prev !== null) lon += 360 * Math.round((prev - lon) / 360);
    prev = lon;
    return { lat: p.lat, lon };
  });
}

export function TrackSketch({ observations, track }: { observations: readonly Observation[]; track: readonly TrackPoint[] }) {
  const drawn = useMemo(() => {
    const step = Math.max(1, Math.ceil(track.length / MAX_TRACK_POINTS));
    const line = unwrap(track.filter((_, i) => i % step === 0 || i === track.length - 1));
    const obs = observations.filter((o) => o.position);
    const dots = unwrap(obs.map((o) => o.position as Pt));
    const all = [...line, ...dots];
    if (all.length === 0) return null;
    let latMin = Infinity, latMax = -Infinity, lonMin = Infinity, lonMax = -Infinity;
    for (const p of all) {
      latMin = Math.min(latMin, p.lat); latMax = Math.max(latMax, p.lat);
      lonMin = Math.min(lonMin, p.lon); lonMax = Math.max(lonMax, p.lon);
    }
    const k = Math.cos((((latMin + latMax) / 2) * Math.PI) / 180);
    const spanX = Math.max((lonMax - lonMin) * k, 0.01);
    const spanY = Math.max(latMax - latMin, 0.01);
    const scale = Math.min((W - 2 * PAD) / spanX, (H - 2 * PAD) / spanY);
    const x = (lon: number): number => PAD + (lon - lonMin) * k * scale;
    const y = (lat: number): number => H - PAD - (lat - latMin) * scale;
    const path = line.map((p, i) => `${i === 0 ? 'M' : 'L'}${x(p.lon).toFixed(1)},${y(p.lat).toFixed(1)}`).join('');
    const bandsSeen = new Set<BandKey>();
    const points = obs.map((o, i) => {
      const b = bandOfTenths(o.totalConcentration);
      bandsSeen.add(b);
      const p = dots[i] as Pt;
      return { id: o.id, cx: x(p.lon), cy: y(p.lat), band: b };
    });
    const parallels: { lat: number; y: number }[] = [];
    for (let lat = Math.ceil(latMin); lat <= Math.floor(latMax); lat++) parallels.push({ lat, y: y(lat) });
    return { path, points, parallels, bands: [...bandsSeen].map((b) => band(b)) };
  }, [observations, track]);
  const theme = effectiveTheme(useThemeStore());
  if (!drawn) return null;
  const dot = hasMarks(theme) ? 12 : 8;
  return (
    <section aria-labelledby="review-track-title" className="review-section review-track">
      <h3 id="review-track-title">Track overview</h3>
      <p className="muted small">Not a navigation chart. Observations by total concentration ({theme === 'red' ? 'red display: brightness and marks as on the map' : theme === 'night' ? 'WMO ice chart colours, dimmed' : 'WMO ice chart colours'}).</p>
      <svg viewBox={`0 0 ${W} ${H}`} className="review-track-svg" role="img" aria-label={`Track with ${drawn.points.length} observations`} data-testid="track-sketch">
        {drawn.parallels.map((p) => (
          <g key={p.lat}>
            <line x1={0} x2={W} y1={p.y} y2={p.y} className="review-track-grid" />
            <text x={4} y={p.y - 3} className="review-track-label">{`${Math.abs(p.lat)}°${p.lat >= 0 ? 'N' : 'S'}`}</text>
          </g>
        ))}
        <path d={drawn.path} className="review-track-line" />
        {drawn.points.map((p) => (
          <BandSwatch key={p.id} band={p.band} theme={theme} size={dot} centre={{ x: p.cx, y: p.cy }} />
        ))}
      </svg>
      <ul className="review-track-legend">
        {drawn.bands.map((b) => (
          <li key={b.key}>
            <BandSwatch band={b.key} theme={theme} size={14} /> {b.label}
          </li>
        ))}
      </ul>
    </section>
  );
}

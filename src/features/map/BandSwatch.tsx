// One band's symbol as SVG, from the same description the map draws (bandSymbols.ts), so the
// legend and the review's sketch show exactly what the map shows in each display. A hollow disc
// is left unfilled, so it shows the background it sits on, as on the map.
import { bandSymbol, markRects, type DisplayTheme } from './bandSymbols';
import type { BandKey } from './concentrationBands';

interface SwatchProps {
  band: BandKey;
  theme: DisplayTheme;
  size?: number;
  /** Centre, when the swatch is placed inside another SVG (the review's track sketch). */
  centre?: { x: number; y: number };
}

export function BandSwatch({ band, theme, size = 18, centre }: SwatchProps) {
  const s = bandSymbol(theme, band);
  const r = size / 2 - 1;
  const c = size / 2;
  return (
    <svg
      className="band-swatch"
      width={size}
      height={size}
      viewBox={`0 0 ${size} ${size}`}
      aria-hidden="true"
      data-band={band}
      {...(centre ? { x: centre.x - size / 2, y: centre.y - size / 2 } : {})}
    >
      <circle cx={c} cy={c} r={r} fill={s.fill ?? 'none'} stroke={s.ring} strokeWidth={1.5} />
      {markRects(s.mark).map((q, i) =>
        q.round ? (
          <circle key={i} cx={c} cy={c} r={(q.w / 2) * r} fill={s.ink} />
        ) : (
          <rect key={i} x={c + q.x * r} y={c + q.y * r} width={q.w * r} height={q.h * r} fill={s.ink} />
        ),
      )}
    </svg>
  );
}

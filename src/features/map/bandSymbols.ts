// How each total-concentration band is drawn in each display. The day display uses the colours
// of the ice chart colour standard for total concentration (WMO/TD-No. 1215); the night display
// the same colours dimmed; the red display cannot show colour at all, so there each band is a
// step on a ramp of red brightness (darker for less ice) with a mark of its own inside the
// disc. The ramp and the marks are our own design. The map's symbols (mapImages.ts, the polar
// overlay), the legend and the review's track sketch all draw from here, so they always agree.
import { BANDS, hexColour, type BandKey } from './concentrationBands';

export type DisplayTheme = 'day' | 'night' | 'red';

/**
 * A mark inside a band's disc, in a frame where the disc is the unit circle centred on (0, 0),
 * y downwards. Widths are in the same units.
 */
export type MarkPart =
  | { kind: 'bar'; y: number; halfWidth: number; thickness: number }
  | { kind: 'dot'; r: number }
  | { kind: 'square'; half: number }
  | { kind: 'cross'; half: number; thickness: number };

export interface BandSymbol {
  /** Disc fill; `null` leaves the disc hollow (the background shows through). */
  fill: string | null;
  /** Outline of the disc. */
  ring: string;
  /** The mark's colour, chosen to stand out on the fill. */
  ink: string;
  mark: readonly MarkPart[];
}

/** Brightness factor of the night display's band colours: dim, yet in the standard's hues. */
export const NIGHT_DIMMING = 0.62;

const RED_TEXT = '#ff1a1a';

/** The red display's symbol per band: more ice is brighter and carries more bars. */
const RED_SYMBOLS: Record<BandKey, BandSymbol> = {
  'ice-free': { fill: null, ring: RED_TEXT, ink: RED_TEXT, mark: [] },
  'open-water': { fill: '#3a0000', ring: RED_TEXT, ink: RED_TEXT, mark: [{ kind: 'dot', r: 0.28 }] },
  'c1-3': { fill: '#5c0000', ring: RED_TEXT, ink: RED_TEXT, mark: [{ kind: 'bar', y: 0, halfWidth: 0.72, thickness: 0.3 }] },
  'c4-6': {
    fill: '#8a0000',
    ring: '#000000',
    ink: '#000000',
    mark: [
      { kind: 'bar', y: -0.3, halfWidth: 0.78, thickness: 0.26 },
      { kind: 'bar', y: 0.3, halfWidth: 0.78, thickness: 0.26 },
    ],
  },
  'c7-8': {
    fill: '#bb0000',
    ring: '#000000',
    ink: '#000000',
    mark: [
      { kind: 'bar', y: -0.46, halfWidth: 0.7, thickness: 0.2 },
      { kind: 'bar', y: 0, halfWidth: 0.86, thickness: 0.2 },
      { kind: 'bar', y: 0.46, halfWidth: 0.7, thickness: 0.2 },
    ],
  },
  'c9-10': { fill: '#ff0000', ring: '#000000', ink: '#000000', mark: [] },
  'fast-ice': { fill: '#ff0000', ring: '#000000', ink: '#000000', mark: [{ kind: 'square', half: 0.38 }] },
  'not-judged': { fill: null, ring: RED_TEXT, ink: RED_TEXT, mark: [{ kind: 'cross', half: 0.5, thickness: 0.22 }] },
};

function scaled(rgb: readonly [number, number, number], f: number): string {
  const [r, g, b] = rgb;
  return hexColour([Math.round(r * f), Math.round(g * f), Math.round(b * f)]);
}

function plain(fill: (rgb: readonly [number, number, number]) => string, ring: string): Record<BandKey, BandSymbol> {
  const out = {} as Record<BandKey, BandSymbol>;
  for (const b of BANDS) out[b.key] = { fill: fill(b.rgb), ring, ink: ring, mark: [] };
  return out;
}

const BY_THEME: Record<DisplayTheme, Record<BandKey, BandSymbol>> = {
  day: plain(hexColour, '#10161d'),
  night: plain((rgb) => scaled(rgb, NIGHT_DIMMING), '#000000'),
  red: RED_SYMBOLS,
};

export function bandSymbol(theme: DisplayTheme, key: BandKey): BandSymbol {
  return BY_THEME[theme][key];
}

/** Whether a display draws marks inside the discs (only the red one needs them). */
export function hasMarks(theme: DisplayTheme): boolean {
  return theme === 'red';
}

/** The disc's fill as a colour, with the background colour for a hollow disc. */
export function bandFill(theme: DisplayTheme, key: BandKey, background: string): string {
  return bandSymbol(theme, key).fill ?? background;
}

/** A short description of the red display's mark, for the legend's accessible text. */
export const MARK_WORDS: Record<BandKey, string> = {
  'ice-free': 'hollow',
  'open-water': 'dot',
  'c1-3': 'one bar',
  'c4-6': 'two bars',
  'c7-8': 'three bars',
  'c9-10': 'brightest, plain',
  'fast-ice': 'square',
  'not-judged': 'hollow with a cross',
};

/** Rectangles (x, y, w, h in the unit frame) that make up a mark: every renderer fills these. */
export function markRects(mark: readonly MarkPart[]): { x: number; y: number; w: number; h: number; round?: boolean }[] {
  const out: { x: number; y: number; w: number; h: number; round?: boolean }[] = [];
  for (const m of mark) {
    if (m.kind === 'bar') out.push({ x: -m.halfWidth, y: m.y - m.thickness / 2, w: 2 * m.halfWidth, h: m.thickness });
    else if (m.kind === 'square') out.push({ x: -m.half, y: -m.half, w: 2 * m.half, h: 2 * m.half });
    else if (m.kind === 'dot') out.push({ x: -m.r, y: -m.r, w: 2 * m.r, h: 2 * m.r, round: true });
    else {
      out.push({ x: -m.half, y: -m.thickness / 2, w: 2 * m.half, h: m.thickness });
      out.push({ x: -m.thickness / 2, y: -m.half, w: m.thickness, h: 2 * m.half });
    }
  }
  return out;
}

type Ctx2D = CanvasRenderingContext2D | OffscreenCanvasRenderingContext2D;

/** Draws a band's disc (and mark) centred on (cx, cy) with radius r, in canvas pixels. */
export function drawBandSymbol(ctx: Ctx2D, s: BandSymbol, cx: number, cy: number, r: number, background: string, ringWidth: number): void {
  ctx.beginPath();
  ctx.arc(cx, cy, r, 0, Math.PI * 2);
  ctx.fillStyle = s.fill ?? background;
  ctx.fill();
  ctx.lineWidth = ringWidth;
  ctx.strokeStyle = s.ring;
  ctx.stroke();
  ctx.fillStyle = s.ink;
  for (const q of markRects(s.mark)) {
    ctx.beginPath();
    if (q.round) ctx.arc(cx, cy, (q.w / 2) * r, 0, Math.PI * 2);
    else ctx.rect(cx + q.x * r, cy + q.y * r, q.w * r, q.h * r);
    ctx.fill();
  }
}

// Images the map draws in the browser instead of loading glyphs or sprites: graticule labels,
// egg codes and the ship symbol. Text is drawn with Canvas 2D in the system font, so the map
// needs no glyph PBFs (MapLibre's text layers need them, and we ship no font files); the text
// is a code or a number we made, never user input, and it never passes through HTML.
import type { EggCodeDrawing } from '../../domain/eggCode';
import { markRects, type BandSymbol } from './bandSymbols';

export interface RasterImage {
  width: number;
  height: number;
  data: Uint8ClampedArray;
}

/** Device pixels per CSS pixel the images are drawn at, so they stay sharp on dense screens. */
export const IMAGE_PIXEL_RATIO = 2;

function context(width: number, height: number): CanvasRenderingContext2D | OffscreenCanvasRenderingContext2D | null {
  if (typeof OffscreenCanvas !== 'undefined') return new OffscreenCanvas(width, height).getContext('2d');
  if (typeof document === 'undefined') return null;
  const c = document.createElement('canvas');
  c.width = width;
  c.height = height;
  return c.getContext('2d');
}

function raster(ctx: CanvasRenderingContext2D | OffscreenCanvasRenderingContext2D, width: number, height: number): RasterImage {
  return { width, height, data: ctx.getImageData(0, 0, width, height).data };
}

const FONT = 'system-ui, -apple-system, "Segoe UI", Roboto, sans-serif';

/** A short label with a halo, e.g. a graticule label. */
export function textImage(text: string, colour: string, halo: string, sizePx = 11): RasterImage | null {
  const r = IMAGE_PIXEL_RATIO;
  const font = `${sizePx * r}px ${FONT}`;
  const probe = context(1, 1);
  if (!probe) return null;
  probe.font = font;
  const width = Math.ceil(probe.measureText(text).width + 6 * r);
  const height = Math.ceil((sizePx + 6) * r);
  const ctx = context(width, height);
  if (!ctx) return null;
  ctx.font = font;
  ctx.textAlign = 'center';
  ctx.textBaseline = 'middle';
  ctx.lineJoin = 'round';
  ctx.lineWidth = 3 * r;
  ctx.strokeStyle = halo;
  ctx.strokeText(text, width / 2, height / 2);
  ctx.fillStyle = colour;
  ctx.fillText(text, width / 2, height / 2);
  return raster(ctx, width, height);
}

/** The egg code symbol from the domain's drawing data, `heightPx` tall on screen. */
export function eggImage(drawing: EggCodeDrawing, ink: string, paper: string, heightPx = 64): RasterImage | null {
  const scale = (heightPx * IMAGE_PIXEL_RATIO) / drawing.height;
  const width = Math.ceil(drawing.width * scale) + 2;
  const height = Math.ceil(drawing.height * scale) + 2;
  const ctx = context(width, height);
  if (!ctx) return null;
  ctx.translate(1, 1);
  ctx.scale(scale, scale);
  ctx.lineWidth = 3;
  ctx.strokeStyle = ink;
  ctx.fillStyle = paper;
  for (const s of drawing.shapes) {
    if (s.kind === 'dot') continue;
    ctx.beginPath();
    if (s.kind === 'ellipse') {
      ctx.ellipse(s.cx, s.cy, s.rx, s.ry, 0, 0, Math.PI * 2);
      ctx.fill();
    } else {
      ctx.moveTo(s.x1, s.y1);
      ctx.lineTo(s.x2, s.y2);
    }
    ctx.stroke();
  }
  ctx.fillStyle = ink;
  // Stage dots are shapes placed by the drawing (see eggCodeDrawing): never a "." glyph.
  for (const s of drawing.shapes) {
    if (s.kind !== 'dot') continue;
    ctx.beginPath();
    ctx.arc(s.cx, s.cy, s.r * 1.15, 0, Math.PI * 2);
    ctx.fill();
  }
  ctx.textAlign = 'center';
  ctx.textBaseline = 'middle';
  for (const t of drawing.texts) {
    ctx.font = `bold ${t.size}px ${FONT}`;
    ctx.fillText(t.text, t.x, t.y);
  }
  return raster(ctx, width, height);
}

/** The ship: an arrow pointing up (north before rotation), with a halo. */
export function shipImage(fill: string, halo: string, sizePx = 26): RasterImage | null {
  const r = IMAGE_PIXEL_RATIO;
  const s = sizePx * r;
  const ctx = context(s, s);
  if (!ctx) return null;
  ctx.beginPath();
  ctx.moveTo(s / 2, s * 0.06);
  ctx.lineTo(s * 0.82, s * 0.92);
  ctx.lineTo(s / 2, s * 0.72);
  ctx.lineTo(s * 0.18, s * 0.92);
  ctx.closePath();
  ctx.lineJoin = 'round';
  ctx.lineWidth = 2.5 * r;
  ctx.strokeStyle = halo;
  ctx.stroke();
  ctx.fillStyle = fill;
  ctx.fill();
  return raster(ctx, s, s);
}

/** A band's mark alone (no disc: the circle layer draws that), for a disc of `radiusPx`. */
export function markImage(symbol: BandSymbol, radiusPx: number): RasterImage | null {
  const r = IMAGE_PIXEL_RATIO;
  const size = Math.ceil(2 * radiusPx * r);
  const ctx = context(size, size);
  if (!ctx) return null;
  ctx.fillStyle = symbol.ink;
  const c = size / 2;
  const rad = radiusPx * r;
  for (const q of markRects(symbol.mark)) {
    ctx.beginPath();
    if (q.round) ctx.arc(c, c, (q.w / 2) * rad, 0, Math.PI * 2);
    else ctx.rect(c + q.x * rad, c + q.y * rad, q.w * rad, q.h * rad);
    ctx.fill();
  }
  return raster(ctx, size, size);
}

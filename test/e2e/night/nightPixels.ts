// The night pixel check: a screenshot decoded in the page (no image library), every pixel
// tested against the limits of the display. Limits are our own, chosen for dark adaptation on a
// bridge (common practice: red light at low brightness keeps night vision; no source gives
// figures for a screen), and the app's colours are designed to them (src/app/app.css).
import type { Page } from 'playwright-core';

/** Relative luminance limits (WCAG 2 definition, sRGB, 0 black to 1 white). */
export const RED_MAX_LUMINANCE = 0.23;
export const NIGHT_MAX_LUMINANCE = 0.42;
/** In the red display green and blue may each be at most this share of red, plus a little slack. */
export const RED_SHARE = 0.15;
export const RED_SLACK = 4;

export interface PixelVerdict {
  checked: number;
  /** Pixels over a limit. */
  bad: number;
  /** The first few offenders, for the message. */
  examples: { x: number; y: number; rgb: [number, number, number]; why: string }[];
}

/** Screenshots the page (the whole page, or the viewport) and checks every pixel. */
export async function checkNightPixels(page: Page, display: 'red' | 'night', fullPage = true): Promise<PixelVerdict> {
  const png = (await page.screenshot({ fullPage })).toString('base64');
  return page.evaluate(
    async ({ png, display, limits }) => {
      const img = new Image();
      img.src = `data:image/png;base64,${png}`;
      await img.decode();
      const c = document.createElement('canvas');
      c.width = img.width;
      c.height = img.height;
      const ctx = c.getContext('2d', { willReadFrequently: true }) as CanvasRenderingContext2D;
      ctx.drawImage(img, 0, 0);
      const d = ctx.getImageData(0, 0, c.width, c.height).data;
      const lin = new Float64Array(256);
      for (let i = 0; i < 256; i++) {
        const v = i / 255;
        lin[i] = v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4;
      }
      const maxY = display === 'red' ? limits.red : limits.night;
      const out: { checked: number; bad: number; examples: { x: number; y: number; rgb: [number, number, number]; why: string }[] } = { checked: 0, bad: 0, examples: [] };
      for (let i = 0; i < d.length; i += 4) {
        const r = d[i] as number;
        const g = d[i + 1] as number;
        const b = d[i + 2] as number;
        out.checked++;
        const y = 0.2126 * (lin[r] as number) + 0.7152 * (lin[g] as number) + 0.0722 * (lin[b] as number);
        let why = '';
        if (y > maxY) why = `luminance ${y.toFixed(3)} > ${maxY}`;
        else if (display === 'red' && (g > limits.share * r + limits.slack || b > limits.share * r + limits.slack)) why = 'green or blue light';
        if (why) {
          out.bad++;
          if (out.examples.length < 5) out.examples.push({ x: (i / 4) % c.width, y: Math.floor(i / 4 / c.width), rgb: [r, g, b], why });
        }
      }
      return out;
    },
    { png, display, limits: { red: RED_MAX_LUMINANCE, night: NIGHT_MAX_LUMINANCE, share: RED_SHARE, slack: RED_SLACK } },
  );
}

/** Describes a verdict in one line for an assertion message. */
export function describeVerdict(label: string, v: PixelVerdict): string {
  return `${label}: ${v.bad} of ${v.checked} pixels over the limit, e.g. ${v.examples.map((e) => `(${e.x},${e.y}) rgb(${e.rgb.join(',')}) ${e.why}`).join('; ')}`;
}

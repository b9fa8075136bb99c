// Helpers for the map browser tests: open the map screen, wait until MapLibre is idle, put a
// cruise in through the app's store, and read screen pixels.
import type { Page } from 'playwright-core';
import type { Cruise, Observation, TrackPoint } from '../../../src/domain/model';

export async function openMapScreen(page: Page): Promise<void> {
  await page.getByRole('navigation', { name: 'Screens' }).getByRole('button', { name: 'Ice map' }).click();
  await waitForIdle(page);
  await showMap(page);
}

/** Scrolls the map fully into the viewport (banners above it may push it down), so screenshots hold it. */
export async function showMap(page: Page): Promise<void> {
  await page.getByTestId('map-canvas').evaluate((el) => el.scrollIntoView({ block: 'end' }));
}

/** Waits until the map reports idle (every tile and source drawn) and stays so for a moment. */
export async function waitForIdle(page: Page, timeout = 60_000): Promise<void> {
  const map = page.getByTestId('map-canvas');
  await map.waitFor({ timeout });
  await page.waitForFunction(() => document.querySelector('[data-testid="map-canvas"]')?.getAttribute('data-map-state') === 'idle', null, { timeout, polling: 100 });
  await page.waitForTimeout(300);
  await page.waitForFunction(() => document.querySelector('[data-testid="map-canvas"]')?.getAttribute('data-map-state') === 'idle', null, { timeout, polling: 100 });
}

export async function loadCruise(page: Page, cruise: Cruise, observations: Observation[], track: TrackPoint[]): Promise<void> {
  await page.waitForFunction(() => window.__floeMapDebug !== undefined);
  await page.evaluate(([c, o, t]) => window.__floeMapDebug?.loadCruise(c, o, t), [cruise, observations, track] as const);
}

export interface ScreenPoint {
  x: number;
  y: number;
}

/**
 * Where a position is drawn, in pixels of the map element (so banners that shift the page
 * between two steps of a test do not matter).
 */
export async function screenPoint(page: Page, lon: number, lat: number): Promise<ScreenPoint> {
  return page.evaluate(([lon, lat]) => window.__floeMapDebug?.project(lon, lat) ?? { x: NaN, y: NaN }, [lon, lat] as const);
}

/** The map element's own box, in its own pixels. */
export async function mapRect(page: Page): Promise<{ x: number; y: number; width: number; height: number }> {
  const box = await page.getByTestId('map-canvas').boundingBox();
  if (!box) throw new Error('map canvas has no box');
  return { x: 0, y: 0, width: box.width, height: box.height };
}

/** A map point in page pixels, for mouse clicks. */
export async function pagePoint(page: Page, p: ScreenPoint): Promise<ScreenPoint> {
  const box = await page.getByTestId('map-canvas').boundingBox();
  if (!box) throw new Error('map canvas has no box');
  return { x: box.x + p.x, y: box.y + p.y };
}

export type Rgb = [number, number, number];

/** The colour of the map at each point (map pixels), from a screenshot of the map decoded in the page itself. */
export async function pixels(page: Page, points: readonly ScreenPoint[]): Promise<Rgb[]> {
  const png = (await page.getByTestId('map-canvas').screenshot()).toString('base64');
  return page.evaluate(
    async ({ png, points }) => {
      const img = new Image();
      img.src = `data:image/png;base64,${png}`;
      await img.decode();
      const c = document.createElement('canvas');
      c.width = img.width;
      c.height = img.height;
      const ctx = c.getContext('2d', { willReadFrequently: true }) as CanvasRenderingContext2D;
      ctx.drawImage(img, 0, 0);
      return points.map((p) => Array.from(ctx.getImageData(Math.round(p.x), Math.round(p.y), 1, 1).data.slice(0, 3)) as [number, number, number]);
    },
    { png, points },
  );
}

export function colourDistance(a: Rgb, b: readonly number[]): number {
  return Math.hypot(a[0] - (b[0] as number), a[1] - (b[1] as number), a[2] - (b[2] as number));
}

export function hexRgb(hex: string): Rgb {
  return [parseInt(hex.slice(1, 3), 16), parseInt(hex.slice(3, 5), 16), parseInt(hex.slice(5, 7), 16)];
}

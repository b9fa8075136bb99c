// The life of one uPlot chart in the Review: loaded lazily (uPlot reads matchMedia when it loads,
// and it stays out of the first bundle), drawn in the display's text and border colours, redrawn
// at the page's width while printing, destroyed with its element. Shared by every Review chart.
import { useEffect, type RefObject } from 'react';
import type uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';

/** Canvas drawing needs a real browser; the component tests run in jsdom, which has none. */
export function canDraw(): boolean {
  return typeof window !== 'undefined' && typeof window.matchMedia === 'function' && !/jsdom/i.test(navigator.userAgent);
}

/** Chart width in CSS pixels on an A4 or Letter page with the usual margins. */
export const PRINT_WIDTH = 680;

/** The display's colours as the stylesheet sets them, for axes, grid lines and the red display. */
export interface PlotColours {
  text: string;
  grid: string;
  surface: string;
}

/** The chart's options (its size is the hook's) and data, from uPlot and the display's colours. */
export type PlotMaker = (UPlot: typeof uPlot, colours: PlotColours) => { opts: Omit<uPlot.Options, 'width' | 'height'>; data: uPlot.AlignedData };

/** Draws `make`'s chart into `box` whenever a dependency changes (the theme among them). */
export function useUPlot(box: RefObject<HTMLDivElement | null>, make: PlotMaker, deps: readonly unknown[]): void {
  useEffect(() => {
    const el = box.current;
    if (!el || !canDraw()) return;
    const width = Math.max(320, Math.min(1100, el.clientWidth || 800));
    const height = 200;
    // A printed page is narrower than the screen: redraw at the page's width while printing.
    const print = window.matchMedia('print');
    let plot: uPlot | null = null;
    let cancelled = false;
    const fitTo = (printing: boolean): void => {
      plot?.setSize({ width: printing ? PRINT_WIDTH : width, height });
    };
    const onPrint = (e: MediaQueryListEvent): void => fitTo(e.matches);
    print.addEventListener('change', onPrint);
    void import('uplot').then(({ default: UPlot }) => {
      if (cancelled) return;
      const css = getComputedStyle(document.documentElement);
      const colours: PlotColours = {
        text: css.getPropertyValue('--text').trim() || '#000',
        grid: css.getPropertyValue('--border').trim() || '#ccc',
        surface: css.getPropertyValue('--surface').trim() || '#fff',
      };
      const { opts, data } = make(UPlot, colours);
      plot = new UPlot({ ...opts, width, height }, data, el);
      fitTo(print.matches);
    });
    return () => {
      print.removeEventListener('change', onPrint);
      cancelled = true;
      plot?.destroy();
    };
    // The caller lists what the chart depends on; `make` is a fresh closure each render.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, deps);
}

/** Axis options in the display's colours. */
export function plotAxis(c: PlotColours): uPlot.Axis {
  return { stroke: c.text, grid: { stroke: c.grid, width: 1 }, ticks: { stroke: c.grid } };
}

/** Tick labels in UTC, 24-hour: "03-10 06:00" (the day only at midnight ticks). */
export function utcTickLabels(_u: uPlot, splits: number[]): string[] {
  return splits.map((ts) => {
    const iso = new Date(ts * 1000).toISOString();
    const hm = iso.slice(11, 16);
    return hm === '00:00' ? iso.slice(5, 10) : hm;
  });
}

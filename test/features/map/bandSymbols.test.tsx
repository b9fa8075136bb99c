// The bands in each display: the day keeps the WMO/TD-No. 1215 colours, the night dims them,
// the red display has no colour to work with and uses a brightness ramp plus a mark per band
// (our own design). The legend draws from the same description.
import { describe, expect, it } from 'vitest';
import type { FeatureCollection } from 'geojson';
import { render } from '@testing-library/react';
import { bandSymbol, hasMarks, markRects, NIGHT_DIMMING } from '../../../src/features/map/bandSymbols';
import { BANDS, hexColour } from '../../../src/features/map/concentrationBands';
import { MapLegend } from '../../../src/features/map/MapLegend';
import { buildStyle, LAYER, PALETTES } from '../../../src/features/map/style';

const rgb = (hex: string): [number, number, number] => {
  const n = parseInt(hex.slice(1), 16);
  return [n >> 16, (n >> 8) & 255, n & 255];
};
/** Relative luminance (WCAG 2, sRGB). */
const luminance = (hex: string): number => {
  const lin = (c: number) => (c / 255 <= 0.04045 ? c / 255 / 12.92 : ((c / 255 + 0.055) / 1.055) ** 2.4);
  const [r, g, b] = rgb(hex);
  return 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
};
const ORDER = ['ice-free', 'open-water', 'c1-3', 'c4-6', 'c7-8', 'c9-10'] as const;
const empty: FeatureCollection = { type: 'FeatureCollection', features: [] };

describe('band symbols per display', () => {
  it('day: the WMO/TD-No. 1215 colours themselves, no marks', () => {
    // WMO/TD-No. 1215 (ice chart colour standard), total concentration: 1-3/10 140,255,160; 9-10/10 255,0,0.
    expect(bandSymbol('day', 'c1-3').fill).toBe('#8cffa0');
    expect(bandSymbol('day', 'c9-10').fill).toBe('#ff0000');
    expect(hasMarks('day')).toBe(false);
    for (const b of BANDS) expect(bandSymbol('day', b.key).mark).toEqual([]);
  });

  it('night: the same hues, every channel dimmed by one factor, within the night limit', () => {
    for (const b of BANDS) {
      const [r, g, bl] = rgb(bandSymbol('night', b.key).fill as string);
      expect([r, g, bl]).toEqual(b.rgb.map((c) => Math.round(c * NIGHT_DIMMING)));
      expect(luminance(bandSymbol('night', b.key).fill as string)).toBeLessThanOrEqual(0.42);
    }
  });

  it('red: no green or blue, brightness rises with concentration, each band has a mark of its own', () => {
    for (const b of BANDS) {
      const s = bandSymbol('red', b.key);
      for (const c of [s.fill ?? '#000000', s.ring, s.ink]) {
        const [r, g, bl] = rgb(c);
        expect(g, `${b.key} ${c}`).toBeLessThanOrEqual(0.15 * r + 4);
        expect(bl, `${b.key} ${c}`).toBeLessThanOrEqual(0.15 * r + 4);
        expect(luminance(c)).toBeLessThanOrEqual(0.23);
      }
    }
    const fills = ORDER.map((k) => rgb(bandSymbol('red', k).fill ?? '#000000')[0]);
    for (let i = 1; i < fills.length; i++) expect(fills[i]).toBeGreaterThan(fills[i - 1] as number);
    // Distinct without any colour: fill brightness, hollow or not, and the mark's shape together.
    const looks = BANDS.map((b) => {
      const s = bandSymbol('red', b.key);
      return JSON.stringify([s.fill, markRects(s.mark)]);
    });
    expect(new Set(looks).size).toBe(BANDS.length);
    // Bars count up with the ice: 1, 2 and 3 for 1-3, 4-6 and 7-8/10.
    expect(['c1-3', 'c4-6', 'c7-8'].map((k) => bandSymbol('red', k as 'c1-3').mark.filter((m) => m.kind === 'bar').length)).toEqual([1, 2, 3]);
  });

  it('the map palettes of the red display carry red light only', () => {
    for (const c of Object.values(PALETTES.red)) {
      if (typeof c !== 'string') continue;
      const [, g, b] = rgb(c);
      expect(g, c).toBe(0);
      expect(b, c).toBe(0);
    }
    const red = buildStyle({ theme: 'red', projection: 'mercator', land110: empty, coast110: empty, graticule: empty });
    const day = buildStyle({ theme: 'day', projection: 'mercator', land110: empty, coast110: empty, graticule: empty });
    const marks = (s: typeof red) => s.layers.find((l) => l.id === LAYER.marks)?.layout as Record<string, unknown>;
    expect(marks(red).visibility).toBe('visible');
    expect(marks(day).visibility).toBe('none');
    expect(marks(red)['icon-image']).toEqual(['concat', 'mark:', ['get', 'band']]);
  });

  it('the legend shows the symbol the map draws in each display', () => {
    for (const theme of ['day', 'night', 'red'] as const) {
      const { container, unmount } = render(<MapLegend theme={theme} />);
      for (const b of BANDS) {
        const svg = container.querySelector(`svg[data-band="${b.key}"]`);
        const s = bandSymbol(theme, b.key);
        expect(svg?.querySelector('circle')?.getAttribute('fill')).toBe(s.fill ?? 'none');
        expect(svg?.querySelectorAll('rect, circle').length).toBe(1 + markRects(s.mark).length);
      }
      if (theme === 'day') expect(container.textContent).toContain('WMO/TD-No. 1215');
      unmount();
    }
    expect(hexColour([255, 0, 0])).toBe('#ff0000');
  });
});

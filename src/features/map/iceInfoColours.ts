// The colours of the ice information layers, in one place so each display (day, night, red) can
// adapt them. Chart polygons keep the WMO/TD-No. 1215 total-concentration colours in every display
// (as the observation symbols do), dimmed at night; the grid has a colour scale of its own so it
// is never mistaken for a chart.
import { GRID_FLAG } from '../../domain/collocation/chartModel';
import type { MapTheme } from './style';

export interface IceInfoPalette {
  chartOpacity: number;
  chartOutline: string;
  /** Grid scale: colour at 15 % and at 100 % (linear between), below 15 % left clear. */
  gridLow: readonly [number, number, number];
  gridHigh: readonly [number, number, number];
  gridAlpha: number;
  poleHole: readonly [number, number, number];
}

export const ICEINFO_PALETTES: Record<MapTheme, IceInfoPalette> = {
  day: { chartOpacity: 0.45, chartOutline: '#30343a', gridLow: [40, 70, 140], gridHigh: [245, 250, 255], gridAlpha: 170, poleHole: [120, 120, 120] },
  night: { chartOpacity: 0.25, chartOutline: '#7d8894', gridLow: [20, 40, 80], gridHigh: [150, 165, 180], gridAlpha: 140, poleHole: [60, 60, 60] },
  red: { chartOpacity: 0.18, chartOutline: '#6d0000', gridLow: [40, 0, 0], gridHigh: [170, 30, 30], gridAlpha: 140, poleHole: [50, 0, 0] },
};

/** The grid scale's lowest drawn value: the common 15 % ice edge (common practice). */
export const GRID_EDGE_PERCENT = 15;

export function gridColour(percent: number, p: IceInfoPalette): readonly [number, number, number, number] {
  if (percent < GRID_EDGE_PERCENT) return [0, 0, 0, 0];
  const t = (percent - GRID_EDGE_PERCENT) / (100 - GRID_EDGE_PERCENT);
  return [0, 1, 2].map((i) => Math.round(p.gridLow[i]! + t * (p.gridHigh[i]! - p.gridLow[i]!))).concat(p.gridAlpha) as unknown as readonly [number, number, number, number];
}

/**
 * RGBA for every cell byte (256 x 4): percent by `gridColour`, the pole hole in its grey, other
 * flags clear. Built once per image, so drawing a pixel is a lookup, not a new array.
 */
export function gridColourTable(p: IceInfoPalette): Uint8ClampedArray {
  const table = new Uint8ClampedArray(256 * 4);
  for (let v = 0; v <= 100; v++) table.set(gridColour(v, p), v * 4);
  table.set([...p.poleHole, p.gridAlpha], GRID_FLAG.poleHole * 4);
  return table;
}

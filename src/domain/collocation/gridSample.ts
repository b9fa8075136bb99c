// The value of a concentration grid at a point of its plane: the nearest cell, or bilinear
// interpolation between the four cell centres around the point.
//
// Bilinear choice (ours, stated in the exports and the Review): flagged neighbours (land, coast,
// missing, pole hole) are left out and the weights of the valid ones renormalised, so a point
// near the coast still gets a value from its ocean cells; when the nearest cell itself is flagged
// the point gets no value and the flag is reported, by both methods.
import { flagName, GRID_MAX_PERCENT, type ConcentrationGrid, type GridFlagName } from './chartModel.ts';

export type GridGeometry = Pick<ConcentrationGrid, 'width' | 'height' | 'x0' | 'y0' | 'dx' | 'dy' | 'cells'>;

export type GridSample =
  | { kind: 'value'; nearestPercent: number; bilinearPercent: number; row: number; col: number }
  | { kind: 'flag'; flag: GridFlagName; row: number; col: number }
  | { kind: 'outside' };

/** The percent of a cell, or -1 where it is off the grid or flagged. */
function validAt(g: GridGeometry, r: number, c: number): number {
  if (r < 0 || c < 0 || r >= g.height || c >= g.width) return -1;
  const v = g.cells[r * g.width + c] as number;
  return v > GRID_MAX_PERCENT ? -1 : v;
}

export function sampleGrid(g: GridGeometry, x: number, y: number): GridSample {
  const fc = (x - g.x0) / g.dx;
  const fr = (y - g.y0) / g.dy;
  const col = Math.round(fc);
  const row = Math.round(fr);
  if (!Number.isFinite(fc) || !Number.isFinite(fr) || col < 0 || row < 0 || col >= g.width || row >= g.height) return { kind: 'outside' };
  const nearest = g.cells[row * g.width + col] as number;
  const flag = flagName(nearest);
  if (flag !== null) return { kind: 'flag', flag, row, col };
  const c0 = Math.floor(fc);
  const r0 = Math.floor(fr);
  const tx = fc - c0;
  const ty = fr - r0;
  // The four neighbours, unrolled without a closure or an array (this runs once per observation,
  // 50,000 times in a review, and the garbage of a closure a call showed in the profile).
  const w00 = (1 - tx) * (1 - ty);
  const w01 = tx * (1 - ty);
  const w10 = (1 - tx) * ty;
  const w11 = tx * ty;
  const v00 = validAt(g, r0, c0);
  const v01 = validAt(g, r0, c0 + 1);
  const v10 = validAt(g, r0 + 1, c0);
  const v11 = validAt(g, r0 + 1, c0 + 1);
  let sum = 0;
  let wsum = 0;
  if (w00 > 0 && v00 >= 0) {
    sum += w00 * v00;
    wsum += w00;
  }
  if (w01 > 0 && v01 >= 0) {
    sum += w01 * v01;
    wsum += w01;
  }
  if (w10 > 0 && v10 >= 0) {
    sum += w10 * v10;
    wsum += w10;
  }
  if (w11 > 0 && v11 >= 0) {
    sum += w11 * v11;
    wsum += w11;
  }
  return { kind: 'value', nearestPercent: nearest, bilinearPercent: wsum > 0 ? sum / wsum : nearest, row, col };
}

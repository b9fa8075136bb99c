// A uniform grid over a chart's polygons' boxes, so locating a point tests only the polygons whose
// box covers its grid cell instead of every polygon (a national ice chart holds hundreds). Built
// once per polygon list and kept while that list lives. Candidates come back in polygon order, so
// the first polygon containing the point is the same one a plain scan finds.
import type { ChartPolygon } from './chartModel.ts';

export interface PolygonIndex {
  minX: number;
  minY: number;
  cellW: number;
  cellH: number;
  cols: number;
  rows: number;
  /** Polygon indices per grid cell, ascending. */
  cells: number[][];
}

const built = new WeakMap<readonly ChartPolygon[], PolygonIndex>();

export function polygonIndex(polys: readonly ChartPolygon[]): PolygonIndex {
  const hit = built.get(polys);
  if (hit) return hit;
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const p of polys) {
    const [x0, y0, x1, y1] = p.bbox as [number, number, number, number];
    if (x0 < minX) minX = x0;
    if (y0 < minY) minY = y0;
    if (x1 > maxX) maxX = x1;
    if (y1 > maxY) maxY = y1;
  }
  // About one polygon a cell on average, at most 256 x 256 cells.
  const side = Math.max(1, Math.min(256, Math.ceil(Math.sqrt(polys.length))));
  const cols = side;
  const rows = side;
  const cellW = (maxX - minX) / cols || 1;
  const cellH = (maxY - minY) / rows || 1;
  const cells: number[][] = Array.from({ length: cols * rows }, () => []);
  const col = (x: number) => Math.min(cols - 1, Math.max(0, Math.floor((x - minX) / cellW)));
  const row = (y: number) => Math.min(rows - 1, Math.max(0, Math.floor((y - minY) / cellH)));
  polys.forEach((p, i) => {
    const [x0, y0, x1, y1] = p.bbox as [number, number, number, number];
    for (let r = row(y0); r <= row(y1); r++) for (let c = col(x0); c <= col(x1); c++) (cells[r * cols + c] as number[]).push(i);
  });
  const index = { minX, minY, cellW, cellH, cols, rows, cells };
  built.set(polys, index);
  return index;
}

const NONE: readonly number[] = [];

/** The polygons whose box may hold (x, y): every polygon that does is in the list. */
export function candidates(ix: PolygonIndex, x: number, y: number): readonly number[] {
  const c = Math.floor((x - ix.minX) / ix.cellW);
  const r = Math.floor((y - ix.minY) / ix.cellH);
  // A point on the far edge of the whole box belongs to the last cell.
  const cc = c === ix.cols && x === ix.minX + ix.cellW * ix.cols ? c - 1 : c;
  const rr = r === ix.rows && y === ix.minY + ix.cellH * ix.rows ? r - 1 : r;
  if (cc < 0 || rr < 0 || cc >= ix.cols || rr >= ix.rows) return NONE;
  return ix.cells[rr * ix.cols + cc] as number[];
}

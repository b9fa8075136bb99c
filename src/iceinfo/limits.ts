// Size limits of ice information files, so a file too large for a browser tab is refused before
// it is decoded. A 3.125 km grid of the whole Arctic (about 2,400 x 3,600 cells, 8.6 million) still
// fits; anything larger than the limits is refused with a message naming them.
export const ICEINFO_LIMITS = {
  /** Largest file read, bytes. */
  maxFileBytes: 256 * 1024 * 1024,
  /** Largest number of grid cells (width x height). */
  maxGridCells: 9_000_000,
  /** Largest side of a grid, cells. */
  maxGridSide: 10_000,
  /** Largest number of chart polygons, and of vertices over all of them. */
  maxChartPolygons: 50_000,
  maxChartVertices: 5_000_000,
} as const;

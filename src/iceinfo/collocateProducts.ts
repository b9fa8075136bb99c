// The collocation of a cruise's observations with stored charts and grids, each located through
// its own plane: one function for the map, the Review and the app's exports, so all three give an
// observation the same chart and grid values.
import { collocate, type Collocation, type CollocationOptions } from '../domain/collocation/collocate';
import type { ConcentrationGrid, IceChart } from '../domain/collocation/chartModel';
import type { Observation } from '../domain/model';
import { planeOf } from './projections';

/** Chart and grid values per live observation id (deleted ones get none, as in the CLI). */
export function collocateProducts(
  observations: readonly Observation[],
  charts: readonly IceChart[],
  grids: readonly ConcentrationGrid[],
  limits: CollocationOptions,
): Map<string, Collocation> {
  return collocate(
    observations.filter((o) => !o.deleted),
    charts.map((chart) => ({ chart, toPlane: planeOf(chart.crs).toPlane })),
    grids.map((grid) => ({ grid, toPlane: planeOf(grid.crs).toPlane })),
    limits,
  );
}

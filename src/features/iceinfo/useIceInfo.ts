// The stored charts and grids shown on the map (the switched-on ones), the collocation of a
// cruise's observations with them, and the user's limits: shared by the map and the Review.
import { useLiveQuery } from 'dexie-react-hooks';
import { useMemo } from 'react';
import { getSetting, listIceCharts, listIceGrids, type IceChartRow, type IceGridRow } from '../../db';
import { DEFAULT_COLLOCATION, type Collocation, type CollocationOptions, type GridMethod, type ProductNote } from '../../domain/collocation';
import type { Observation } from '../../domain/model';
import { collocateProducts } from '../../iceinfo/collocateProducts';

export interface IceInfoSettings extends CollocationOptions {
  gridMethod: GridMethod;
}

export const DEFAULT_ICEINFO_SETTINGS: IceInfoSettings = { ...DEFAULT_COLLOCATION, gridMethod: 'bilinear' };

const NONE_C: IceChartRow[] = [];
const NONE_G: IceGridRow[] = [];

/** The switched-on charts and grids and the user's limits, read once (for an export). */
export async function readIceInfoProducts(): Promise<{ charts: IceChartRow[]; grids: IceGridRow[]; settings: IceInfoSettings }> {
  const [charts, grids, settings] = await Promise.all([listIceCharts(), listIceGrids(), getSetting('iceInfoCollocation')]);
  return { charts: charts.filter((c) => c.visible), grids: grids.filter((g) => g.visible), settings: settings ?? DEFAULT_ICEINFO_SETTINGS };
}

export function useIceInfoProducts(): { charts: IceChartRow[]; grids: IceGridRow[]; settings: IceInfoSettings } {
  const charts = useLiveQuery(async () => (await listIceCharts()).filter((c) => c.visible), []) ?? NONE_C;
  const grids = useLiveQuery(async () => (await listIceGrids()).filter((g) => g.visible), []) ?? NONE_G;
  const settings = useLiveQuery(() => getSetting('iceInfoCollocation'), []) ?? DEFAULT_ICEINFO_SETTINGS;
  return { charts, grids, settings };
}

export function productNotes(charts: readonly IceChartRow[], grids: readonly IceGridRow[]): ProductNote[] {
  return [
    ...charts.map((c): ProductNote => ({ kind: 'chart', sourceName: c.sourceName, time: c.chartTime, resolutionKm: null, fileName: c.fileName })),
    ...grids.map((g): ProductNote => ({ kind: 'grid', sourceName: g.sourceName, time: g.gridTime, resolutionKm: Math.abs(g.dx) / 1000, fileName: g.fileName })),
  ];
}

/** Chart and grid values per observation id (empty when nothing is stored). */
export function useCollocation(observations: readonly Observation[]): { collocation: Map<string, Collocation>; charts: IceChartRow[]; grids: IceGridRow[]; settings: IceInfoSettings } {
  const { charts, grids, settings } = useIceInfoProducts();
  const collocation = useMemo(() => {
    if (charts.length === 0 && grids.length === 0) return new Map<string, Collocation>();
    return collocateProducts(observations, charts, grids, settings);
  }, [observations, charts, grids, settings]);
  return { collocation, charts, grids, settings };
}

// The legend of the ice information layers: which charts and grids are drawn and how old they
// are, the grid's own colour scale, and the caution that neither is a navigation product.
import type { ConcentrationGrid, IceChart } from '../../domain/collocation/chartModel';
import { useNow } from '../log/useNow';
import { productAge } from '../exchange/iceInfoAge';
import { GRID_EDGE_PERCENT, gridColour, ICEINFO_PALETTES } from './iceInfoColours';
import { gridBox } from './iceInfoLayers';
import type { MapTheme } from './style';

const css = (c: readonly number[]) => `rgb(${c[0]}, ${c[1]}, ${c[2]})`;

export function IceInfoLegend({ theme, charts, grids }: { theme: MapTheme; charts: readonly IceChart[]; grids: readonly ConcentrationGrid[] }) {
  const now = useNow(60_000);
  if (charts.length === 0 && grids.length === 0) return null;
  const p = ICEINFO_PALETTES[theme];
  return (
    <section className="map-legend" aria-labelledby="iceinfo-legend-title" data-testid="iceinfo-legend">
      <h3 id="iceinfo-legend-title">Ice charts and satellite grids</h3>
      <ul>
        {charts.map((c) => (
          <li key={c.id}>
            Chart {c.sourceName}: valid {c.chartTime} ({productAge(c.chartTime, now)}), WMO/TD-No. 1215 colours
          </li>
        ))}
        {grids.map((g) => (
          <li key={g.id}>
            Grid {g.sourceName}: valid {g.gridTime} ({productAge(g.gridTime, now)}), {Math.abs(g.dx) / 1000} km cells
            {gridBox(g) === null && ', not drawn: it lies wholly beyond 85° of latitude, where the map tiles end (its values still reach the Review and the exports)'}
          </li>
        ))}
      </ul>
      {grids.length > 0 && (
        <>
          <div className="grid-scale" aria-hidden="true" style={{ background: `linear-gradient(to right, ${css(gridColour(GRID_EDGE_PERCENT, p))}, ${css(gridColour(100, p))})` }} />
          <p className="legend-source">
            Grid concentration {GRID_EDGE_PERCENT} % to 100 % (below {GRID_EDGE_PERCENT} % clear); grey: pole hole; land, coast and missing cells clear.
          </p>
        </>
      )}
      <p className="legend-source">Neither the charts nor the satellite grids are navigation products: the ship&apos;s ice information service and local regulations prevail.</p>
    </section>
  );
}

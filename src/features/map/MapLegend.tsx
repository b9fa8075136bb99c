import { BANDS, hexColour, MIZ_LEGEND } from './concentrationBands';
import { PALETTES, type MapTheme } from './style';

/** What the colours and lines mean, with their sources. */
export function MapLegend({ theme }: { theme: MapTheme }) {
  const p = PALETTES[theme];
  return (
    <section className="map-legend" aria-labelledby="map-legend-title">
      <h3 id="map-legend-title">Total concentration</h3>
      <ul>
        {BANDS.map((b) => (
          <li key={b.key}>
            <span className="swatch" style={{ background: hexColour(b.rgb) }} aria-hidden="true" />
            {b.label}
          </li>
        ))}
      </ul>
      <p className="legend-source">Colours: WMO ice chart colour standard (WMO/TD-No. 1215); fast ice colour from a draft.</p>
      <ul>
        <li>
          <span className="line-swatch" style={{ background: p.miz, opacity: 0.6, height: 8 }} aria-hidden="true" />
          {MIZ_LEGEND}, from the nearest observation in time
        </li>
        <li>
          <span className="line-swatch" style={{ background: p.track }} aria-hidden="true" />
          Ship track
        </li>
        <li>
          <span className="ship-swatch" aria-hidden="true" style={{ borderBottomColor: p.ship }} />
          Latest position and heading
        </li>
      </ul>
      <p className="legend-source">Zoom in to see each observation&apos;s egg code (WMO-No. 259).</p>
    </section>
  );
}

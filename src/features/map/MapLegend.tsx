import { BandSwatch } from './BandSwatch';
import { hasMarks, MARK_WORDS } from './bandSymbols';
import { BANDS, MIZ_LEGEND } from './concentrationBands';
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
            <BandSwatch band={b.key} theme={theme} />
            {b.label}
            {hasMarks(theme) && <span className="sr-only">, {MARK_WORDS[b.key]}</span>}
          </li>
        ))}
      </ul>
      {theme === 'day' && <p className="legend-source">Colours: WMO ice chart colour standard (WMO/TD-No. 1215); fast ice colour from a draft.</p>}
      {theme === 'night' && <p className="legend-source">Colours: WMO ice chart colour standard (WMO/TD-No. 1215), dimmed for the night; fast ice colour from a draft.</p>}
      {theme === 'red' && <p className="legend-source">Red display: more ice is brighter, and each class has its own mark (our own design; by day the WMO/TD-No. 1215 colours).</p>}
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

// The cruise by 1-degree latitude band.
import { STAGES } from '../../domain/nomenclature';
import { latitudeBandLabel, type LatitudeBandTable } from '../../domain/stats';
import { fmtCm, fmtHours, fmtPercent, fmtTenths } from './format';

export function BandTable({ table }: { table: LatitudeBandTable }) {
  return (
    <section aria-labelledby="review-bands-title" className="review-section">
      <h3 id="review-bands-title">By latitude band</h3>
      {table.bands.length === 0 ? (
        <p>No observation has a position.</p>
      ) : (
        <table className="review-table" data-testid="band-table">
          <thead>
            <tr>
              <th scope="col">Latitude</th>
              <th scope="col">Observations</th>
              <th scope="col">Hours</th>
              <th scope="col">Mean concentration</th>
              <th scope="col">Mean thickness</th>
              <th scope="col">Stages of development (share of the ice)</th>
            </tr>
          </thead>
          <tbody>
            {table.bands.slice().reverse().map((b) => (
              <tr key={b.south} data-band={b.south}>
                <th scope="row">{latitudeBandLabel(b.south)}</th>
                <td>{b.observations}</td>
                <td>{fmtHours(b.hours)}</td>
                <td>{fmtTenths(b.meanConcentration)}</td>
                <td>{fmtCm(b.meanThicknessCm)}</td>
                <td>
                  {b.stageShares.length === 0
                    ? 'no ice'
                    : b.stageShares
                        .slice()
                        .sort((x, y) => y.share - x.share)
                        .map((x) => `${STAGES[x.stage].shortLabel} ${fmtPercent(x.share)}`)
                        .join(', ')}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {table.withoutPosition > 0 && <p className="muted small">{table.withoutPosition} observations without a position are in no band.</p>}
    </section>
  );
}

// Versions of one observation side by side, differing lines marked.
import type { Observer } from '../../domain/model';
import { compareVersions, type Version } from './compareRows';

export function VersionTable({ versions, headings, observers, caption }: { versions: readonly Version[]; headings: string[]; observers: readonly Observer[]; caption: string }) {
  const rows = compareVersions(versions, observers);
  return (
    <div className="version-table-wrap">
      <table className="version-table">
        <caption>{caption}</caption>
        <thead>
          <tr>
            <th scope="col">Field</th>
            {headings.map((h) => (
              <th scope="col" key={h}>
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.label} className={r.differs ? 'differs' : undefined}>
              <th scope="row">
                {r.label}
                {r.differs && <span className="sr-only"> (changed)</span>}
              </th>
              {r.values.map((x, i) => (
                <td key={i}>{x}</td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

// What an import would do, before anything is written: counts per category.
import type { ImportSummary } from '../../db';

const ROWS: { key: keyof ImportSummary['counts']; label: string; note: string }[] = [
  { key: 'new', label: 'New observations', note: 'added' },
  { key: 'newer', label: 'Newer revisions', note: 'applied; the stored version goes to the history' },
  { key: 'older', label: 'Older revisions', note: 'kept as history' },
  { key: 'conflict', label: 'Conflicting', note: 'same revision, other content: both kept, flagged for review' },
  { key: 'identical', label: 'Identical', note: 'already stored; nothing to do' },
  { key: 'trackNew', label: 'New track points', note: 'added' },
  { key: 'trackDuplicate', label: 'Known track points', note: 'already stored' },
  { key: 'photosNew', label: 'New photos', note: 'added' },
];

export function ImportPreview({ summary }: { summary: ImportSummary }) {
  const { cruise, counts, warnings, fromVersion, photosWithoutBytes } = summary;
  return (
    <div data-testid="import-preview">
      <p>
        Cruise <strong>{cruise.value.name}</strong> ({cruise.value.vesselName}):{' '}
        {cruise.action === 'create' ? 'new on this laptop, will be created' : cruise.action === 'update' ? 'settings or observers will be updated' : 'already here'}.
        {fromVersion < 1 && ` The file is in the earlier format version ${fromVersion}; it is read by migration.`}
      </p>
      <table className="import-counts">
        <tbody>
          {ROWS.map((r) => (
            <tr key={r.key} data-testid={`count-${r.key}`}>
              <th scope="row">{r.label}</th>
              <td className="num">{counts[r.key]}</td>
              <td className="muted">{r.note}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {photosWithoutBytes > 0 && (
        <p className="muted">{photosWithoutBytes} photos are listed but not included in this file; import the zip archive to bring them.</p>
      )}
      {warnings.length > 0 && (
        <details>
          <summary>{warnings.length} quality-control warnings in the file (imported as they are; the review screen lists them)</summary>
          <ul className="problem-list">
            {warnings.slice(0, 20).map((w, i) => (
              <li key={i}>
                <code>{w.path}</code>: {w.message}
              </li>
            ))}
          </ul>
          {warnings.length > 20 && <p className="muted">... and {warnings.length - 20} more</p>}
        </details>
      )}
    </div>
  );
}

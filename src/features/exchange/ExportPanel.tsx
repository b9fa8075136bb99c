// Export buttons: each writes the chosen cruise in one format and offers it as a download.
import { useState } from 'react';
import { setSetting } from '../../db';
import { saveBlob } from './download';
import { buildExport, EXPORT_KINDS, EXPORT_LABELS, type ExportKind } from './exportFiles';
import { CURRENT_VERSION, SCHEMA_V2_PATH } from '../../format/types';

export function ExportPanel({ cruiseId }: { cruiseId: string | null }) {
  const [busy, setBusy] = useState<ExportKind | null>(null);
  const [includeDeleted, setIncludeDeleted] = useState(false);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);

  async function run(kind: ExportKind) {
    if (!cruiseId) return;
    setBusy(kind);
    setMessage(null);
    try {
      const { blob, fileName } = await buildExport(cruiseId, kind, { includeDeleted });
      saveBlob(blob, fileName);
      await setSetting('lastExportAt', new Date().toISOString());
      setMessage({ ok: true, text: `Exported ${fileName} (${Math.max(1, Math.round(blob.size / 1024))} KB).` });
    } catch (err) {
      setMessage({ ok: false, text: `Export failed: ${err instanceof Error ? err.message : String(err)}` });
    } finally {
      setBusy(null);
    }
  }

  return (
    <section className="exchange-panel" aria-labelledby="export-title">
      <h3 id="export-title">Export</h3>
      {!cruiseId && <p className="muted">No cruise to export yet.</p>}
      <div className="export-buttons">
        {EXPORT_KINDS.map((k) => (
          <button key={k} type="button" className="button" disabled={!cruiseId || busy !== null} onClick={() => void run(k)} title={EXPORT_LABELS[k].hint}>
            {busy === k ? 'Exporting...' : EXPORT_LABELS[k].label}
          </button>
        ))}
      </div>
      <label className="inline-check">
        <input type="checkbox" checked={includeDeleted} onChange={(e) => setIncludeDeleted(e.target.checked)} />
        Include deleted observations in GeoJSON, CSV and NDJSON
      </label>
      <p className="muted small">
        The full log follows the published format &quot;floe-ledger-log&quot; version {CURRENT_VERSION} (
        <a href={SCHEMA_V2_PATH} target="_blank" rel="noreferrer">
          JSON Schema
        </a>
        ): times in UTC, positions in WGS 84 decimal degrees, concentrations in tenths, WMO terms with SIGRID-3 codes.
      </p>
      {message && (
        <p role="status" className={message.ok ? 'ok' : 'error'} data-testid="export-message">
          {message.text}
        </p>
      )}
    </section>
  );
}

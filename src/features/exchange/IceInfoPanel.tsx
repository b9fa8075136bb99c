// Import of ice charts (SIGRID-3 zipped shapefile or GeoJSON) and concentration grids (GeoTIFF,
// classic NetCDF) into the store, read in a worker with progress; the list of what is stored,
// with each product's age, a switch for the map and removal.
import { useLiveQuery } from 'dexie-react-hooks';
import { useRef, useState } from 'react';
import { deleteIceInfo, listIceInfo, saveIceChart, saveIceGrid, setIceInfoVisible, setSetting } from '../../db';
import { useIceInfoProducts } from '../iceinfo/useIceInfo';
import { GEOTIFF_PRESET_NAMES, type GeoTiffPreset } from '../../iceinfo/gridCells';
import { useNow } from '../log/useNow';
import { readIceInfoInWorker } from './iceInfoClient';
import { productAge } from './iceInfoAge';
import type { IceInfoStage } from './iceInfoRead';

const STAGE_PROGRESS: Record<IceInfoStage, number> = { read: 0.2, decode: 0.5, done: 0.9 };
const PRESET_WORDS: Record<GeoTiffPreset, string> = {
  percent: 'percent 0-100 (flags 251-255)',
  'nsidc-byte': '0-250 for 0-100 % (flags 251-255)',
  'per-mille': '0-1000 for 0-100 % (flags 2510-2550)',
  fraction: 'fraction 0-1',
};

type Phase = { kind: 'idle' } | { kind: 'reading'; fileName: string; progress: number } | { kind: 'done'; message: string; warnings: string[] } | { kind: 'failed'; message: string };

export function IceInfoPanel() {
  const list = useLiveQuery(() => listIceInfo(), []);
  const now = useNow(60_000);
  const [phase, setPhase] = useState<Phase>({ kind: 'idle' });
  const [sourceName, setSourceName] = useState('');
  const [time, setTime] = useState('');
  const [preset, setPreset] = useState<GeoTiffPreset>('percent');
  const input = useRef<HTMLInputElement>(null);
  const { settings } = useIceInfoProducts();

  async function importFile(file: File) {
    setPhase({ kind: 'reading', fileName: file.name, progress: 0.05 });
    try {
      const r = await readIceInfoInWorker(
        { file, fileName: file.name, sourceName, time, preset, id: crypto.randomUUID(), importedAt: new Date().toISOString() },
        (stage) => setPhase({ kind: 'reading', fileName: file.name, progress: STAGE_PROGRESS[stage] }),
      );
      if (!r.ok) {
        setPhase({ kind: 'failed', message: `Nothing was stored: ${r.message}` });
        return;
      }
      if (r.kind === 'chart') await saveIceChart(r.chart);
      else await saveIceGrid(r.grid);
      const what = r.kind === 'chart' ? `chart with ${r.chart.polygons.length} polygons, valid ${r.chart.chartTime}` : `grid of ${r.grid.width} x ${r.grid.height} cells (EPSG:${r.grid.epsg}), valid ${r.grid.gridTime}`;
      setPhase({ kind: 'done', message: `Imported ${file.name}: ${what}.`, warnings: r.warnings });
    } catch (err) {
      setPhase({ kind: 'failed', message: `Nothing was stored: ${err instanceof Error ? err.message : String(err)}` });
    }
    if (input.current) input.current.value = '';
  }

  const busy = phase.kind === 'reading';
  return (
    <section className="exchange-panel iceinfo-panel" aria-labelledby="iceinfo-title">
      <h3 id="iceinfo-title">Ice charts and satellite grids</h3>
      <p className="small">
        SIGRID-3 ice charts (zipped shapefile or GeoJSON) and sea-ice concentration grids (GeoTIFF, classic NetCDF or NetCDF-4 / HDF5 on the NSIDC polar
        stereographic or EASE-Grid 2.0 planes). Neither is a navigation product.
      </p>
      <label className="field-line">
        Source{' '}
        <input value={sourceName} onChange={(e) => setSourceName(e.target.value)} placeholder="issuing service and product" aria-label="Source of the chart or grid" />
      </label>
      <label className="field-line">
        Valid time (UTC){' '}
        <input value={time} onChange={(e) => setTime(e.target.value)} placeholder="2026-03-04T18:00:00Z, if the file has none" aria-label="Valid time of the chart or grid" />
      </label>
      <label className="field-line">
        GeoTIFF values{' '}
        <select value={preset} onChange={(e) => setPreset(e.target.value as GeoTiffPreset)} aria-label="How the GeoTIFF values read">
          {GEOTIFF_PRESET_NAMES.map((p) => (
            <option key={p} value={p}>
              {PRESET_WORDS[p]}
            </option>
          ))}
        </select>
      </label>
      <label className="field-line">
        File{' '}
        <input
          ref={input}
          type="file"
          accept=".zip,.geojson,.json,.tif,.tiff,.nc,.nc4,.h5"
          disabled={busy || sourceName.trim() === ''}
          aria-label="Chart or grid file"
          onChange={(e) => {
            const f = e.target.files?.[0];
            if (f) void importFile(f);
          }}
        />
      </label>
      {sourceName.trim() === '' && <p className="small muted">Type the source first.</p>}
      {phase.kind === 'reading' && (
        <p>
          Reading {phase.fileName} <progress value={phase.progress} max={1} aria-label="Chart or grid import progress" />
        </p>
      )}
      {phase.kind === 'done' && (
        <div role="status">
          <p className="ok">{phase.message}</p>
          {phase.warnings.length > 0 && (
            <ul className="problem-list">
              {phase.warnings.map((w) => (
                <li key={w}>{w}</li>
              ))}
            </ul>
          )}
        </div>
      )}
      {phase.kind === 'failed' && (
        <p className="error" role="alert">
          {phase.message}
        </p>
      )}
      <fieldset className="iceinfo-limits">
        <legend>Comparing observations with charts and grids</legend>
        <HoursInput label="Chart within (hours)" aria="Largest time between an observation and a chart, hours" value={settings.chartMaxHours} onChange={(h) => void setSetting('iceInfoCollocation', { ...settings, chartMaxHours: h })} />
        <HoursInput label="Grid within (hours)" aria="Largest time between an observation and a grid, hours" value={settings.gridMaxHours} onChange={(h) => void setSetting('iceInfoCollocation', { ...settings, gridMaxHours: h })} />
        <label className="field-line">
          Grid value{' '}
          <select value={settings.gridMethod} aria-label="Grid value at an observation" onChange={(e) => void setSetting('iceInfoCollocation', { ...settings, gridMethod: e.target.value === 'nearest' ? 'nearest' : 'bilinear' })}>
            <option value="bilinear">bilinear between the four nearest cells (flagged cells left out)</option>
            <option value="nearest">nearest cell</option>
          </select>
        </label>
      </fieldset>
      {list && list.length > 0 && (
        <ul className="iceinfo-list" aria-label="Stored charts and grids">
          {list.map((x) => (
            <li key={`${x.kind}:${x.id}`}>
              <label className="inline-check">
                <input type="checkbox" checked={x.visible} onChange={(e) => void setIceInfoVisible(x.kind, x.id, e.target.checked)} aria-label={`Show ${x.kind} ${x.sourceName} on the map`} />
                <span>
                  {x.kind === 'chart' ? 'Chart' : 'Grid'}: <strong>{x.sourceName}</strong>, valid {x.time} ({productAge(x.time, now)}), {x.fileName}
                </span>
              </label>
              <button type="button" className="small" onClick={() => void deleteIceInfo(x.kind, x.id)} aria-label={`Remove ${x.kind} ${x.sourceName}`}>
                Remove
              </button>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}

function HoursInput({ label, aria, value, onChange }: { label: string; aria: string; value: number; onChange: (hours: number) => void }) {
  return (
    <label className="field-line">
      {label}{' '}
      <input type="number" min={1} max={720} value={value} aria-label={aria} onChange={(e) => Number(e.target.value) > 0 && onChange(Number(e.target.value))} />
    </label>
  );
}

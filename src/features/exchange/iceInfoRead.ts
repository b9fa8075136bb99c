// Reading a chart or grid file for the app: the kind by the file's first bytes, the readers of
// src/iceinfo, and progress by stage. Runs in iceInfoWorker.ts (or here where Worker is missing).
import type { ConcentrationGrid, IceChart } from '../../domain/collocation/chartModel';
import { readChartFile } from '../../iceinfo/chartRead';
import type { GeoTiffPreset } from '../../iceinfo/gridCells';
import { readGridFile, sniffGrid } from '../../iceinfo/gridRead';
import { IceInfoError } from '../../iceinfo/problems';

export interface IceInfoRequest {
  file: Blob;
  fileName: string;
  sourceName: string;
  time: string;
  preset: GeoTiffPreset;
  id: string;
  importedAt: string;
}

export type IceInfoRead =
  | { ok: true; kind: 'chart'; chart: IceChart; warnings: string[] }
  | { ok: true; kind: 'grid'; grid: ConcentrationGrid; warnings: string[] }
  | { ok: false; message: string };

export type IceInfoStage = 'read' | 'decode' | 'done';

// NetCDF-4 / HDF5 needs h5wasm's WebAssembly (about 4 MB), more than the whole app; the command
// line reads it (docs/dev/iceinfo.md).
const HDF5_IN_APP = 'is NetCDF-4 / HDF5: the app does not read it (its reader is larger than the whole app). Read it with the command line (floe-ledger summary or convert with --grid), or bring the grid as GeoTIFF or classic NetCDF';

export async function readIceInfoFile(req: IceInfoRequest, progress: (stage: IceInfoStage) => void): Promise<IceInfoRead> {
  try {
    progress('read');
    const bytes = new Uint8Array(await req.file.arrayBuffer());
    progress('decode');
    const time = req.time.trim();
    const kind = sniffGrid(bytes);
    if (kind === 'hdf5') return { ok: false, message: `${req.fileName} ${HDF5_IN_APP}.` };
    if (kind !== null) {
      const { grid, warnings } = await readGridFile(bytes, { id: req.id, sourceName: req.sourceName, fileName: req.fileName, importedAt: req.importedAt, preset: req.preset, ...(time ? { gridTime: time } : {}) });
      progress('done');
      return { ok: true, kind: 'grid', grid, warnings };
    }
    const { chart, warnings } = await readChartFile(bytes, { id: req.id, sourceName: req.sourceName, fileName: req.fileName, importedAt: req.importedAt, ...(time ? { chartTime: time } : {}) });
    progress('done');
    return { ok: true, kind: 'chart', chart, warnings };
  } catch (e) {
    return { ok: false, message: e instanceof IceInfoError ? e.message : `${req.fileName} could not be read: ${e instanceof Error ? e.message : String(e)}` };
  }
}

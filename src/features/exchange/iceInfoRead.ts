// Reading a chart or grid file for the app: the kind by the file's first bytes, the readers of
// src/iceinfo, and progress by stage. Runs in iceInfoWorker.ts (or here where Worker is missing).
import type { ConcentrationGrid, IceChart } from '../../domain/collocation/chartModel';
import { readChartFile } from '../../iceinfo/chartRead';
import type { GeoTiffPreset } from '../../iceinfo/gridCells';
import { readGridFile, sniffGrid } from '../../iceinfo/gridRead';
import { browserHdf5 } from '../../iceinfo/hdf5Browser';
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

export async function readIceInfoFile(req: IceInfoRequest, progress: (stage: IceInfoStage) => void): Promise<IceInfoRead> {
  try {
    progress('read');
    const bytes = new Uint8Array(await req.file.arrayBuffer());
    progress('decode');
    const time = req.time.trim();
    const kind = sniffGrid(bytes);
    if (kind !== null) {
      const { grid, warnings } = await readGridFile(bytes, { id: req.id, sourceName: req.sourceName, fileName: req.fileName, importedAt: req.importedAt, preset: req.preset, ...(time ? { gridTime: time } : {}) }, browserHdf5);
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

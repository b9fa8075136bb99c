// Checks of a shapefile's index (.shx) against its geometry (.shp), from the ESRI Shapefile
// Technical Description (ESRI White Paper, July 1998): both files start with a 100-byte header
// whose first big-endian integer is the file code 9994 and whose integer at byte 24 is the file
// length in 16-bit words; each .shx record is 8 bytes (offset and content length in words, big
// endian), and each .shp record starts with its 1-based record number and content length.
// The reader itself walks the .shp; a broken index means the files do not belong together or
// were cut, and we refuse rather than guess.
import { refuse } from './problems.ts';

const FILE_CODE = 9994;

function header(view: DataView, file: string): void {
  if (view.byteLength < 100) refuse(`${file} is ${view.byteLength} bytes long, shorter than the 100-byte shapefile header`);
  const code = view.getInt32(0, false);
  if (code !== FILE_CODE) refuse(`${file} does not start with the shapefile file code 9994 (found ${code})`);
  const words = view.getInt32(24, false);
  if (words * 2 !== view.byteLength) refuse(`${file} says it is ${words * 2} bytes long but has ${view.byteLength}: the file is cut or damaged`);
}

export function checkShapefileIndex(shp: Uint8Array, shx: Uint8Array, shxName: string, shpName: string): void {
  const shpView = new DataView(shp.buffer, shp.byteOffset, shp.byteLength);
  const shxView = new DataView(shx.buffer, shx.byteOffset, shx.byteLength);
  header(shpView, shpName);
  header(shxView, shxName);
  if ((shx.byteLength - 100) % 8 !== 0) refuse(`${shxName} has a record area of ${shx.byteLength - 100} bytes, not a multiple of 8`);
  const n = (shx.byteLength - 100) / 8;
  for (let i = 0; i < n; i++) {
    const offset = shxView.getInt32(100 + 8 * i, false) * 2;
    const length = shxView.getInt32(104 + 8 * i, false) * 2;
    if (offset < 100 || offset + 8 + length > shp.byteLength) refuse(`${shxName}: record ${i + 1} points to bytes ${offset}..${offset + 8 + length}, outside ${shpName} (${shp.byteLength} bytes)`);
    const recNo = shpView.getInt32(offset, false);
    const recLen = shpView.getInt32(offset + 4, false) * 2;
    if (recNo !== i + 1 || recLen !== length) refuse(`${shxName}: record ${i + 1} does not match the record found at byte ${offset} of ${shpName}`);
  }
}

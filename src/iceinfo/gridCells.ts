// Turning a product's raw cell values into our cell bytes (percent 0..100 or a GRID_FLAG), with
// the product's flags honoured: explicit flag values first (CF Conventions section 3.5,
// flag_values / flag_meanings), then the fill value, then the scale to percent.
import { GRID_FLAG, type GridFlagName } from '../domain/collocation/chartModel.ts';

export interface CellEncoding {
  /** Raw values that are flags, and what they mean. */
  flags: ReadonlyMap<number, GridFlagName>;
  /** The raw fill / no-data value, if any (a missing cell). */
  fill: number | null;
  /** physical = raw * scale + offset (CF scale_factor / add_offset). */
  scale: number;
  offset: number;
  /** The physical value that means 100 % (100 for percent, 1 for a fraction). */
  full: number;
}

/**
 * Presets for GeoTIFF products, whose files carry no CF attributes:
 * - `percent`: 0..100, and the NSIDC byte flags 251 pole hole, 252 unused, 253 coast, 254 land,
 *   255 missing (NSIDC-0051 user guide, from memory);
 * - `nsidc-byte`: 0..250 for 0..100 % with the same flags (NSIDC-0051 raw bytes, from memory);
 * - `per-mille`: 0..1000 for 0..100 % with 2510 pole hole, 2530 coast, 2540 land, 2550 missing
 *   (the NSIDC Sea Ice Index GeoTIFFs, from memory);
 * - `fraction`: 0..1, no flag values (NaN or the no-data value is missing).
 */
export const GEOTIFF_PRESETS = {
  percent: { full: 100, scale: 1, flags: [[251, 'poleHole'], [252, 'unknownFlag'], [253, 'coast'], [254, 'land'], [255, 'missing']] },
  'nsidc-byte': { full: 250, scale: 1, flags: [[251, 'poleHole'], [252, 'unknownFlag'], [253, 'coast'], [254, 'land'], [255, 'missing']] },
  'per-mille': { full: 1000, scale: 1, flags: [[2510, 'poleHole'], [2530, 'coast'], [2540, 'land'], [2550, 'missing']] },
  fraction: { full: 1, scale: 1, flags: [] },
} as const satisfies Record<string, { full: number; scale: number; flags: readonly (readonly [number, GridFlagName])[] }>;

export type GeoTiffPreset = keyof typeof GEOTIFF_PRESETS;
export const GEOTIFF_PRESET_NAMES = Object.keys(GEOTIFF_PRESETS) as GeoTiffPreset[];

export function presetEncoding(p: GeoTiffPreset, fill: number | null): CellEncoding {
  const e = GEOTIFF_PRESETS[p];
  return { flags: new Map(e.flags), fill, scale: e.scale, offset: 0, full: e.full };
}

/** What a CF flag meaning names, by its words (ours: "land", "coast", "pole hole", "missing"). */
export function flagFromMeaning(meaning: string): GridFlagName {
  const m = meaning.toLowerCase();
  if (/pole|hole/.test(m)) return 'poleHole';
  if (/coast/.test(m)) return 'coast';
  if (/land|lake/.test(m)) return 'land';
  if (/missing|fill|no_?data|invalid/.test(m)) return 'missing';
  return 'unknownFlag';
}

export interface EncodedCells {
  cells: Uint8Array;
  counts: Record<GridFlagName | 'value' | 'outOfRange', number>;
}

/**
 * Cell bytes from raw values, read row by row. `flipRows` turns a grid stored south row first
 * into our north-first order. A value outside 0..full that is no flag is counted and marked as
 * unknownFlag (never drawn, never compared).
 */
export function encodeCells(raw: ArrayLike<number>, width: number, height: number, enc: CellEncoding, flipRows = false): EncodedCells {
  const cells = new Uint8Array(width * height);
  const counts: EncodedCells['counts'] = { value: 0, poleHole: 0, unknownFlag: 0, coast: 0, land: 0, missing: 0, outOfRange: 0 };
  const tol = enc.full * 1e-6;
  for (let r = 0; r < height; r++) {
    const src = (flipRows ? height - 1 - r : r) * width;
    const dst = r * width;
    for (let c = 0; c < width; c++) {
      const v = raw[src + c] as number;
      let out: number;
      const flag = enc.flags.get(v);
      if (flag !== undefined) out = GRID_FLAG[flag];
      else if (Number.isNaN(v) || (enc.fill !== null && v === enc.fill)) out = GRID_FLAG.missing;
      else {
        const phys = v * enc.scale + enc.offset;
        if (phys < -tol || phys > enc.full + tol) {
          counts.outOfRange++;
          out = GRID_FLAG.unknownFlag;
        } else out = Math.round(Math.min(100, Math.max(0, (phys / enc.full) * 100)));
      }
      cells[dst + c] = out;
      if (out <= 100) counts.value++;
      else if (out === GRID_FLAG.poleHole) counts.poleHole++;
      else if (out === GRID_FLAG.coast) counts.coast++;
      else if (out === GRID_FLAG.land) counts.land++;
      else if (out === GRID_FLAG.missing) counts.missing++;
      else counts.unknownFlag++;
    }
  }
  return { cells, counts };
}

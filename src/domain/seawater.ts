// Freezing point of sea water, UNESCO 1983 (Fofonoff and Millard, "Algorithms for computation
// of fundamental properties of seawater", UNESCO Technical Papers in Marine Science 44, EOS-80):
//   Tf = -0.0575 S + 1.710523e-3 S^1.5 - 2.154996e-4 S^2 - 7.53e-4 p
// S practical salinity, p pressure in decibars; stated valid for S 4..40.

/** Salinity assumed when none was measured: open polar surface water (common practice). */
export const DEFAULT_SALINITY_PSU = 35;

/** Range of salinity over which the UNESCO 1983 formula is stated to hold. */
export const FREEZING_POINT_SALINITY_RANGE = { min: 4, max: 40 } as const;

/** Freezing point in °C (IPTS-68 as published) for salinity S and pressure p (dbar, 0 at the surface). */
export function freezingPointC(salinityPsu: number, pressureDbar = 0): number {
  const s = salinityPsu;
  return -0.0575 * s + 1.710523e-3 * s ** 1.5 - 2.154996e-4 * s * s - 7.53e-4 * pressureDbar;
}

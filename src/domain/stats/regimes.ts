// Ice regimes by total concentration, for hours and distance in ice.
//
// - In ice: total concentration at least 1/10 (below 1/10 is "open water" in WMO-No. 259).
// - Marginal ice zone: 2/10 to 8/10. The marginal ice zone is commonly taken as the area of 15 %
//   to 80 % ice concentration (common practice in sea-ice climatology, no single standard);
//   in whole tenths that is 2/10 (15 % rounds up) to 8/10.
// - Pack ice: 9/10 and 10/10, i.e. over 80 %: WMO-No. 259's very close, compact and consolidated
//   ice. WMO-No. 259 uses "pack ice" in a wide sense for any sea ice other than fast ice; the
//   narrower use here, the ice beyond the marginal ice zone, is common practice.
// - 1/10 is in ice but in neither band: the scattered fringe ahead of the marginal ice zone.
import type { Tenths } from '../model.ts';

export const ICE_REGIMES = ['open-water', 'fringe', 'marginal', 'pack', 'not-judged'] as const;
export type IceRegime = (typeof ICE_REGIMES)[number];

export const ICE_REGIME_LABELS: Readonly<Record<IceRegime, string>> = {
  'open-water': 'Open water (less than 1/10)',
  fringe: 'Scattered ice (1/10)',
  marginal: 'Marginal ice zone (2/10 to 8/10, 15 % to 80 %)',
  pack: 'Pack ice (9/10 to 10/10, over 80 %)',
  'not-judged': 'Concentration not judged',
};

/** The least total concentration counted as "in ice", in tenths. */
export const IN_ICE_MIN_TENTHS = 1;

export function iceRegime(total: Tenths | null): IceRegime {
  if (total === null || !Number.isFinite(total)) return 'not-judged';
  if (total < 1) return 'open-water';
  if (total < 2) return 'fringe';
  if (total <= 8) return 'marginal';
  return 'pack';
}

export function isInIce(regime: IceRegime): boolean {
  return regime === 'fringe' || regime === 'marginal' || regime === 'pack';
}

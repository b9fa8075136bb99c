// The domain's checks of one entry, in the context of its cruise and its neighbours in time,
// and of a whole cruise for the list (sequence rules run once over the series).
import type { Cruise, Finding, Observation } from '../../domain/model';
import { checkSequence, validateObservation } from '../../domain/rules';
import type { ObservationFields } from './formModel';

/** The entry as a stored observation would be, for the rules (stamps are the store's business). */
function asObservation(fields: ObservationFields): Observation {
  return { ...fields, revision: 0, savedAt: '', savedBy: '', deviceId: '', deleted: false };
}

/** The stored observations just before and after `time`, other than the entry itself. */
function neighbours(others: readonly Observation[], id: string, time: string): Observation[] {
  let before: Observation | undefined;
  let after: Observation | undefined;
  for (const o of others) {
    if (o.id === id || o.deleted) continue;
    if (o.time <= time && (!before || o.time > before.time)) before = o;
    if (o.time > time && (!after || o.time < after.time)) after = o;
  }
  return [before, after].filter((o): o is Observation => o !== undefined);
}

/** Findings of one entry: its own rules, and the sequence rules against its neighbours. */
export function observationFindings(fields: ObservationFields, cruise: Cruise, others: readonly Observation[]): Finding[] {
  const obs = asObservation(fields);
  const own = validateObservation(obs, cruise);
  const seq = checkSequence([...neighbours(others, obs.id, obs.time), obs], cruise);
  return [...own, ...seq];
}

/** Findings of every observation of a cruise, by observation id (sequence rules run once). */
export function cruiseFindings(cruise: Cruise, observations: readonly Observation[]): Map<string, Finding[]> {
  const out = new Map<string, Finding[]>();
  for (const o of observations) out.set(o.id, validateObservation(o, cruise));
  for (const f of checkSequence(observations, cruise)) {
    if (!f.observationId) continue;
    const list = out.get(f.observationId);
    if (list) list.push(f);
  }
  return out;
}

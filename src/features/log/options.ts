// The pick lists of the form, built from the domain's nomenclature tables (WMO-No. 259 terms
// and egg-code symbols): the form never keeps a list of its own.
import {
  FLOE_SIZE_KEYS, OPEN_WATER_KINDS, SNOW_COVERS, SNOW_WETNESS_CLASSES, STAGE_KEYS,
  type FloeSizeKey, type Observer, type OpenWaterKind, type PositionSource, type SnowCoverKey, type SnowWetness, type StageKey,
} from '../../domain/model';
import { FLOE_SIZES, OPEN_WATER_LABELS, SNOW_COVER_LABELS, SNOW_WETNESS, STAGES } from '../../domain/nomenclature';
import type { MeltPondState } from '../../state/observationForm';
import type { PickOption } from './PickList';

export const STAGE_OPTIONS: PickOption<StageKey>[] = STAGE_KEYS.map((k) => ({
  value: k,
  label: STAGES[k].label,
  code: STAGES[k].eggCode,
}));

export const FLOE_SIZE_OPTIONS: PickOption<FloeSizeKey>[] = FLOE_SIZE_KEYS.map((k) => ({
  value: k,
  label: FLOE_SIZES[k].label,
  code: FLOE_SIZES[k].eggCode,
}));

export const SNOW_COVER_OPTIONS: PickOption<SnowCoverKey>[] = SNOW_COVERS.map((k) => ({ value: k, label: SNOW_COVER_LABELS[k] }));

/** Wetness classes with their one-letter codes (Fierz et al. 2009), so `W` or `V` picks by code. */
export const SNOW_WETNESS_OPTIONS: PickOption<SnowWetness>[] = SNOW_WETNESS_CLASSES.map((k) => ({
  value: k,
  label: SNOW_WETNESS[k].label,
  code: SNOW_WETNESS[k].code,
}));

export const OPEN_WATER_OPTIONS: PickOption<OpenWaterKind>[] = OPEN_WATER_KINDS.map((k) => ({
  value: k,
  label: OPEN_WATER_LABELS[k],
}));

/** Melt pond states: our own plain words. */
export const MELT_STATE_OPTIONS: PickOption<Exclude<MeltPondState, ''>>[] = [
  { value: 'open', label: 'Open water in the ponds' },
  { value: 'frozen', label: 'Frozen over' },
  { value: 'drained', label: 'Drained' },
];

export const POSITION_SOURCE_LABELS: Record<PositionSource, string> = {
  // Distinct first letters, so the picker is type-to-pick by one key (S, G, M, T).
  'gps-serial': 'Ship GPS (serial)',
  geolocation: 'Geolocation of this device',
  manual: 'Manual, typed',
  'track-interpolated': 'Track, at the observation time',
  'track-file': 'A point of a track file',
};

/** The sources an observer can take a position from (a track file's points are interpolated). */
export const OBSERVATION_POSITION_SOURCES: readonly PositionSource[] = ['gps-serial', 'geolocation', 'manual', 'track-interpolated'];

export function observerOptions(observers: readonly Observer[]): PickOption[] {
  return observers.map((o) => ({ value: o.id, label: `${o.name} (${o.initials})`, code: o.initials }));
}

// Rules for one observation. Each rule is a small function that returns findings; the list
// OBSERVATION_RULES is what validateObservation runs. To add a rule: add its code to
// catalogue.ts, write the function here, append it to the list, and test it (docs/dev/domain.md).

import type { Cruise, Finding, IceCategory, Observation } from '../model.ts';
import { FLOE_SIZE_KEYS, SNOW_COVERS, SNOW_WETNESS_CLASSES, STAGE_KEYS } from '../model.ts';
import { STAGES } from '../nomenclature.ts';
import { isStageSurelyThicker, isSurelyThicker } from '../ordering.ts';
import { isValidLatLon } from '../position.ts';
import { DEFAULT_SALINITY_PSU, FREEZING_POINT_SALINITY_RANGE, freezingPointC } from '../seawater.ts';
import { KEEL_TO_SAIL_RATIO, MAX_KEEL_DEPTH_M } from '../ridges.ts';
import { finding } from './catalogue.ts';
import { deformationOf, iceTypeLetter, iceTypeName, snowOf, strayLetters } from '../iceTypes.ts';

export interface RuleContext {
  cruise?: Cruise;
}

export interface ObservationRule {
  /** Short name of the rule (for docs and debugging; findings carry their own codes). */
  name: string;
  check(obs: Observation, ctx: RuleContext): Finding[];
}

/** Rounded for messages: at most 3 decimals, no trailing zeros. */
export const fmt = (v: number): string => (Number.isFinite(v) ? String(Math.round(v * 1000) / 1000) : String(v));
const isTenths = (v: number, min = 0): boolean => Number.isInteger(v) && v >= min && v <= 10;
const isNum = (v: unknown): v is number => typeof v === 'number';
const catLabel = iceTypeName;
/** Data from a file may carry a stage we do not know; rules that look stages up skip those. */
const knownStage = (stage: unknown): boolean => (STAGE_KEYS as readonly unknown[]).includes(stage);

/**
 * ISO 8601 UTC with seconds and a trailing Z, e.g. 2026-03-04T05:00:00Z (fractions optional):
 * the same form the store (src/db/validate.ts) accepts, so a time that passes here can be saved.
 */
const ISO_UTC = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d{1,9})?Z$/;

export function isIsoUtc(time: string): boolean {
  return ISO_UTC.test(time) && Number.isFinite(Date.parse(time));
}

/** No ice is thicker than this (100 m), the store's own limit too. */
export const MAX_THICKNESS_CM = 10_000;
/** Level ice above this is doubtful: thermodynamic growth rarely exceeds about 3 m (common practice). */
export const MAX_PLAUSIBLE_THICKNESS_CM = 500;
/** Snow on sea ice deeper than this is doubtful (common practice). */
export const MAX_PLAUSIBLE_SNOW_CM = 150;
/** A fix older or newer than this against the observation time is doubtful (common practice). */
export const MAX_FIX_AGE_MINUTES = 15;
/** Thermometer resolution allowed below the freezing point before warning (common practice). */
export const FREEZING_TOLERANCE_C = 0.05;

const timeRule: ObservationRule = {
  name: 'time',
  check: (obs) => (isIsoUtc(obs.time) ? [] : [finding('time-invalid', 'time', `Time "${obs.time}" is not an ISO 8601 UTC time such as 2026-03-04T05:00:00Z`)]),
};

const cruiseRule: ObservationRule = {
  name: 'cruise',
  check: (obs, { cruise }) => {
    if (!cruise) return [];
    const out: Finding[] = [];
    if (obs.cruiseId !== cruise.id) out.push(finding('cruise-mismatch', 'cruiseId', `Observation is for cruise "${obs.cruiseId}", not "${cruise.id}"`));
    if (!cruise.observers.some((o) => o.id === obs.observerId)) {
      out.push(finding('unknown-observer', 'observerId', `Observer "${obs.observerId}" is not on the observer list of ${cruise.name}`));
    }
    return out;
  },
};

const concentrationRule: ObservationRule = {
  name: 'concentration',
  check: (obs) => {
    const out: Finding[] = [];
    const total = obs.totalConcentration;
    const cats = obs.categories;
    if (total === null) {
      out.push(finding('total-not-judged', 'totalConcentration', 'Total concentration is not judged yet'));
    } else if (!isTenths(total)) {
      out.push(finding('total-out-of-range', 'totalConcentration', `Total concentration ${fmt(total)} is not a whole number of tenths from 0 to 10`));
    }
    if (cats.length > 3) out.push(finding('too-many-categories', 'categories', `${cats.length} ice types: the egg code holds at most three (put the rest in the remaining stage)`));
    cats.forEach((c, i) => {
      const p = c.partialConcentration;
      if (p === 0) out.push(finding('partial-zero', `categories.${i}.partialConcentration`, `${catLabel(i)} has a partial concentration of 0/10: remove it or give its share`));
      else if (!isTenths(p, 1)) out.push(finding('partial-out-of-range', `categories.${i}.partialConcentration`, `${catLabel(i)} partial concentration ${fmt(p)} is not a whole number of tenths from 1 to 10`));
    });
    if (total !== null && isTenths(total)) {
      const sum = cats.reduce((a, c) => a + (Number.isFinite(c.partialConcentration) ? c.partialConcentration : 0), 0);
      if (sum > total) {
        out.push(finding('partials-exceed-total', 'categories', `Partial concentrations add up to ${fmt(sum)}/10, more than the total ${total}/10`));
      } else if (cats.length > 0 && sum < total && !obs.remainingStage) {
        out.push(finding('partials-below-total', 'categories', `Partial concentrations add up to ${fmt(sum)}/10, less than the total ${total}/10: give the rest an ice type or a remaining stage`));
      } else if (cats.length > 0 && sum === total && obs.remainingStage && knownStage(obs.remainingStage)) {
        // Sd is the stage of the ice the partials leave of Ct (WMO-No. 259 egg code): here none.
        out.push(finding('remaining-without-share', 'remainingStage', `Remaining stage ${STAGES[obs.remainingStage].label.toLowerCase()} is given but the partial concentrations already make up the total ${total}/10: lower a partial to leave Sd its share, or remove the remaining stage`));
      }
      if (total > 0 && cats.length === 0) out.push(finding('categories-missing', 'categories', `Total concentration ${total}/10 but no ice type described`));
    }
    return out;
  },
};

const orderRule: ObservationRule = {
  name: 'thickest-first',
  check: (obs) => {
    const out: Finding[] = [];
    const cats = obs.categories;
    for (let i = 1; i < cats.length; i++) {
      const prev = cats[i - 1] as IceCategory;
      const cur = cats[i] as IceCategory;
      if (knownStage(prev.stage) && knownStage(cur.stage) && isSurelyThicker(cur, prev)) {
        out.push(finding('categories-not-thickest-first', `categories.${i}`,
          `${catLabel(i)} (${describe(cur)}) is thicker than ice type ${iceTypeLetter(i - 1)} (${describe(prev)}): ice types go thickest first`));
      }
    }
    const first = cats[0];
    const last = cats[cats.length - 1];
    if (obs.traceStage && first && knownStage(obs.traceStage) && knownStage(first.stage) && obs.traceStage !== 'undetermined' && first.stage !== 'undetermined' && !isStageSurelyThicker(obs.traceStage, first.stage)) {
      out.push(finding('trace-not-thicker', 'traceStage', `Trace stage ${STAGES[obs.traceStage].label.toLowerCase()} is not thicker than the thickest ice type (${STAGES[first.stage].label.toLowerCase()})`));
    }
    if (obs.remainingStage && last && knownStage(obs.remainingStage) && knownStage(last.stage) && obs.remainingStage !== 'undetermined' && last.stage !== 'undetermined' && !isStageSurelyThicker(last.stage, obs.remainingStage)) {
      out.push(finding('remaining-not-thinner', 'remainingStage', `Remaining stage ${STAGES[obs.remainingStage].label.toLowerCase()} is not thinner than the thinnest ice type (${STAGES[last.stage].label.toLowerCase()})`));
    }
    return out;
  },
};

function describe(c: IceCategory): string {
  const t = c.thicknessCm !== undefined ? ` ${fmt(c.thicknessCm)} cm` : '';
  return `${STAGES[c.stage].label.toLowerCase()}${t}`;
}

/** Stages pancakes form in: new ice, nilas and ice rind, young ice (WMO-No. 259). */
const PANCAKE_FAMILIES = new Set(['new', 'nilas', 'young', 'undetermined']);

const categoryRule: ObservationRule = {
  name: 'category',
  check: (obs) => {
    const out: Finding[] = [];
    obs.categories.forEach((c, i) => {
      const at = (f: string): string => `categories.${i}.${f}`;
      if (!knownStage(c.stage)) {
        out.push(finding('stage-unknown', at('stage'), `${catLabel(i)} stage "${String(c.stage)}" is not a known stage of development`));
        return;
      }
      if (c.floeSize !== undefined && !(FLOE_SIZE_KEYS as readonly unknown[]).includes(c.floeSize)) {
        out.push(finding('floe-size-unknown', at('floeSize'), `${catLabel(i)} floe size "${String(c.floeSize)}" is not a known form of ice`));
      }
      const info = STAGES[c.stage];
      if (isNum(c.thicknessCm)) {
        const t = c.thicknessCm;
        if (!Number.isFinite(t) || t < 0 || t > MAX_THICKNESS_CM) {
          out.push(finding('thickness-out-of-range', at('thicknessCm'), `${catLabel(i)} thickness ${fmt(t)} cm is not a thickness from 0 to ${MAX_THICKNESS_CM} cm`));
        } else {
          if (t > MAX_PLAUSIBLE_THICKNESS_CM && info.family !== 'land') {
            out.push(finding('thickness-implausible', at('thicknessCm'), `${catLabel(i)} thickness ${fmt(t)} cm is more than level sea ice reaches (about ${MAX_PLAUSIBLE_THICKNESS_CM / 100} m)`));
          }
          // Bounds inclusive: a value on a WMO boundary (15 cm grey / grey-white) fits either stage.
          const below = info.minCm !== null && t < info.minCm;
          const above = info.maxCm !== null && t > info.maxCm;
          if (below || above) {
            out.push(finding('stage-thickness-mismatch', at('thicknessCm'),
              `${catLabel(i)} thickness ${fmt(t)} cm is outside the ${info.label.toLowerCase()} range ${info.minCm ?? 0}-${info.maxCm ?? '∞'} cm (WMO-No. 259)`));
          }
        }
      }
      if (c.floeSize === 'pancake' && !PANCAKE_FAMILIES.has(info.family)) {
        out.push(finding('pancake-stage-mismatch', at('floeSize'), `${catLabel(i)} is pancake ice but its stage is ${info.label.toLowerCase()}: pancakes are new or young ice`));
      }
    });
    return out;
  },
};

/** Deformation of each ice type: shares in tenths, the sail height against the keels ridges have. */
const deformationRule: ObservationRule = {
  name: 'deformation',
  check: (obs) => {
    const out: Finding[] = [];
    for (const l of strayLetters(obs.deformation, obs.categories.length)) {
      out.push(finding('group-without-ice-type', `deformation.${l}`, `Deformation is given for ice type ${l}, but the observation has no ice type ${l}`));
    }
    obs.categories.forEach((c, i) => {
      const d = deformationOf(obs, i);
      if (!d) return;
      const at = (f: string): string => `deformation.${iceTypeLetter(i)}.${f}`;
      const shares: ['ridgedTenths' | 'raftedTenths', string][] = [['ridgedTenths', 'ridged'], ['raftedTenths', 'rafted']];
      let sharesOk = true;
      for (const [field, word] of shares) {
        const v = d[field];
        if (isNum(v) && !isTenths(v)) {
          sharesOk = false;
          out.push(finding('deformation-share-out-of-range', at(field), `${catLabel(i)} ${word} share ${fmt(v)} is not a whole number of tenths from 0 to 10`));
        }
      }
      if (sharesOk && (d.ridgedTenths ?? 0) + (d.raftedTenths ?? 0) > 10) {
        out.push(finding('deformed-share-exceeds-category', at('ridgedTenths'), `${catLabel(i)} ridged ${d.ridgedTenths}/10 and rafted ${d.raftedTenths}/10 add up to more than the whole ice type`));
      }
      if (isNum(d.sailHeightM)) {
        const h = d.sailHeightM;
        if (!Number.isFinite(h) || h < 0) {
          out.push(finding('sail-height-out-of-range', at('sailHeightM'), `${catLabel(i)} sail height ${fmt(h)} m is not a height (0 m or more)`));
        } else {
          const family = knownStage(c.stage) ? STAGES[c.stage].family : 'undetermined';
          const ratio = family === 'old' ? KEEL_TO_SAIL_RATIO.multiYear : KEEL_TO_SAIL_RATIO.firstYear;
          if (h * ratio > MAX_KEEL_DEPTH_M) {
            out.push(finding('sail-height-implausible', at('sailHeightM'), `${catLabel(i)} sail height ${fmt(h)} m implies a keel about ${fmt(h * ratio)} m deep; keels reach about ${MAX_KEEL_DEPTH_M} m`));
          }
          if (h > 0 && d.ridgedTenths === 0) {
            out.push(finding('sail-height-without-ridges', at('sailHeightM'), `${catLabel(i)} has a sail height of ${fmt(h)} m but a ridged share of 0/10`));
          }
        }
      }
    });
    return out;
  },
};

/** Snow on each ice type: a depth that is a depth, and no description of snow said to be absent. */
const snowRule: ObservationRule = {
  name: 'snow',
  check: (obs) => {
    const out: Finding[] = [];
    for (const l of strayLetters(obs.snow, obs.categories.length)) {
      out.push(finding('group-without-ice-type', `snow.${l}`, `Snow is given for ice type ${l}, but the observation has no ice type ${l}`));
    }
    obs.categories.forEach((_c, i) => {
      const s = snowOf(obs, i);
      if (!s) return;
      const at = (f: string): string => `snow.${iceTypeLetter(i)}.${f}`;
      if (s.cover !== undefined && !(SNOW_COVERS as readonly unknown[]).includes(s.cover)) {
        out.push(finding('snow-term-unknown', at('cover'), `${catLabel(i)} snow cover "${String(s.cover)}" is not one of ${SNOW_COVERS.join(', ')}`));
      }
      if (s.wetness !== undefined && !(SNOW_WETNESS_CLASSES as readonly unknown[]).includes(s.wetness)) {
        out.push(finding('snow-term-unknown', at('wetness'), `${catLabel(i)} snow wetness "${String(s.wetness)}" is not a wetness class (${SNOW_WETNESS_CLASSES.join(', ')})`));
      }
      if (isNum(s.depthCm)) {
        const d = s.depthCm;
        if (!Number.isFinite(d) || d < 0) {
          out.push(finding('snow-depth-out-of-range', at('depthCm'), `${catLabel(i)} snow depth ${fmt(d)} cm is not a depth (0 cm or more)`));
        } else if (d > MAX_PLAUSIBLE_SNOW_CM) {
          out.push(finding('snow-depth-implausible', at('depthCm'), `${catLabel(i)} snow depth ${fmt(d)} cm is more than seen on sea ice (about ${MAX_PLAUSIBLE_SNOW_CM} cm)`));
        } else if (d > 0 && s.cover === 'none') {
          out.push(finding('snow-depth-without-snow', at('depthCm'), `${catLabel(i)} snow depth ${fmt(d)} cm but the snow cover is "none"`));
        }
      }
      if (s.cover === 'none') {
        const described = [s.wetness !== undefined ? 'wetness' : '', s.crust ? 'a crust' : '', s.drifts ? 'drifts' : ''].filter((x) => x !== '');
        if (described.length > 0) {
          out.push(finding('snow-described-without-snow', at('cover'), `${catLabel(i)} has no snow but ${described.join(' and ')} given`));
        }
      }
    });
    return out;
  },
};

const positionRule: ObservationRule = {
  name: 'position',
  check: (obs) => {
    const p = obs.position;
    if (!p) return [finding('position-missing', 'position', 'No position: enter one or take it from the track')];
    const out: Finding[] = [];
    if (!isValidLatLon(p.lat, p.lon)) {
      if (!(Number.isFinite(p.lat) && Math.abs(p.lat) <= 90)) out.push(finding('position-invalid', 'position.lat', `Latitude ${fmt(p.lat)} is outside -90 to 90`));
      if (!(Number.isFinite(p.lon) && Math.abs(p.lon) <= 180)) out.push(finding('position-invalid', 'position.lon', `Longitude ${fmt(p.lon)} is outside -180 to 180`));
      return out;
    }
    if (p.lat === 0 && p.lon === 0) out.push(finding('position-null-island', 'position', 'Position is exactly 0°, 0°: usually a receiver with no fix'));
    if (isNum(p.accuracyM) && (!Number.isFinite(p.accuracyM) || p.accuracyM < 0)) {
      out.push(finding('position-accuracy-invalid', 'position.accuracyM', `Position accuracy ${fmt(p.accuracyM)} m is not a distance (0 m or more)`));
    }
    if (p.fixTime !== undefined && !isIsoUtc(p.fixTime)) {
      out.push(finding('position-fix-time-invalid', 'position.fixTime', `Position fix time "${p.fixTime}" is not an ISO 8601 UTC time such as 2026-03-04T05:00:00Z`));
    } else if (p.fixTime !== undefined && isIsoUtc(obs.time)) {
      const minutes = Math.abs(Date.parse(p.fixTime) - Date.parse(obs.time)) / 60000;
      if (minutes > MAX_FIX_AGE_MINUTES) {
        out.push(finding('position-fix-stale', 'position.fixTime', `Position fix time ${p.fixTime} is ${Math.round(minutes)} min from the observation time (more than ${MAX_FIX_AGE_MINUTES} min)`));
      }
    }
    return out;
  },
};

const weatherRule: ObservationRule = {
  name: 'weather',
  check: (obs) => {
    const w = obs.weather;
    if (!w) return [];
    const out: Finding[] = [];
    if (isNum(w.airTempC)) {
      // Records: -89.2 °C (Vostok) and 56.7 °C (Death Valley), WMO archive of weather extremes.
      if (!Number.isFinite(w.airTempC) || w.airTempC < -90 || w.airTempC > 57) {
        out.push(finding('air-temp-out-of-range', 'weather.airTempC', `Air temperature ${fmt(w.airTempC)} °C is beyond any recorded on Earth`));
      } else if (w.airTempC < -60 || w.airTempC > 25) {
        out.push(finding('air-temp-doubtful', 'weather.airTempC', `Air temperature ${fmt(w.airTempC)} °C is unusual at sea in polar waters (check the sign and unit)`));
      }
    }
    let salinityForCheck = DEFAULT_SALINITY_PSU;
    let salinityMeasured = false;
    if (isNum(w.salinityPsu)) {
      // 0-50: open-ocean surface water is about 32-37 (common practice); 4-40 is the range of the
      // UNESCO 1983 freezing-point formula (Fofonoff and Millard 1983).
      if (!Number.isFinite(w.salinityPsu) || w.salinityPsu < 0 || w.salinityPsu > 50) {
        out.push(finding('salinity-out-of-range', 'weather.salinityPsu', `Salinity ${fmt(w.salinityPsu)} is outside 0 to 50`));
      } else {
        salinityForCheck = w.salinityPsu;
        salinityMeasured = true;
        const r = FREEZING_POINT_SALINITY_RANGE;
        if (w.salinityPsu < r.min || w.salinityPsu > r.max) {
          out.push(finding('salinity-outside-formula-range', 'weather.salinityPsu', `Salinity ${fmt(w.salinityPsu)} is outside ${r.min}-${r.max}, where the UNESCO 1983 freezing point holds`));
        }
      }
    }
    if (isNum(w.waterTempC)) {
      // -3 °C is below the freezing point of any sea water the UNESCO 1983 formula covers
      // (Tf(40, 0) = -2.21 °C); 40 °C is above the warmest sea surfaces (about 36 °C, from memory).
      if (!Number.isFinite(w.waterTempC) || w.waterTempC < -3 || w.waterTempC > 40) {
        out.push(finding('water-temp-out-of-range', 'weather.waterTempC', `Water temperature ${fmt(w.waterTempC)} °C is impossible for sea water at the surface (-3 to 40 °C)`));
      } else {
        const tf = freezingPointC(salinityForCheck, 0);
        if (w.waterTempC < tf - FREEZING_TOLERANCE_C) {
          const sText = salinityMeasured ? `salinity ${fmt(salinityForCheck)}` : `salinity ${DEFAULT_SALINITY_PSU} assumed`;
          out.push(finding('water-below-freezing', 'weather.waterTempC', `Water temperature ${fmt(w.waterTempC)} °C is below the freezing point of sea water, ${tf.toFixed(2)} °C at ${sText} (UNESCO 1983)`));
        }
      }
    }
    if (isNum(w.windSpeedKn)) {
      // Force 12 on the Beaufort scale is 64 kn and more; 120 kn is our own bound for a typed unit
      // mistake (km/h or m/s as knots), common practice.
      if (!Number.isFinite(w.windSpeedKn) || w.windSpeedKn < 0) out.push(finding('wind-out-of-range', 'weather.windSpeedKn', `Wind speed ${fmt(w.windSpeedKn)} kn is negative`));
      else if (w.windSpeedKn > 120) out.push(finding('wind-doubtful', 'weather.windSpeedKn', `Wind speed ${fmt(w.windSpeedKn)} kn is far above hurricane force (64 kn): check the unit`));
    }
    if (isNum(w.windFromDeg) && !(w.windFromDeg >= 0 && w.windFromDeg <= 360)) {
      out.push(finding('wind-out-of-range', 'weather.windFromDeg', `Wind direction ${fmt(w.windFromDeg)}° is outside 0-360°`));
    }
    if (isNum(w.visibilityKm) && !(w.visibilityKm >= 0)) {
      out.push(finding('visibility-out-of-range', 'weather.visibilityKm', `Visibility ${fmt(w.visibilityKm)} km is negative`));
    }
    if (isNum(w.cloudOktas) && !(Number.isInteger(w.cloudOktas) && w.cloudOktas >= 0 && w.cloudOktas <= 8)) {
      out.push(finding('cloud-out-of-range', 'weather.cloudOktas', `Cloud cover ${fmt(w.cloudOktas)} is not a whole number of oktas from 0 to 8`));
    }
    return out;
  },
};

const surfaceRule: ObservationRule = {
  name: 'surface',
  check: (obs) => {
    const out: Finding[] = [];
    if (obs.meltPonds && !isTenths(obs.meltPonds.coverTenths)) {
      out.push(finding('melt-ponds-out-of-range', 'meltPonds.coverTenths', `Melt-pond cover ${fmt(obs.meltPonds.coverTenths)} is not a whole number of tenths from 0 to 10`));
    }
    if (obs.icebergs) {
      for (const k of ['icebergs', 'bergyBits', 'growlers'] as const) {
        const n = obs.icebergs[k];
        if (!(Number.isInteger(n) && n >= 0)) out.push(finding('iceberg-count-invalid', `icebergs.${k}`, `Count of ${k === 'bergyBits' ? 'bergy bits' : k} ${fmt(n)} is not a whole number 0 or more`));
      }
    }
    const ow = obs.openWater;
    if (ow) {
      if (isNum(ow.widthM) && !(ow.widthM >= 0)) out.push(finding('open-water-out-of-range', 'openWater.widthM', `Open-water width ${fmt(ow.widthM)} m is negative`));
      if (isNum(ow.orientationDeg) && !(ow.orientationDeg >= 0 && ow.orientationDeg <= 180)) {
        out.push(finding('open-water-out-of-range', 'openWater.orientationDeg', `Lead orientation ${fmt(ow.orientationDeg)}° is outside 0-180°`));
      }
    }
    return out;
  },
};

/** The rules validateObservation runs, in this order. */
export const OBSERVATION_RULES: readonly ObservationRule[] = [
  timeRule, cruiseRule, concentrationRule, orderRule, categoryRule, deformationRule, snowRule, positionRule, weatherRule, surfaceRule,
];

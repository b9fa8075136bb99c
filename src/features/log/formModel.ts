// Between the form's typed text and the observation model: reading a draft into an observation
// (with a finding for every value that cannot be read, named by field), and turning a stored
// observation back into a draft (to edit it, or to start the next one from it).
import { groupFromList, groupToList } from '../../domain/iceTypes';
import {
  ICE_TYPE_LETTERS,
  type Deformation, type Finding, type IceCategory, type Observation, type Position, type SnowCover, type StageKey,
} from '../../domain/model';
import { toIsoUtc } from '../../domain/watch';
import {
  emptyCategory, emptyDraft, utcMinuteText, type CategoryDraft, type ObservationDraft,
} from '../../state/observationForm';
import { readPosition } from './positionText';

/** What the form hands to the store: an observation without the revision stamps. */
export type ObservationFields = Omit<Observation, 'revision' | 'savedAt' | 'savedBy' | 'deviceId' | 'deleted'>;

export interface DraftContext {
  id: string;
  cruiseId: string;
  /** The clock, for a time that follows it and for times typed without a date. */
  now: Date;
  /** The live position of the chosen source when the draft holds none (GPS, geolocation). */
  livePosition: Position | null;
}

export interface DraftReading {
  observation: ObservationFields;
  /** Values that could not be read: always errors, with the path of their field. */
  findings: Finding[];
}

const inputError = (path: string, message: string): Finding => ({ severity: 'error', code: 'unreadable-input', path, message });

/** Reads a number as typed: blank is "not given"; a comma counts as the decimal mark. */
export function readNumber(
  text: string,
  path: string,
  label: string,
  findings: Finding[],
  opts: { integer?: boolean } = {},
): number | undefined {
  const t = text.trim().replace(',', '.').replace(/^\u2212/, '-');
  if (t === '') return undefined;
  if (!/^[-+]?(\d+\.?\d*|\.\d+)$/.test(t)) {
    findings.push(inputError(path, `${label}: "${text.trim()}" is not a number.`));
    return undefined;
  }
  const n = Number(t);
  if (opts.integer && !Number.isInteger(n)) {
    findings.push(inputError(path, `${label}: "${text.trim()}" must be a whole number.`));
    return undefined;
  }
  return n;
}

/** `YYYY-MM-DD HH:MM` in UTC: how the form shows a stored time. */
export function formatTimeInput(iso: string): string {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? iso : utcMinuteText(d);
}

/**
 * Reads a typed UTC time: `2026-03-04 05:00`, `2026-03-04T05:00:00Z`, or just `05:00` / `0500`
 * for the same UTC day as `now`. Returns the ISO time or an error message.
 */
export function readTime(text: string, now: Date): { ok: true; iso: string } | { ok: false; message: string } {
  const t = text.trim();
  const full = /^(\d{4})-(\d{2})-(\d{2})[ T](\d{1,2}):?(\d{2})(?::(\d{2}))?(?:\.\d+)?Z?$/i.exec(t);
  const short = /^(\d{1,2}):?(\d{2})$/.exec(t);
  let y: number, mo: number, d: number, h: number, mi: number, s = 0;
  if (full) {
    [y, mo, d, h, mi] = [1, 2, 3, 4, 5].map((i) => Number(full[i])) as [number, number, number, number, number];
    s = full[6] ? Number(full[6]) : 0;
  } else if (short) {
    y = now.getUTCFullYear();
    mo = now.getUTCMonth() + 1;
    d = now.getUTCDate();
    h = Number(short[1]);
    mi = Number(short[2]);
  } else {
    return { ok: false, message: `Time: "${t}" is not a UTC time; type e.g. 2026-03-04 05:00 or 05:00.` };
  }
  const ms = Date.UTC(y, mo - 1, d, h, mi, s);
  const back = new Date(ms);
  if (h > 23 || mi > 59 || s > 59 || back.getUTCDate() !== d || back.getUTCMonth() !== mo - 1) {
    return { ok: false, message: `Time: "${t}" is not a valid date and time.` };
  }
  return { ok: true, iso: toIsoUtc(ms) };
}

/** Ice types are named a, b, c as the egg code's columns are. */
export const CATEGORY_LETTERS = ICE_TYPE_LETTERS;

/** True when an ice type's deformation and snow rows hold nothing. */
function blankGroups(c: CategoryDraft): boolean {
  return (
    c.ridged.trim() === '' && c.rafted.trim() === '' && c.sailHeightM.trim() === '' &&
    c.snowCover === '' && c.snowWetness === '' && !c.snowCrust && !c.snowDrifts && c.snowDepthCm.trim() === ''
  );
}

/** True when an ice type row (with its deformation and snow) holds nothing at all (it is then left out). */
export function isBlankCategory(c: CategoryDraft): boolean {
  return c.partial.trim() === '' && c.stage === '' && c.thicknessCm.trim() === '' && c.floeSize === '' && blankGroups(c);
}

function readCategory(
  c: CategoryDraft,
  index: number,
  single: boolean,
  total: number | undefined,
  findings: Finding[],
): IceCategory | null {
  const p = `categories.${index}`;
  const letter = CATEGORY_LETTERS[index] ?? String(index + 1);
  const partial = readNumber(c.partial, `${p}.partialConcentration`, `Ice type ${letter}, concentration`, findings, { integer: true });
  let stage: StageKey | null = c.stage === '' ? null : c.stage;
  if (stage === null) {
    findings.push(inputError(`${p}.stage`, `Ice type ${letter}: choose a stage of development.`));
    stage = 'undetermined';
  }
  // With a single ice type the egg code leaves Ca blank: its concentration is the total.
  const partialConcentration = partial ?? (single ? total : undefined);
  if (partialConcentration === undefined) {
    if (c.partial.trim() === '') {
      findings.push(inputError(`${p}.partialConcentration`, `Ice type ${letter}: give its concentration in tenths (needed with more than one ice type, a remaining stage counts as one).`));
    }
    return null;
  }
  // The egg code's order: concentration, stage, form, then thickness.
  const cat: IceCategory = { partialConcentration, stage };
  if (c.floeSize !== '') cat.floeSize = c.floeSize;
  const thick = readNumber(c.thicknessCm, `${p}.thicknessCm`, `Ice type ${letter}, thickness`, findings);
  if (thick !== undefined) cat.thicknessCm = thick;
  return cat;
}

function readDeformation(c: CategoryDraft, index: number, findings: Finding[]): Deformation {
  const letter = CATEGORY_LETTERS[index] ?? String(index + 1);
  const p = `deformation.${letter}`;
  const d: Deformation = {};
  const ridged = readNumber(c.ridged, `${p}.ridgedTenths`, `Deformation of ice type ${letter}, ridged share`, findings, { integer: true });
  if (ridged !== undefined) d.ridgedTenths = ridged;
  const rafted = readNumber(c.rafted, `${p}.raftedTenths`, `Deformation of ice type ${letter}, rafted share`, findings, { integer: true });
  if (rafted !== undefined) d.raftedTenths = rafted;
  const sail = readNumber(c.sailHeightM, `${p}.sailHeightM`, `Deformation of ice type ${letter}, sail height`, findings);
  if (sail !== undefined) d.sailHeightM = sail;
  return d;
}

function readSnow(c: CategoryDraft, index: number, findings: Finding[]): SnowCover {
  const letter = CATEGORY_LETTERS[index] ?? String(index + 1);
  const s: SnowCover = {};
  if (c.snowCover !== '') s.cover = c.snowCover;
  if (c.snowWetness !== '') s.wetness = c.snowWetness;
  if (c.snowCrust) s.crust = true;
  if (c.snowDrifts) s.drifts = true;
  const depth = readNumber(c.snowDepthCm, `snow.${letter}.depthCm`, `Snow on ice type ${letter}, depth`, findings);
  if (depth !== undefined) s.depthCm = depth;
  return s;
}

/** The draft's categories that hold anything, with their index in the draft. */
export function filledCategories(draft: ObservationDraft): CategoryDraft[] {
  return draft.categories.filter((c) => !isBlankCategory(c));
}

export function readDraft(draft: ObservationDraft, ctx: DraftContext): DraftReading {
  const findings: Finding[] = [];

  let time = toIsoUtc(Math.floor(ctx.now.getTime() / 60_000) * 60_000);
  if (draft.time.trim() !== '') {
    const r = readTime(draft.time, ctx.now);
    if (r.ok) time = r.iso;
    else findings.push(inputError('time', r.message));
  }

  let position: Position | null = null;
  if (draft.positionSource === 'manual') {
    if (draft.positionText.trim() !== '') {
      const r = readPosition(draft.positionText);
      if (r.ok) position = { lat: r.lat, lon: r.lon, source: 'manual' };
      else findings.push(inputError('position', `Position: ${r.message}`));
    }
  } else {
    position = draft.position ?? ctx.livePosition;
  }

  if (draft.observerId === '') findings.push(inputError('observerId', 'Observer: choose who made this observation.'));

  const total = readNumber(draft.total, 'totalConcentration', 'Total concentration', findings, { integer: true });
  const filled = filledCategories(draft);
  const categories: IceCategory[] = [];
  const deformation: Deformation[] = [];
  const snow: SnowCover[] = [];
  // A single ice type takes Ct; one ice type with a remaining stage (Sd) is two ice types.
  const single = filled.length === 1 && draft.remainingStage === '';
  filled.forEach((c, i) => {
    const cat = readCategory(c, i, single, total, findings);
    if (!cat) return;
    categories.push(cat);
    deformation.push(readDeformation(c, i, findings));
    snow.push(readSnow(c, i, findings));
  });
  const deformationGroup = groupFromList(deformation);
  const snowGroup = groupFromList(snow);

  const observation: ObservationFields = {
    id: ctx.id,
    cruiseId: ctx.cruiseId,
    time,
    position,
    observerId: draft.observerId,
    totalConcentration: total ?? null,
    categories,
    notes: draft.notes,
    photoIds: [...draft.photoIds],
  };
  if (draft.traceStage !== '') observation.traceStage = draft.traceStage;
  if (draft.remainingStage !== '') observation.remainingStage = draft.remainingStage;
  if (deformationGroup) observation.deformation = deformationGroup;
  if (snowGroup) observation.snow = snowGroup;

  if (draft.openWaterKind !== '') {
    observation.openWater = { kind: draft.openWaterKind };
    const w = readNumber(draft.openWaterWidthM, 'openWater.widthM', 'Open water, width', findings);
    if (w !== undefined) observation.openWater.widthM = w;
    const o = readNumber(draft.openWaterOrientationDeg, 'openWater.orientationDeg', 'Open water, orientation', findings);
    if (o !== undefined) observation.openWater.orientationDeg = o;
  }

  const melt = readNumber(draft.meltCover, 'meltPonds.coverTenths', 'Melt ponds, cover', findings, { integer: true });
  if (melt !== undefined) {
    observation.meltPonds = { coverTenths: melt };
    if (draft.meltState !== '') observation.meltPonds.state = draft.meltState;
  }

  const bergs = readNumber(draft.icebergs, 'icebergs.icebergs', 'Icebergs', findings, { integer: true });
  const bits = readNumber(draft.bergyBits, 'icebergs.bergyBits', 'Bergy bits', findings, { integer: true });
  const growlers = readNumber(draft.growlers, 'icebergs.growlers', 'Growlers', findings, { integer: true });
  if (bergs !== undefined || bits !== undefined || growlers !== undefined) {
    observation.icebergs = { icebergs: bergs ?? 0, bergyBits: bits ?? 0, growlers: growlers ?? 0 };
  }

  const weather: NonNullable<Observation['weather']> = {};
  const w = (text: string, key: keyof typeof weather, label: string, integer = false) => {
    const v = readNumber(text, `weather.${key}`, label, findings, { integer });
    if (v !== undefined) weather[key] = v;
  };
  w(draft.airTempC, 'airTempC', 'Air temperature');
  w(draft.waterTempC, 'waterTempC', 'Water temperature');
  w(draft.salinityPsu, 'salinityPsu', 'Salinity');
  w(draft.windSpeedKn, 'windSpeedKn', 'Wind speed');
  w(draft.windFromDeg, 'windFromDeg', 'Wind direction');
  w(draft.visibilityKm, 'visibilityKm', 'Visibility');
  w(draft.cloudOktas, 'cloudOktas', 'Cloud cover', true);
  if (Object.keys(weather).length > 0) observation.weather = weather;

  return { observation, findings };
}

const str = (n: number | undefined) => (n === undefined ? '' : String(n));

function categoryToDraft(c: IceCategory, d: Deformation | undefined, s: SnowCover | undefined): CategoryDraft {
  return {
    ...emptyCategory(),
    partial: String(c.partialConcentration),
    stage: c.stage,
    floeSize: c.floeSize ?? '',
    thicknessCm: str(c.thicknessCm),
    ridged: str(d?.ridgedTenths),
    rafted: str(d?.raftedTenths),
    sailHeightM: str(d?.sailHeightM),
    snowCover: s?.cover ?? '',
    snowWetness: s?.wetness ?? '',
    snowCrust: s?.crust ?? false,
    snowDrifts: s?.drifts ?? false,
    snowDepthCm: str(s?.depthCm),
  };
}

function categoriesToDraft(o: Observation): CategoryDraft[] {
  const n = o.categories.length;
  const def = groupToList(o.deformation, n);
  const snow = groupToList(o.snow, n);
  return o.categories.map((c, i) => categoryToDraft(c, def[i], snow[i]));
}

/**
 * A draft holding a stored observation. `asNext` starts the next observation from it: the ice,
 * surface and weather are carried over; time, position, notes, photos and warning notes start
 * afresh, and the observer is the one on watch now.
 */
export function observationToDraft(
  o: Observation,
  opts: { asNext: false } | { asNext: true; observerId: string; positionSource: Position['source'] },
): ObservationDraft {
  const base = emptyDraft(o.observerId, o.position?.source ?? 'manual');
  const draft: ObservationDraft = {
    ...base,
    id: o.id,
    time: formatTimeInput(o.time),
    position: o.position,
    positionText: o.position && o.position.source === 'manual' ? `${o.position.lat.toFixed(5)} ${o.position.lon.toFixed(5)}` : '',
    total: str(o.totalConcentration ?? undefined),
    categories: o.categories.length > 0 ? categoriesToDraft(o) : [emptyCategory()],
    traceStage: o.traceStage ?? '',
    remainingStage: o.remainingStage ?? '',
    openWaterKind: o.openWater?.kind ?? '',
    openWaterWidthM: str(o.openWater?.widthM),
    openWaterOrientationDeg: str(o.openWater?.orientationDeg),
    meltCover: str(o.meltPonds?.coverTenths),
    meltState: o.meltPonds?.state ?? '',
    icebergs: str(o.icebergs?.icebergs),
    bergyBits: str(o.icebergs?.bergyBits),
    growlers: str(o.icebergs?.growlers),
    airTempC: str(o.weather?.airTempC),
    waterTempC: str(o.weather?.waterTempC),
    salinityPsu: str(o.weather?.salinityPsu),
    windSpeedKn: str(o.weather?.windSpeedKn),
    windFromDeg: str(o.weather?.windFromDeg),
    visibilityKm: str(o.weather?.visibilityKm),
    cloudOktas: str(o.weather?.cloudOktas),
    notes: o.notes,
    photoIds: [...o.photoIds],
    warningNotes: Object.fromEntries((o.reviews ?? []).map((r) => [`${r.code}@${r.path}`, r.comment])),
  };
  if (!opts.asNext) return draft;
  return {
    ...draft,
    id: base.id,
    time: '',
    position: null,
    positionText: '',
    positionSource: opts.positionSource,
    observerId: opts.observerId,
    notes: '',
    photoIds: [],
    warningNotes: {},
  };
}

/** The key under which a warning's note is kept in the draft. */
export const findingKey = (f: Pick<Finding, 'code' | 'path'>) => `${f.code}@${f.path}`;

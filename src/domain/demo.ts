// The demo cruise: an invented scenario of our own, built by code so it is deterministic and
// plausible rather than typed. The fictional research vessel RV Frostwren crosses from open
// Atlantic water north of Svalbard through the marginal ice zone into the pack of the Nansen
// Basin (to about 83.6 N), holds an ice station, and returns, over six days of March 2026.
// Everything here (vessel, cruise, observers, numbers) is invented and is for the demo only.
import { destination, geodesicInverse, METRES_PER_NM, pointAlongGeodesic } from './geodesy';
import { groupFromList } from './iceTypes';
import type {
  Cruise, Deformation, IceCategory, Icebergs, IsoUtc, Observation, Observer, OpenWater, SnowCover, TrackPoint, Weather,
} from './model';
import { freezingPointC } from './seawater';

const MINUTE_MS = 60_000;
const HOUR_MS = 3_600_000;

/** Start of the demo cruise's first leg. */
export const DEMO_START: IsoUtc = '2026-03-09T00:00:00Z';

/** One deliberately doubtful entry, planted so that QC has something to find. */
export interface DemoDoubtfulEntry {
  observationId: string;
  /** What was planted. */
  kind: 'position-typo' | 'stage-thickness-mismatch';
  /** Dotted path of the doubtful field. */
  path: string;
  explanation: string;
}

/** A stretch of hours with no observation, as happens on a real watch. */
export interface DemoGap {
  /** Last observation time before the gap and first one after it. */
  before: IsoUtc;
  after: IsoUtc;
  missedHours: number;
}

export interface DemoCruise {
  cruise: Cruise;
  observations: Observation[];
  track: TrackPoint[];
  doubtful: DemoDoubtfulEntry[];
  gaps: DemoGap[];
}

// ---------------------------------------------------------------------------------------------
// Seeded randomness (mulberry32: small, fast, and good enough for invented data).

export interface Prng {
  /** Uniform in [0, 1). */
  next: () => number;
  range: (lo: number, hi: number) => number;
  int: (lo: number, hiInclusive: number) => number;
  pick: <T>(items: readonly T[]) => T;
  uuid: () => string;
}

export function makePrng(seed: number): Prng {
  let a = seed >>> 0;
  const next = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const int = (lo: number, hi: number): number => lo + Math.floor(next() * (hi - lo + 1));
  return {
    next,
    range: (lo, hi) => lo + next() * (hi - lo),
    int,
    pick: <T>(items: readonly T[]): T => items[int(0, items.length - 1)] as T,
    uuid: () => {
      const hex: string[] = [];
      for (let i = 0; i < 32; i++) hex.push(int(0, 15).toString(16));
      hex[12] = '4'; // version 4 layout (RFC 9562), so the ids look like any other random UUID
      hex[16] = ((int(0, 15) & 0x3) | 0x8).toString(16);
      const h = hex.join('');
      return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
    },
  };
}

/** A slowly varying noise term in about [-1, 1]: ice and weather change little from hour to hour. */
function smoothNoise(rng: Prng, keep = 0.85): () => number {
  let v = rng.range(-1, 1);
  return () => {
    v = keep * v + (1 - keep) * rng.range(-2.2, 2.2);
    return Math.max(-1, Math.min(1, v));
  };
}

// ---------------------------------------------------------------------------------------------
// Route: legs with a duration; the ship moves along the geodesic of each leg.

interface Leg {
  to: [lat: number, lon: number];
  hours: number;
  /** Side-to-side weave in the pack (nm), as the ship picks its way between floes. */
  weaveNm: number;
  /** Heading offset from the course (deg): drift at the ice station. */
  headingOffsetDeg: number;
}

const ROUTE_START: [number, number] = [79.55, 7.2];
const LEGS: readonly Leg[] = [
  { to: [80.85, 10.2], hours: 9, weaveNm: 0, headingOffsetDeg: 0 }, // open water, ~10 kn
  { to: [81.55, 12.6], hours: 8, weaveNm: 0.05, headingOffsetDeg: 0 }, // marginal ice zone
  { to: [82.75, 15.4], hours: 26, weaveNm: 0.15, headingOffsetDeg: 0 }, // into the pack
  { to: [82.68, 14.7], hours: 30, weaveNm: 0, headingOffsetDeg: 140 }, // ice station, drifting
  { to: [83.6, 18.2], hours: 19, weaveNm: 0.15, headingOffsetDeg: 0 }, // north into old ice
  { to: [82.15, 16.8], hours: 25, weaveNm: 0.15, headingOffsetDeg: 0 }, // south through the pack
  { to: [81.3, 13.8], hours: 11, weaveNm: 0.05, headingOffsetDeg: 0 }, // marginal ice zone
  { to: [79.9, 8.0], hours: 17, weaveNm: 0, headingOffsetDeg: 0 }, // open water
];

/** Hours of the whole route. */
export const DEMO_HOURS = LEGS.reduce((s, l) => s + l.hours, 0);

function positionAt(minute: number): { lat: number; lon: number } {
  let from = ROUTE_START;
  let t0 = 0;
  for (const leg of LEGS) {
    const t1 = t0 + leg.hours * 60;
    if (minute <= t1) {
      const to = { lat: leg.to[0], lon: leg.to[1] };
      const f = (minute - t0) / (t1 - t0);
      const here = pointAlongGeodesic({ lat: from[0], lon: from[1] }, to, f);
      if (leg.weaveNm === 0 || f >= 1) return here;
      // The weave fades out at both ends so legs still join up.
      const side = leg.weaveNm * METRES_PER_NM * Math.sin(Math.PI * f) * Math.sin((2 * Math.PI * minute) / 47);
      return destination(here, geodesicInverse(here, to).initialBearingDeg + 90, side);
    }
    from = leg.to;
    t0 = t1;
  }
  return { lat: from[0], lon: from[1] };
}

function legAt(minute: number): Leg {
  let t0 = 0;
  for (const leg of LEGS) {
    t0 += leg.hours * 60;
    if (minute < t0) return leg;
  }
  return LEGS[LEGS.length - 1] as Leg;
}

// ---------------------------------------------------------------------------------------------
// Ice and weather as functions of where the ship is.

/**
 * Distance north of the invented ice edge, in nautical miles (negative in open water). The edge
 * lies a little further north toward the east, as the Atlantic inflow keeps the west open.
 */
export function demoIceDepthNm(lat: number, lon: number): number {
  const edgeLat = 80.95 + 0.04 * (lon - 10);
  return (lat - edgeLat) * 60;
}

/** Width of the marginal ice zone in the scenario (nm); tens to hundreds of km is common practice. */
const MIZ_WIDTH_NM = 40;

const round1 = (x: number): number => Math.round(x * 10) / 10;
const round2 = (x: number): number => Math.round(x * 100) / 100;
const clamp = (x: number, lo: number, hi: number): number => Math.max(lo, Math.min(hi, x));

/** An ice type of the scenario with its deformation and snow, split into the groups at the end. */
interface DemoIceType extends IceCategory, Deformation {
  snowOn?: SnowCover;
}

interface IceState {
  total: number;
  categories: DemoIceType[];
  openWater?: OpenWater;
  icebergs?: Icebergs;
}

interface NoiseSet {
  conc: () => number;
  thick: () => number;
  ridge: () => number;
  snow: () => number;
  air: () => number;
  wind: () => number;
  windDir: () => number;
  vis: () => number;
}

function iceAt(depthNm: number, lat: number, n: NoiseSet, rng: Prng): IceState {
  const c = n.conc();
  const h = n.thick();
  const r = n.ridge();
  const s = n.snow();
  if (depthNm < -8) return { total: 0, categories: [] };
  if (depthNm < 0) {
    // Streaks of grease ice and shuga ahead of the edge in the cold air.
    if (c < -0.3) return { total: 0, categories: [] };
    return {
      total: 1,
      categories: [{ partialConcentration: 1, stage: c > 0.4 ? 'shuga' : 'grease', thicknessCm: Math.round(3 + 2 * h) }],
      icebergs: depthNm > -4 && c > 0.5 ? { icebergs: 0, bergyBits: 0, growlers: 1 } : undefined,
    };
  }
  if (depthNm < 15) {
    // The edge: pancakes of grey ice in the swell, brash from broken first-year floes, new ice between.
    const total = clamp(Math.round(2 + (depthNm / 15) * 3 + 1.2 * c), 2, 5);
    const a = 1;
    const b = Math.max(1, Math.round((total - a) * 0.6));
    const rest = total - a - b;
    // Floes washed by the swell carry a little wet snow; pancakes carry none.
    const cats: DemoIceType[] = [
      {
        partialConcentration: a, stage: 'thin-first-year', floeSize: c > 0 ? 'ice-cake' : 'small-ice-cake',
        thicknessCm: Math.round(45 + 12 * h), snowOn: { cover: 'partial', wetness: 'wet', depthCm: Math.round(4 + 2 * s) },
      },
      { partialConcentration: b, stage: 'grey', floeSize: 'pancake', thicknessCm: Math.round(12 + 2 * h), snowOn: { cover: 'none' } },
    ];
    if (rest > 0) cats.push({ partialConcentration: rest, stage: 'nilas', thicknessCm: Math.round(5 + 3 * h) });
    const growlers = c > 0.2 ? rng.int(1, 3) : 0;
    return { total, categories: cats, icebergs: growlers > 0 ? { icebergs: 0, bergyBits: rng.int(0, 1), growlers } : undefined };
  }
  if (depthNm < MIZ_WIDTH_NM) {
    // Inner marginal ice zone: first-year floes growing inward, grey-white ice in between.
    const f = (depthNm - 15) / (MIZ_WIDTH_NM - 15);
    const total = clamp(Math.round(5 + 3 * f + 0.8 * c), 5, 8);
    const a = Math.max(1, Math.round(total * 0.45));
    const b = Math.max(1, Math.round(total * 0.35));
    const rest = total - a - b;
    const cats: DemoIceType[] = [
      {
        partialConcentration: a, stage: 'medium-first-year', floeSize: f > 0.5 ? 'medium-floe' : 'small-floe',
        thicknessCm: Math.round(92 + 15 * h), ridgedTenths: clamp(Math.round(1 + r), 0, 2),
        sailHeightM: round1(0.8 + 0.2 * r), snowOn: { cover: 'complete', wetness: 'dry', crust: true, depthCm: Math.round(12 + 4 * s) },
      },
      {
        partialConcentration: b, stage: 'thin-first-year', floeSize: f > 0.5 ? 'small-floe' : 'ice-cake',
        thicknessCm: Math.round(52 + 12 * h), snowOn: { cover: 'complete', wetness: 'dry', depthCm: Math.round(5 + 2 * s) },
      },
    ];
    if (rest > 0) {
      cats.push({ partialConcentration: rest, stage: 'grey-white', floeSize: 'ice-cake', thicknessCm: Math.round(22 + 5 * h), snowOn: { cover: 'partial', wetness: 'dry', depthCm: 1 } });
    }
    return { total, categories: cats };
  }
  // The pack: close to compact first-year ice, ridged, with old ice further north.
  const inward = clamp((depthNm - MIZ_WIDTH_NM) / 60, 0, 1);
  const total = c > 0.1 - 0.3 * inward ? 10 : 9;
  const old = clamp(Math.round((lat - 82.3) * 2.5 + c), 0, 4);
  const bigFloes = inward > 0.5 ? 'vast-floe' : 'big-floe';
  const cats: DemoIceType[] = [];
  if (old > 0) {
    const multi = lat > 83.0;
    cats.push({
      partialConcentration: old, stage: multi ? 'multi-year' : 'second-year', floeSize: bigFloes,
      thicknessCm: Math.round((multi ? 290 : 200) + 30 * h),
      ridgedTenths: clamp(Math.round(3 + r), 1, 5), sailHeightM: round1(2.2 + 0.6 * r),
      snowOn: { cover: 'complete', wetness: 'dry', drifts: true, depthCm: Math.round(35 + 8 * s) },
    });
  }
  const thickFy = total - old - 1;
  cats.push({
    partialConcentration: thickFy, stage: 'thick-first-year', floeSize: old > 0 ? 'medium-floe' : bigFloes,
    thicknessCm: Math.round(140 + 15 * h), ridgedTenths: clamp(Math.round(2 + 2 * inward + r), 1, 5),
    sailHeightM: round1(1.4 + 0.4 * inward + 0.3 * r),
    snowOn: { cover: 'complete', wetness: 'dry', crust: true, drifts: inward > 0.5, depthCm: Math.round(22 + 5 * s) },
  });
  cats.push({ partialConcentration: 1, stage: 'grey-white', floeSize: 'small-floe', thicknessCm: Math.round(20 + 5 * h), snowOn: { cover: 'partial', wetness: 'dry', depthCm: 2 } });
  const openWater: OpenWater = total === 9
    ? { kind: 'lead', widthM: Math.round(rng.range(40, 400)), orientationDeg: rng.int(0, 179) }
    : { kind: c > 0.5 ? 'crack' : 'refrozen-lead', widthM: Math.round(rng.range(2, 30)), orientationDeg: rng.int(0, 179) };
  return { total, categories: cats, openWater };
}

function weatherAt(depthNm: number, hour: number, n: NoiseSet): Weather {
  // Air over the warm open water is much milder than over the pack (common practice).
  const base = depthNm < 0 ? -7 + depthNm / 20 : -9 - 10 * clamp(depthNm / 80, 0, 1);
  const synoptic = 4 * Math.sin((2 * Math.PI * hour) / 70 + 1.3);
  const airTempC = round1(clamp(base + synoptic + 1.5 * n.air(), -30, -1));
  const salinityPsu = depthNm < -8 ? 34.9 : round1(34.3 - 0.3 * clamp(depthNm / 60, 0, 1));
  const tf = freezingPointC(salinityPsu);
  // Atlantic water is above freezing away from the edge; in ice the surface is within tenths of a
  // degree of the freezing point and never below it.
  const excess = depthNm < 0 ? 0.15 + clamp(-depthNm / 60, 0, 1) * 2.8 : 0.04 + 0.04 * (1 + n.air());
  const waterTempC = round2(Math.ceil((tf + excess) * 100) / 100);
  const windSpeedKn = Math.round(clamp(13 + 9 * n.wind(), 2, 32));
  const windFromDeg = Math.round((360 + 30 + 80 * n.windDir()) % 360);
  const vis = n.vis();
  const visibilityKm = vis > 0.6 ? 1 : vis > 0.3 ? 4 : 15;
  const cloudOktas = clamp(Math.round(5 + 3 * vis), 0, 8);
  return { airTempC, waterTempC, salinityPsu, windSpeedKn, windFromDeg, visibilityKm, cloudOktas };
}

/** The scenario's ice types as the observation holds them: ice types, deformation, snow. */
function splitDemoIceTypes(list: readonly DemoIceType[]): Pick<Observation, 'categories' | 'deformation' | 'snow'> {
  const categories: IceCategory[] = list.map((t) => {
    const c: IceCategory = { partialConcentration: t.partialConcentration, stage: t.stage };
    if (t.floeSize !== undefined) c.floeSize = t.floeSize;
    if (t.thicknessCm !== undefined) c.thicknessCm = t.thicknessCm;
    return c;
  });
  const deformation = groupFromList(list.map((t) => {
    const d: Deformation = {};
    if (t.ridgedTenths !== undefined) d.ridgedTenths = t.ridgedTenths;
    if (t.raftedTenths !== undefined) d.raftedTenths = t.raftedTenths;
    if (t.sailHeightM !== undefined) d.sailHeightM = t.sailHeightM;
    return d;
  }));
  const snow = groupFromList(list.map((t) => t.snowOn));
  return { categories, ...(deformation ? { deformation } : {}), ...(snow ? { snow } : {}) };
}

// ---------------------------------------------------------------------------------------------

function iso(ms: number): IsoUtc {
  return new Date(ms).toISOString().replace('.000Z', 'Z');
}

function band(depthNm: number): 'open' | 'edge' | 'miz' | 'pack' {
  if (depthNm < 0) return 'open';
  if (depthNm < 15) return 'edge';
  return depthNm < MIZ_WIDTH_NM ? 'miz' : 'pack';
}

const BAND_NOTES: Record<ReturnType<typeof band>, string> = {
  open: 'Open water, long swell from the south-west.',
  edge: 'At the ice edge: pancake belt with brash and new ice between.',
  miz: 'Marginal ice zone; floes getting bigger to the north.',
  pack: 'In the pack; ship working between ridged floes.',
};

/** Hours (from the start) with no observation: a deck emergency drill and an ice-station task. */
const GAP_HOURS: readonly (readonly number[])[] = [[21, 22, 23], [78, 79]];

function makeObservers(rng: Prng): Observer[] {
  return [
    { id: rng.uuid(), name: 'Maren Holtvik', initials: 'MH' },
    { id: rng.uuid(), name: 'Dilan Achterberg', initials: 'DA' },
    { id: rng.uuid(), name: 'Ines Kowalczyk-Ruud', initials: 'IKR' },
    { id: rng.uuid(), name: 'Teodor Lunde', initials: 'TL' },
  ];
}

/**
 * Build the demo cruise. Pure and deterministic: the same seed always gives the same cruise.
 * Every observation passes the domain rules except the entries listed in `doubtful`, and the
 * listed `gaps` are the only missed hours.
 */
export function makeDemoCruise(seed = 1): DemoCruise {
  const rng = makePrng(seed);
  const startMs = Date.parse(DEMO_START);
  const endMs = startMs + DEMO_HOURS * HOUR_MS;
  const observers = makeObservers(rng);
  const cruise: Cruise = {
    id: rng.uuid(),
    name: 'FW26-03 Nansen Basin ice edge transect',
    vesselName: 'RV Frostwren',
    iceClass: 'PC5',
    intervalMinutes: 60,
    observers,
    displayTimeZone: 'Arctic/Longyearbyen',
    maxSpeedKn: 16,
    createdAt: iso(startMs - 2 * 24 * HOUR_MS),
    updatedAt: iso(endMs),
  };
  const deviceId = 'demo-' + rng.uuid();

  // Track: one point a minute, with a GPS drop-out of a quarter of an hour on day 3.
  const dropout = { from: 55 * 60 + 20, to: 55 * 60 + 35 };
  const track: TrackPoint[] = [];
  const totalMinutes = DEMO_HOURS * 60;
  for (let m = 0; m <= totalMinutes; m++) {
    if (m >= dropout.from && m < dropout.to) continue;
    const here = positionAt(m);
    const ahead = positionAt(Math.min(m + 1, totalMinutes));
    const behind = positionAt(Math.max(m - 1, 0));
    const inv = geodesicInverse(behind, ahead);
    const minutes = Math.min(m + 1, totalMinutes) - Math.max(m - 1, 0);
    const sogKn = round1((inv.distanceM / METRES_PER_NM) * (60 / minutes));
    const cogDeg = round1(inv.initialBearingDeg % 360);
    const leg = legAt(m);
    const headingDeg = round1((cogDeg + leg.headingOffsetDeg + 360) % 360);
    track.push({
      cruiseId: cruise.id, time: iso(startMs + m * MINUTE_MS),
      lat: Number(here.lat.toFixed(6)), lon: Number(here.lon.toFixed(6)),
      source: 'gps-serial', sogKn, cogDeg, headingDeg,
    });
  }

  const noise: NoiseSet = {
    conc: smoothNoise(rng), thick: smoothNoise(rng, 0.95), ridge: smoothNoise(rng), snow: smoothNoise(rng, 0.95),
    air: smoothNoise(rng, 0.8), wind: smoothNoise(rng, 0.8), windDir: smoothNoise(rng, 0.9), vis: smoothNoise(rng, 0.7),
  };
  const skipped = new Set(GAP_HOURS.flat());
  const observations: Observation[] = [];
  let lastBand: ReturnType<typeof band> | null = null;
  let afterGap = false;
  for (let hour = 0; hour < DEMO_HOURS; hour++) {
    const p = positionAt(hour * 60);
    const depth = demoIceDepthNm(p.lat, p.lon);
    // Noise runs on through the gaps, so the weather after a gap has moved on.
    const ice = iceAt(depth, p.lat, noise, rng);
    const weather = weatherAt(depth, hour, noise);
    if (skipped.has(hour)) {
      afterGap = true;
      continue;
    }
    const b = band(depth);
    const notes: string[] = [];
    if (b !== lastBand) notes.push(BAND_NOTES[b]);
    if (afterGap) notes.push('Missed the previous observations: observer called away from the bridge.');
    const leg = legAt(hour * 60);
    if (leg.headingOffsetDeg !== 0 && legAt((hour - 1) * 60) !== leg) notes.push('Ice station: ship moored to a vast floe, drifting with the ice.');
    lastBand = b;
    afterGap = false;
    const timeMs = startMs + hour * HOUR_MS;
    const observer = observers[Math.floor(hour / 4) % observers.length] as Observer;
    const obs: Observation = {
      id: rng.uuid(),
      cruiseId: cruise.id,
      time: iso(timeMs),
      position: { lat: Number(p.lat.toFixed(5)), lon: Number(p.lon.toFixed(5)), source: 'gps-serial', accuracyM: 5 },
      observerId: observer.id,
      totalConcentration: ice.total,
      ...splitDemoIceTypes(ice.categories),
      weather,
      notes: notes.join(' '),
      photoIds: [],
      revision: 1,
      savedAt: iso(timeMs + rng.int(2, 6) * MINUTE_MS),
      savedBy: observer.id,
      deviceId,
      deleted: false,
    };
    if (ice.openWater) obs.openWater = ice.openWater;
    if (ice.icebergs) obs.icebergs = ice.icebergs;
    observations.push(obs);
  }

  const doubtful = plantDoubtful(observations);
  const gaps: DemoGap[] = GAP_HOURS.map((hours) => {
    const first = hours[0] as number;
    const last = hours[hours.length - 1] as number;
    return { before: iso(startMs + (first - 1) * HOUR_MS), after: iso(startMs + (last + 1) * HOUR_MS), missedHours: hours.length };
  });
  return { cruise, observations, track, doubtful, gaps };
}

/**
 * Two entries an experienced reviewer would question:
 * - a position typed by hand with the degrees off by one (implies an impossible speed);
 * - grey ice (10-15 cm by WMO-No. 259) given as 45 cm thick.
 */
function plantDoubtful(observations: Observation[]): DemoDoubtfulEntry[] {
  const out: DemoDoubtfulEntry[] = [];
  // The typo: in the pack, around the middle of day 3, while the GPS feed was down.
  const typo = observations.find((o) => o.time >= '2026-03-11T12:00:00Z' && o.position !== null);
  if (typo?.position) {
    typo.position = { lat: Number((typo.position.lat - 1).toFixed(5)), lon: typo.position.lon, source: 'manual' };
    typo.notes = (typo.notes + ' GPS feed interrupted; position typed from the bridge display.').trim();
    out.push({
      observationId: typo.id, kind: 'position-typo', path: 'position.lat',
      explanation: 'Latitude typed one degree too far south: the implied speed from the neighbouring observations is impossible.',
    });
  }
  // The thickness: the second observation with grey pancakes at the ice edge on the way in.
  const grey = observations.filter((o) => o.categories.some((c) => c.stage === 'grey'))[1];
  const idx = grey?.categories.findIndex((c) => c.stage === 'grey') ?? -1;
  const cat = grey?.categories[idx];
  if (grey && cat) {
    cat.thicknessCm = 45;
    out.push({
      observationId: grey.id, kind: 'stage-thickness-mismatch', path: `categories.${idx}.thicknessCm`,
      explanation: 'Grey ice (10-15 cm, WMO-No. 259) recorded as 45 cm thick.',
    });
  }
  return out;
}

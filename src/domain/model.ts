// The observation model: the shape of everything Floe Ledger records.
// Pure data, no behaviour; every layer above (db, format, features, cli) shares these types.
// Units are in the field names where a number carries one, so nobody has to guess.

/** ISO 8601 date-time in UTC with a trailing `Z`, e.g. `2026-03-04T05:00:00Z`. */
export type IsoUtc = string;

/** Concentration in tenths, an integer 0..10 as the trade reports it. */
export type Tenths = number;

/** Vessel ice classes for POLARIS (IMO MSC.1/Circ.1519 Table 1.3 rows). */
export const VESSEL_ICE_CLASSES = [
  'PC1', 'PC2', 'PC3', 'PC4', 'PC5', 'PC6', 'PC7',
  'IA-Super', 'IA', 'IB', 'IC', 'none',
] as const;
export type VesselIceClass = (typeof VESSEL_ICE_CLASSES)[number];

/**
 * Stages of development (WMO-No. 259). The coarse stages (`young`, `first-year`, `old`) are
 * kept beside their subdivisions because observers often cannot tell the finer one.
 */
export const STAGE_KEYS = [
  'new', 'frazil', 'grease', 'slush', 'shuga',
  'nilas', 'dark-nilas', 'light-nilas', 'ice-rind',
  'young', 'grey', 'grey-white',
  'first-year', 'thin-first-year', 'thin-first-year-1', 'thin-first-year-2',
  'medium-first-year', 'thick-first-year',
  'old', 'second-year', 'multi-year',
  'glacier', 'undetermined',
] as const;
export type StageKey = (typeof STAGE_KEYS)[number];

/**
 * Forms of ice by floe size (WMO-No. 259), plus fast ice, icebergs and growlers/floebergs as the
 * egg code has them (one egg-code symbol, two SIGRID-3 codes: kept apart).
 */
export const FLOE_SIZE_KEYS = [
  'pancake', 'brash', 'small-ice-cake', 'ice-cake',
  'small-floe', 'medium-floe', 'big-floe', 'vast-floe', 'giant-floe',
  'fast-ice', 'icebergs', 'growlers-floebergs', 'undetermined',
] as const;
export type FloeSizeKey = (typeof FLOE_SIZE_KEYS)[number];

/**
 * How much of an ice type's surface snow covers (our own three steps: none, partial, complete).
 */
export const SNOW_COVERS = ['none', 'partial', 'complete'] as const;
export type SnowCoverKey = (typeof SNOW_COVERS)[number];

/**
 * Liquid-water content of the snow: the five wetness classes of the International
 * Classification for Seasonal Snow on the Ground (Fierz et al. 2009, UNESCO-IHP / IACS,
 * IHP-VII Technical Documents in Hydrology No. 83, table 3.3), judged by eye and by hand.
 */
export const SNOW_WETNESS_CLASSES = ['dry', 'moist', 'wet', 'very-wet', 'soaked'] as const;
export type SnowWetness = (typeof SNOW_WETNESS_CLASSES)[number];

/** Ice types are named a, b, c as the egg code's columns are (index 0 is "a", the thickest). */
export const ICE_TYPE_LETTERS = ['a', 'b', 'c'] as const;
export type IceTypeLetter = (typeof ICE_TYPE_LETTERS)[number];
/** One entry per ice type that has one, keyed by the ice type's letter. */
export type PerIceType<T> = Partial<Record<IceTypeLetter, T>>;

/** Open-water features (WMO-No. 259 terms). */
export const OPEN_WATER_KINDS = [
  'none', 'crack', 'lead', 'shore-lead', 'flaw-lead', 'polynya', 'refrozen-lead',
] as const;
export type OpenWaterKind = (typeof OPEN_WATER_KINDS)[number];

// `track-file`: a point read from an imported GPX, NMEA log or CSV track file.
export const POSITION_SOURCES = ['gps-serial', 'geolocation', 'manual', 'track-interpolated', 'track-file'] as const;
export type PositionSource = (typeof POSITION_SOURCES)[number];

export interface Position {
  /** WGS 84 decimal degrees, north positive, -90..90. */
  lat: number;
  /** WGS 84 decimal degrees, east positive, -180..180. */
  lon: number;
  source: PositionSource;
  /** Estimated horizontal accuracy in metres, where the source gives one. */
  accuracyM?: number;
  /** When the fix was taken, if it differs from the observation time. */
  fixTime?: IsoUtc;
}

export interface Observer {
  id: string;
  name: string;
  /** Two or three letters, shown in lists and on the map. */
  initials: string;
}

export interface Cruise {
  id: string;
  name: string;
  vesselName: string;
  iceClass: VesselIceClass;
  /** Expected time between observations; gaps longer than this are flagged. */
  intervalMinutes: number;
  observers: Observer[];
  /** IANA time zone shown beside UTC on screen (e.g. `Europe/Oslo`); storage stays UTC. */
  displayTimeZone: string;
  /** Implied-speed limit for the sequence check, in knots. */
  maxSpeedKn: number;
  /**
   * When the cruise ends (or ended), UTC. From then on the watch calls for no observation and
   * counts no missed hour. Optional: an open cruise has none. A local setting of the watch: it
   * is not part of the exchange format.
   */
  endTime?: IsoUtc;
  createdAt: IsoUtc;
  updatedAt: IsoUtc;
}

/**
 * One ice type of the observation: a column of the egg code, its fields in the egg code's order
 * (WMO-No. 259: concentration, stage of development, form), then the observed thickness.
 */
export interface IceCategory {
  partialConcentration: Tenths;
  stage: StageKey;
  floeSize?: FloeSizeKey;
  /** Typical level-ice thickness of this ice type, in centimetres. */
  thicknessCm?: number;
}

/** Deformation of one ice type: a group of its own, beside the ice type it describes. */
export interface Deformation {
  /** Share of this ice type's area that is ridged, in tenths (0..10). */
  ridgedTenths?: number;
  /** Share of this ice type's area that is rafted, in tenths (0..10). */
  raftedTenths?: number;
  /** Typical ridge sail height above the waterline, in metres. */
  sailHeightM?: number;
}

/** Snow on one ice type: a group of its own. Every member is optional; a blank one was not judged. */
export interface SnowCover {
  cover?: SnowCoverKey;
  /** Liquid-water class (Fierz et al. 2009). */
  wetness?: SnowWetness;
  /** A crust (wind or melt-freeze) was seen on the snow. */
  crust?: boolean;
  /** Drifts (dunes, sastrugi) were seen. */
  drifts?: boolean;
  /** Typical snow depth, in centimetres. */
  depthCm?: number;
}

export interface OpenWater {
  kind: OpenWaterKind;
  /** Typical width of the feature, in metres. */
  widthM?: number;
  /** Main orientation of leads, degrees true 0..180. */
  orientationDeg?: number;
}

export interface MeltPonds {
  /** Share of the ice surface covered by ponds, in tenths. */
  coverTenths: number;
  state?: 'open' | 'frozen' | 'drained';
}

export interface Icebergs {
  icebergs: number;
  bergyBits: number;
  growlers: number;
}

export interface Weather {
  airTempC?: number;
  waterTempC?: number;
  /** Sea surface salinity if measured (PSU); used for the freezing-point check. */
  salinityPsu?: number;
  windSpeedKn?: number;
  /** Direction the wind blows from, degrees true. */
  windFromDeg?: number;
  visibilityKm?: number;
  /** Cloud cover in oktas 0..8. */
  cloudOktas?: number;
}

/** A finding that a reviewer has looked at and accepted or explained. */
export interface FindingReview {
  /** The finding's rule code, e.g. `partials-exceed-total`. */
  code: string;
  path: string;
  comment: string;
  by: string;
  at: IsoUtc;
}

export interface Observation {
  /** Random UUID, stable across devices and merges. */
  id: string;
  cruiseId: string;
  time: IsoUtc;
  position: Position | null;
  observerId: string;
  /** Total concentration in tenths; null only while not yet judged (e.g. in darkness). */
  totalConcentration: Tenths | null;
  /** Up to three ice types, thickest first (index 0 is the egg code's "a"). */
  categories: IceCategory[];
  /** Stage of a trace (< 1/10) of ice thicker than the first category: the egg code's So. */
  traceStage?: StageKey;
  /** Stage of any remaining thinner ice: the egg code's Sd. */
  remainingStage?: StageKey;
  /** Ridged and rafted shares and sail height, per ice type (key `a` describes `categories[0]`). */
  deformation?: PerIceType<Deformation>;
  /** Snow per ice type (key `a` describes `categories[0]`). */
  snow?: PerIceType<SnowCover>;
  openWater?: OpenWater;
  meltPonds?: MeltPonds;
  icebergs?: Icebergs;
  weather?: Weather;
  notes: string;
  photoIds: string[];
  reviews?: FindingReview[];
  /** Starts at 1; every saved edit adds one. Drives merging. */
  revision: number;
  savedAt: IsoUtc;
  /** Observer id (or `import`, `review`) of whoever saved this revision. */
  savedBy: string;
  /** Random id of the browser profile or machine that saved this revision. */
  deviceId: string;
  deleted: boolean;
}

export interface TrackPoint {
  cruiseId: string;
  time: IsoUtc;
  lat: number;
  lon: number;
  source: PositionSource;
  /** Speed over ground in knots and course over ground in degrees true, when known. */
  sogKn?: number;
  cogDeg?: number;
  headingDeg?: number;
}

export type Severity = 'error' | 'warning' | 'info';

/** What a validation or QC rule reports. `error` blocks saving; `warning` may be saved with a note. */
export interface Finding {
  severity: Severity;
  /** Stable rule code, e.g. `stage-thickness-mismatch`. */
  code: string;
  /** Where: a dotted path into the observation, e.g. `categories.1.thicknessCm`. */
  path: string;
  message: string;
  /** For sequence findings: the observation it belongs to. */
  observationId?: string;
}

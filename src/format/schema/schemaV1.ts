// JSON Schema (draft 2020-12) of the Floe Ledger log format, version 1. The enumerations come
// from the model (src/domain/model.ts) and the nomenclature tables (src/domain/nomenclature.ts),
// so the schema can never disagree with the program about a stage, floe size or code.
import {
  FLOE_SIZE_KEYS,
  OPEN_WATER_KINDS,
  POSITION_SOURCES,
  STAGE_KEYS,
  VESSEL_ICE_CLASSES,
} from '../../domain/model';
import { LEGACY_SNOW_KINDS } from '../../domain/legacyIceTypes';
import { CONCENTRATION_CODE_LIST, FLOE_SIZE_CODE_LIST, STAGE_CODE_LIST } from '../codes';
import { LIMITS } from '../limits';
import { FORMAT_NAME, SCHEMA_V1_PATH, TRACK_COLUMNS, UNITS_V1 } from '../types';
import { array, constant, id, int, isoUtc, nullable, num, object, oneOf, text, type Schema } from './helpers';

export const tenths = (description: string): Schema => int(0, 10, `${description}, in tenths (0-10)`);
export const stage = (description: string) => oneOf(STAGE_KEYS, `${description}: a stage of development (WMO-No. 259)`);
export const stageCode = (description: string) => oneOf(STAGE_CODE_LIST, `${description}: SIGRID-3 stage code`);
export const concentrationCode = (description: string) => oneOf(CONCENTRATION_CODE_LIST, `${description}: SIGRID-3 concentration code`);

// A published format version is never edited: version 1 keeps the code lists it shipped with.
// The trace code 01 and the growlers/floebergs form (09) came with version 2.
export const V1_FLOE_SIZE_KEYS = FLOE_SIZE_KEYS.filter((k) => k !== 'growlers-floebergs');
const v1FloeSizeCodes = FLOE_SIZE_CODE_LIST.filter((c) => c !== '09');
const v1ConcentrationCode = (description: string) =>
  oneOf(CONCENTRATION_CODE_LIST.filter((c) => c !== '01'), `${description}: SIGRID-3 concentration code`);

const category = object(
  'One ice type of the observation, a column of the egg code; thickest first.',
  {
    partialConcentration: tenths('Partial concentration of this ice type'),
    partialConcentrationSigrid3: v1ConcentrationCode('The partial concentration'),
    stage: stage('Stage of development'),
    stageSigrid3: stageCode('The stage'),
    thicknessCm: num(0, 3000, 'Typical level-ice thickness, centimetres'),
    floeSize: oneOf(V1_FLOE_SIZE_KEYS, 'Form of ice by floe size (WMO-No. 259)'),
    floeSizeSigrid3: oneOf(v1FloeSizeCodes, 'The floe size: SIGRID-3 form code'),
    ridgedTenths: tenths('Share of this ice type that is ridged'),
    raftedTenths: tenths('Share of this ice type that is rafted'),
    sailHeightM: num(0, 30, 'Typical ridge sail height above the waterline, metres'),
    snowKind: oneOf(LEGACY_SNOW_KINDS, 'Snow on this ice type'),
    snowDepthCm: num(0, 500, 'Snow depth, centimetres'),
  },
  ['partialConcentration', 'partialConcentrationSigrid3', 'stage', 'stageSigrid3'],
);

const position = object(
  'Where the observation was made (WGS 84).',
  {
    lat: num(-90, 90, 'Latitude, decimal degrees, north positive'),
    lon: num(-180, 180, 'Longitude, decimal degrees, east positive'),
    source: oneOf(POSITION_SOURCES, 'Where the position came from'),
    accuracyM: num(0, 1_000_000, 'Estimated horizontal accuracy, metres'),
    fixTime: isoUtc('Time of the fix, when it differs from the observation time'),
  },
  ['lat', 'lon', 'source'],
);

const review = object(
  'A quality-control finding a reviewer has looked at and accepted or explained.',
  {
    code: text(100, 'Rule code of the finding'),
    path: text(200, 'Where in the observation the finding points'),
    comment: text(LIMITS.maxStringLength, 'The reviewer\'s explanation'),
    by: text(200, 'Who reviewed it'),
    at: isoUtc('When it was reviewed'),
  },
  ['code', 'path', 'comment', 'by', 'at'],
);

const versionProperties: Record<string, Schema> = {
  id: id('Observation id (random UUID), stable across devices and merges'),
  cruiseId: id('The cruise this observation belongs to; equals cruise.id'),
  time: isoUtc('Time of the observation, UTC'),
  position: nullable(position),
  observerId: id('Who observed: an id from observers'),
  totalConcentration: nullable(tenths('Total concentration')),
  totalConcentrationSigrid3: v1ConcentrationCode('The total concentration (99 when not judged)'),
  categories: array(category, 3, 'Up to three ice types, thickest first (egg code a, b, c)'),
  traceStage: stage('Stage of a trace (< 1/10) of ice thicker than the first type (egg code So)'),
  traceStageSigrid3: stageCode('The trace stage'),
  remainingStage: stage('Stage of any remaining thinner ice (egg code Sd)'),
  remainingStageSigrid3: stageCode('The remaining stage'),
  openWater: object(
    'Open-water features (WMO-No. 259 terms).',
    {
      kind: oneOf(OPEN_WATER_KINDS, 'Kind of feature'),
      widthM: num(0, 100_000, 'Typical width, metres'),
      orientationDeg: num(0, 180, 'Main orientation of leads, degrees true'),
    },
    ['kind'],
  ),
  meltPonds: object(
    'Melt ponds on the ice.',
    {
      coverTenths: tenths('Share of the ice surface covered by ponds'),
      state: oneOf(['open', 'frozen', 'drained'], 'State of the ponds'),
    },
    ['coverTenths'],
  ),
  icebergs: object(
    'Ice of land origin in sight.',
    {
      icebergs: int(0, 100_000, 'Number of icebergs'),
      bergyBits: int(0, 100_000, 'Number of bergy bits'),
      growlers: int(0, 100_000, 'Number of growlers'),
    },
    ['icebergs', 'bergyBits', 'growlers'],
  ),
  weather: object(
    'Weather at the time of the observation.',
    {
      airTempC: num(-90, 60, 'Air temperature, degrees Celsius'),
      waterTempC: num(-5, 40, 'Sea surface temperature, degrees Celsius'),
      salinityPsu: num(0, 50, 'Sea surface salinity, PSU'),
      windSpeedKn: num(0, 250, 'Wind speed, knots'),
      windFromDeg: num(0, 360, 'Direction the wind blows from, degrees true'),
      visibilityKm: num(0, 1000, 'Visibility, kilometres'),
      cloudOktas: int(0, 8, 'Cloud cover, oktas'),
    },
    [],
  ),
  notes: text(LIMITS.maxStringLength, 'Free text'),
  photoIds: array(id('A photo id from photos'), LIMITS.maxPhotosPerObservation, 'Photos of this observation'),
  reviews: array(review, LIMITS.maxReviews, 'Reviewed findings'),
  revision: int(1, 1_000_000_000, 'Revision number: 1 when first saved, one more for every saved edit'),
  savedAt: isoUtc('When this revision was saved'),
  savedBy: id('Who saved this revision: an observer id, or a role such as import'),
  deviceId: id('Random id of the machine or browser profile that saved this revision'),
  deleted: { type: 'boolean', description: 'True when the observation was deleted (deletes are soft)' },
};
const versionRequired = [
  'id', 'cruiseId', 'time', 'position', 'observerId', 'totalConcentration', 'totalConcentrationSigrid3',
  'categories', 'notes', 'photoIds', 'revision', 'savedAt', 'savedBy', 'deviceId', 'deleted',
];

const observationVersion = object('One saved revision of an observation.', versionProperties, versionRequired);
const observation = object(
  'An observation: its current revision, with earlier revisions and conflicting copies.',
  {
    ...versionProperties,
    history: array({ $ref: '#/$defs/observationVersion' }, LIMITS.maxVersionsPerObservation, 'Earlier revisions, oldest first'),
    conflicts: array(
      { $ref: '#/$defs/observationVersion' },
      LIMITS.maxVersionsPerObservation,
      'Copies with the same id and revision as a stored version but different content, kept for review',
    ),
  },
  versionRequired,
);

const trackRow: Schema = {
  type: 'array',
  description: `One track point: ${TRACK_COLUMNS.join(', ')}`,
  prefixItems: [
    isoUtc('Time of the fix, UTC'),
    num(-90, 90, 'Latitude, decimal degrees'),
    num(-180, 180, 'Longitude, decimal degrees'),
    oneOf(POSITION_SOURCES, 'Where the fix came from'),
    nullable(num(0, 100, 'Speed over ground, knots')),
    nullable(num(0, 360, 'Course over ground, degrees true')),
    nullable(num(0, 360, 'Heading, degrees true')),
  ],
  items: false,
  minItems: TRACK_COLUMNS.length,
};

const units = object(
  'Units and conventions of every number and code in the file (fixed values).',
  Object.fromEntries(Object.entries(UNITS_V1).map(([k, v]) => [k, constant(v, `Unit of ${k}`)])),
  Object.keys(UNITS_V1),
);

export const SCHEMA_V1: Schema = {
  $schema: 'https://json-schema.org/draft/2020-12/schema',
  $id: `https://floe-ledger.invalid/${SCHEMA_V1_PATH}`,
  title: 'Floe Ledger sea-ice log, format version 1',
  description:
    'A ship-based sea-ice observation log of one cruise: cruise, vessel, observers, observations with their revisions, the ship track and photos by reference. Terms from the WMO Sea-Ice Nomenclature, with SIGRID-3 codes beside them.',
  type: 'object',
  additionalProperties: false,
  required: ['format', 'formatVersion', 'exportedAt', 'generator', 'units', 'cruise', 'vessel', 'observers', 'observations', 'track', 'photos'],
  properties: {
    $schema: text(300, 'Where this schema is published (optional)'),
    format: constant(FORMAT_NAME, 'Format name'),
    formatVersion: constant(1, 'Format version'),
    exportedAt: isoUtc('When the file was written'),
    generator: object('The program that wrote the file.', { name: text(100, 'Program name'), version: text(50, 'Program version') }, ['name', 'version']),
    units,
    cruise: object(
      'The cruise.',
      {
        id: id('Cruise id'),
        name: text(200, 'Cruise name'),
        intervalMinutes: num(1, 10_080, 'Expected minutes between observations'),
        maxSpeedKn: num(0, 100, 'Implied-speed limit for the sequence check, knots'),
        displayTimeZone: text(64, 'IANA time zone shown beside UTC (display only)'),
        createdAt: isoUtc('When the cruise was created'),
        updatedAt: isoUtc('When the cruise settings last changed'),
      },
      ['id', 'name', 'intervalMinutes', 'maxSpeedKn', 'displayTimeZone', 'createdAt', 'updatedAt'],
    ),
    vessel: object(
      'The ship.',
      {
        name: text(200, 'Vessel name'),
        iceClass: oneOf(VESSEL_ICE_CLASSES, 'Ice class for POLARIS (IMO MSC.1/Circ.1519)'),
      },
      ['name', 'iceClass'],
    ),
    observers: array(
      object('An ice observer.', { id: id('Observer id'), name: text(200, 'Name'), initials: text(4, 'Initials') }, ['id', 'name', 'initials']),
      LIMITS.maxObservers,
      'The observers of the cruise',
    ),
    observations: array({ $ref: '#/$defs/observation' }, LIMITS.maxObservations, 'Observations, in time order'),
    track: object(
      'The ship track, one row per fix, in time order.',
      {
        columns: { type: 'array', description: 'Names of the row columns (fixed)', prefixItems: TRACK_COLUMNS.map((c) => ({ const: c })), items: false, minItems: TRACK_COLUMNS.length },
        points: array({ $ref: '#/$defs/trackRow' }, LIMITS.maxTrackPoints, 'Track rows'),
      },
      ['columns', 'points'],
    ),
    photos: array(
      object(
        'A photo, by reference; in an archive the image is at archivePath.',
        {
          id: id('Photo id'),
          observationId: id('The observation the photo belongs to'),
          fileName: text(255, 'Original file name'),
          mediaType: {
            type: 'string',
            maxLength: 100,
            pattern: '^(image/[a-z0-9.+-]+|application/octet-stream)$',
            description: 'Media type, e.g. image/jpeg (application/octet-stream when the browser gave none)',
          },
          byteLength: int(0, LIMITS.maxPhotoBytes, 'Size of the image, bytes'),
          addedAt: isoUtc('When the photo was attached'),
          takenAt: isoUtc('When the photo was taken'),
          archivePath: { type: 'string', maxLength: 200, pattern: '^photos/[A-Za-z0-9][A-Za-z0-9._-]*$', description: 'Path of the image inside a zip archive' },
        },
        ['id', 'observationId', 'fileName', 'mediaType', 'byteLength', 'archivePath'],
      ),
      LIMITS.maxPhotos,
      'Photos',
    ),
  },
  $defs: { observation, observationVersion, trackRow },
};

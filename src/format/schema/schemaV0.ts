// JSON Schema of the format's version 0, the draft shape written by the first prototype: flat
// positions, concentrations under short names, no units block, no SIGRID-3 codes, no history and
// no photos. It is kept so such files can still be read: src/format/migrate.ts lifts them to the
// current version. A shipped version's schema is never edited.
import { V1_FLOE_SIZE_KEYS } from './schemaV1';
import { FLOE_SIZE_KEYS, POSITION_SOURCES, STAGE_KEYS, VESSEL_ICE_CLASSES } from '../../domain/model';
import { LIMITS } from '../limits';
import { FORMAT_NAME } from '../types';
import { array, constant, id, int, isoUtc, nullable, num, object, oneOf, text, type Schema } from './helpers';

export const SCHEMA_V0: Schema = {
  $schema: 'https://json-schema.org/draft/2020-12/schema',
  $id: 'https://floe-ledger.invalid/format/floe-ledger-log-0.schema.json',
  title: 'Floe Ledger sea-ice log, format version 0 (draft, superseded by version 1)',
  type: 'object',
  additionalProperties: false,
  required: ['format', 'formatVersion', 'exported', 'cruise', 'observations', 'track'],
  properties: {
    format: constant(FORMAT_NAME, 'Format name'),
    formatVersion: constant(0, 'Format version'),
    exported: isoUtc('When the file was written'),
    cruise: object(
      'The cruise and its vessel.',
      {
        id: id('Cruise id'),
        name: text(200, 'Cruise name'),
        vessel: text(200, 'Vessel name'),
        iceClass: oneOf(VESSEL_ICE_CLASSES, 'Ice class'),
        intervalMinutes: num(1, 10_080, 'Minutes between observations'),
        observers: array(
          object('An observer.', { id: id('Observer id'), name: text(200, 'Name'), initials: text(4, 'Initials') }, ['id', 'name', 'initials']),
          LIMITS.maxObservers,
          'Observers',
        ),
        created: isoUtc('When the cruise was created'),
      },
      ['id', 'name', 'vessel', 'iceClass', 'intervalMinutes', 'observers', 'created'],
    ),
    observations: array(
      object(
        'An observation (current revision only).',
        {
          id: id('Observation id'),
          time: isoUtc('Time, UTC'),
          lat: nullable(num(-90, 90, 'Latitude')),
          lon: nullable(num(-180, 180, 'Longitude')),
          positionSource: oneOf(POSITION_SOURCES, 'Position source'),
          observer: id('Observer id'),
          total: nullable(int(0, 10, 'Total concentration, tenths')),
          ice: array(
            object(
              'An ice type, thickest first.',
              {
                conc: int(0, 10, 'Partial concentration, tenths'),
                stage: oneOf(STAGE_KEYS, 'Stage of development'),
                thicknessCm: num(0, 3000, 'Thickness, centimetres'),
                floeSize: oneOf(V1_FLOE_SIZE_KEYS, 'Floe size'),
              },
              ['conc', 'stage'],
            ),
            3,
            'Ice types',
          ),
          notes: text(LIMITS.maxStringLength, 'Notes'),
          revision: int(1, 1_000_000_000, 'Revision'),
          savedAt: isoUtc('When saved'),
          deleted: { type: 'boolean' },
        },
        ['id', 'time', 'lat', 'lon', 'positionSource', 'observer', 'total', 'ice', 'notes', 'revision', 'savedAt', 'deleted'],
      ),
      LIMITS.maxObservations,
      'Observations',
    ),
    track: array(
      object(
        'A track point.',
        { time: isoUtc('Time'), lat: num(-90, 90, 'Latitude'), lon: num(-180, 180, 'Longitude'), source: oneOf(POSITION_SOURCES, 'Source') },
        ['time', 'lat', 'lon', 'source'],
      ),
      LIMITS.maxTrackPoints,
      'Track',
    ),
  },
};

export interface LogFileV0 {
  format: typeof FORMAT_NAME;
  formatVersion: 0;
  exported: string;
  cruise: {
    id: string;
    name: string;
    vessel: string;
    iceClass: (typeof VESSEL_ICE_CLASSES)[number];
    intervalMinutes: number;
    observers: { id: string; name: string; initials: string }[];
    created: string;
  };
  observations: {
    id: string;
    time: string;
    lat: number | null;
    lon: number | null;
    positionSource: (typeof POSITION_SOURCES)[number];
    observer: string;
    total: number | null;
    ice: { conc: number; stage: (typeof STAGE_KEYS)[number]; thicknessCm?: number; floeSize?: (typeof FLOE_SIZE_KEYS)[number] }[];
    notes: string;
    revision: number;
    savedAt: string;
    deleted: boolean;
  }[];
  track: { time: string; lat: number; lon: number; source: (typeof POSITION_SOURCES)[number] }[];
}

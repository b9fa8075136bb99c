// JSON Schema (draft 2020-12) of the Floe Ledger log format, version 2. It is version 1 with the
// ice-type layout of our own: each ice type holds its egg-code fields in the egg code's order
// (WMO-No. 259: concentration, stage of development, form), then its thickness; deformation and
// snow are groups of their own, keyed by the ice type's letter (a, b, c). Snow is described by
// cover, the wetness classes of the International Classification for Seasonal Snow on the
// Ground (Fierz et al. 2009), crust and drift flags, and depth. Everything else is version 1's,
// taken from schemaV1.ts so the two can only differ where this file says.
import { ICE_TYPE_LETTERS, FLOE_SIZE_KEYS, SNOW_COVERS, SNOW_WETNESS_CLASSES } from '../../domain/model';
import { FLOE_SIZE_CODE_LIST } from '../codes';
import { SCHEMA_V2_PATH } from '../types';
import { array, constant, num, object, oneOf, type Schema } from './helpers';
import { concentrationCode, SCHEMA_V1, stage, stageCode, tenths } from './schemaV1';

const iceType = object(
  'One ice type of the observation, a column of the egg code (thickest first): concentration, stage, form, then thickness.',
  {
    partialConcentration: tenths('Partial concentration of this ice type'),
    partialConcentrationSigrid3: concentrationCode('The partial concentration'),
    stage: stage('Stage of development'),
    stageSigrid3: stageCode('The stage'),
    floeSize: oneOf(FLOE_SIZE_KEYS, 'Form of ice by floe size (WMO-No. 259)'),
    floeSizeSigrid3: oneOf(FLOE_SIZE_CODE_LIST, 'The floe size: SIGRID-3 form code'),
    thicknessCm: num(0, 3000, 'Typical level-ice thickness, centimetres'),
  },
  ['partialConcentration', 'partialConcentrationSigrid3', 'stage', 'stageSigrid3'],
);

const deformationEntry: Schema = {
  ...object(
    'Deformation of one ice type.',
    {
      ridgedTenths: tenths('Share of this ice type that is ridged'),
      raftedTenths: tenths('Share of this ice type that is rafted'),
      sailHeightM: num(0, 30, 'Typical ridge sail height above the waterline, metres'),
    },
    [],
  ),
  minProperties: 1,
};

const snowEntry: Schema = {
  ...object(
    'Snow on one ice type.',
    {
      cover: oneOf(SNOW_COVERS, 'How much of the ice type snow covers'),
      wetness: oneOf(SNOW_WETNESS_CLASSES, 'Liquid-water class (International Classification for Seasonal Snow on the Ground, Fierz et al. 2009)'),
      crust: { type: 'boolean', description: 'A crust was seen on the snow' },
      drifts: { type: 'boolean', description: 'Drifts (dunes, sastrugi) were seen' },
      depthCm: num(0, 500, 'Typical snow depth, centimetres'),
    },
    [],
  ),
  minProperties: 1,
};

/** A group keyed by ice-type letter: `a` describes the first ice type, and so on. */
const perIceType = (entryDef: 'deformationEntry' | 'snowEntry', description: string): Schema => ({
  ...object(description, Object.fromEntries(ICE_TYPE_LETTERS.map((l) => [l, { $ref: `#/$defs/${entryDef}` }])), []),
  minProperties: 1,
});

/** An observation version's properties with the version-2 ice types and the two groups after Sd. */
function withIceTypeLayout(def: Schema): Schema {
  const props = def.properties as Record<string, Schema>;
  const out: Record<string, Schema> = {};
  for (const [k, v] of Object.entries(props)) {
    out[k] =
      k === 'categories'
        ? array(iceType, 3, 'Up to three ice types, thickest first (egg code a, b, c)')
        : k === 'totalConcentrationSigrid3'
          ? concentrationCode('The total concentration (01 for a trace at 0/10, 99 when not judged)')
          : v;
    if (k === 'remainingStageSigrid3') {
      out.deformation = perIceType('deformationEntry', 'Ridged and rafted shares and sail height, per ice type (key a is the first ice type)');
      out.snow = perIceType('snowEntry', 'Snow per ice type (key a is the first ice type)');
    }
  }
  return { ...def, properties: out };
}

const v1Props = SCHEMA_V1.properties as Record<string, Schema>;
const v1Defs = SCHEMA_V1.$defs as Record<string, Schema>;

export const SCHEMA_V2: Schema = {
  ...SCHEMA_V1,
  $id: `https://floe-ledger.invalid/${SCHEMA_V2_PATH}`,
  title: 'Floe Ledger sea-ice log, format version 2',
  properties: { ...v1Props, formatVersion: constant(2, 'Format version') },
  $defs: {
    ...v1Defs,
    observation: withIceTypeLayout(v1Defs.observation as Schema),
    observationVersion: withIceTypeLayout(v1Defs.observationVersion as Schema),
    deformationEntry,
    snowEntry,
  },
};

import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { generateArtifacts } from '../../scripts/build-validators';
import { SCHEMA_V1 } from '../../src/format/schema/schemaV1';
import { SCHEMA_V2 } from '../../src/format/schema/schemaV2';
import { STAGE_KEYS } from '../../src/domain/model';
import { STAGE_CODE_LIST } from '../../src/format/codes';

const ROOT = resolve(import.meta.dirname, '../..');

describe('ahead-of-time validators and published schemas', () => {
  it('the committed files match a fresh generation (run: npx tsx scripts/build-validators.ts)', () => {
    const artifacts = generateArtifacts();
    expect(artifacts.size).toBe(12);
    for (const [rel, content] of artifacts) expect(readFileSync(resolve(ROOT, rel), 'utf8'), rel).toBe(content);
  });

  it('the validators compile no code at run time and need no ajv runtime module', () => {
    for (const [rel, content] of generateArtifacts()) {
      if (!rel.endsWith('.js')) continue;
      expect(content).not.toMatch(/\bnew Function\b|\beval\(|\brequire\(/);
    }
  });

  it('the schema enumerations come from the model and the nomenclature', () => {
    const stage = (SCHEMA_V1.$defs as Record<string, { properties: Record<string, { enum?: string[] }> }>).observationVersion?.properties.traceStage;
    expect(stage?.enum).toEqual([...STAGE_KEYS]);
    // SIGRID-3 (WMO/TD-No. 1214) stage codes run 81..99 with no 80 ("no stage") in an observed category.
    expect(STAGE_CODE_LIST).toEqual(['81', '82', '83', '84', '85', '86', '87', '88', '89', '91', '93', '95', '96', '97', '98', '99']);
  });

  it('version 2 takes the snow wetness classes from the model (Fierz et al. 2009) and differs from version 1 only in the ice-type layout', () => {
    const defs2 = SCHEMA_V2.$defs as Record<string, { properties: Record<string, { enum?: string[] }> }>;
    expect(defs2.snowEntry?.properties.wetness?.enum).toEqual(['dry', 'moist', 'wet', 'very-wet', 'soaked']);
    const p1 = Object.keys((SCHEMA_V1.$defs as Record<string, { properties: object }>).observationVersion?.properties ?? {});
    const p2 = Object.keys(defs2.observationVersion?.properties ?? {});
    expect(p2.filter((k) => !p1.includes(k))).toEqual(['deformation', 'snow']);
    expect(p1.filter((k) => !p2.includes(k))).toEqual([]);
    // Each ice type in the egg code's order (WMO-No. 259): concentration, stage, form, then thickness.
    const iceType = (defs2.observationVersion?.properties.categories as unknown as { items: { properties: object } }).items;
    expect(Object.keys(iceType.properties).filter((k) => !k.endsWith('Sigrid3'))).toEqual(['partialConcentration', 'stage', 'floeSize', 'thicknessCm']);
  });
});

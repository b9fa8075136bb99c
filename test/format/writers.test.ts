import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { csvCell, writeCsv } from '../../src/format/csv';
import { FLAT_COLUMNS } from '../../src/format/flat';
import { splitAtAntimeridian, toGeoJson, writeGeoJson } from '../../src/format/geojson';
import { writeNdjson } from '../../src/format/ndjson';
import { sampleBundle } from './arbitraries';

describe('CSV', () => {
  const text = writeCsv(sampleBundle()).join('');

  it('follows RFC 4180: CRLF records, a header, quoted fields with quotes doubled', () => {
    const records = text.split('\r\n');
    expect(records[records.length - 1]).toBe(''); // ends with CRLF
    expect(records[0]).toBe(FLAT_COLUMNS.join(','));
    // RFC 4180 section 2.6-2.7: a field with a comma or quote is quoted, inner quotes doubled.
    expect(text).toContain('"Leads to the north, ""refrozen""; =SUM(A1)"');
    expect(csvCell('a\nb')).toBe('"a\nb"');
  });

  it('reads back with an independent CSV parser (papaparse) to the same values', () => {
    const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data).toHaveLength(2);
    const [a, b] = parsed.data as [Record<string, string>, Record<string, string>];
    expect(a.observation_id).toBe('o-1');
    expect(a.time_utc).toBe('2026-03-02T10:00:00Z');
    expect(Number(a.lat)).toBe(78.25);
    expect(Number(a.lon)).toBe(-15.5); // negative numbers are never prefixed
    expect(a.total_concentration_tenths).toBe('9');
    // SIGRID-3 (WMO/TD-No. 1214): 9/10 is code 90; thick first-year stage 93; big floe 05; grey-white 85; pancake 22.
    expect(a.total_concentration_sigrid3).toBe('90');
    expect(a.a_stage).toBe('thick-first-year');
    expect(a.a_stage_sigrid3).toBe('93');
    expect(a.a_floe_size_sigrid3).toBe('05');
    expect(a.b_stage_sigrid3).toBe('85');
    expect(a.b_floe_size_sigrid3).toBe('22');
    expect(a.c_stage).toBe('');
    expect(a.trace_stage_sigrid3).toBe('97'); // multi-year
    expect(a.observer_initials).toBe('AE');
    expect(a.air_temp_c).toBe('-12.5');
    expect(a.notes).toBe('Leads to the north, "refrozen"; =SUM(A1)');
    expect(b.lat).toBe('');
    expect(b.total_concentration_sigrid3).toBe('99'); // not judged: unknown
    // OWASP CSV injection: text starting with - = + @ gets an apostrophe.
    expect(b.notes).toBe("'-dark, not judged");
  });

  it('puts the ice types first (egg-code order), then the deformation block, then the snow block', () => {
    const cols = [...FLAT_COLUMNS];
    const at = (c: string) => cols.indexOf(c);
    // Each ice type in the egg code's order (WMO-No. 259): concentration, stage, form, then thickness.
    expect(cols.slice(at('a_partial_concentration_tenths'), at('b_partial_concentration_tenths'))).toEqual([
      'a_partial_concentration_tenths', 'a_partial_concentration_sigrid3', 'a_stage', 'a_stage_term', 'a_stage_sigrid3',
      'a_floe_size', 'a_floe_size_sigrid3', 'a_thickness_cm',
    ]);
    const deformation = ['a', 'b', 'c'].flatMap((l) => [`${l}_ridged_tenths`, `${l}_rafted_tenths`, `${l}_sail_height_m`]);
    const snow = ['a', 'b', 'c'].flatMap((l) => [`${l}_snow_cover`, `${l}_snow_wetness`, `${l}_snow_crust`, `${l}_snow_drifts`, `${l}_snow_depth_cm`]);
    expect(cols.slice(at('a_ridged_tenths'), at('a_ridged_tenths') + deformation.length + snow.length)).toEqual([...deformation, ...snow]);
    expect(at('a_ridged_tenths')).toBeGreaterThan(at('c_thickness_cm'));
    const [a] = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true }).data as [Record<string, string>];
    expect([a.a_ridged_tenths, a.a_rafted_tenths, a.a_sail_height_m]).toEqual(['2', '', '1.5']);
    expect([a.a_snow_cover, a.a_snow_wetness, a.a_snow_crust, a.a_snow_drifts, a.a_snow_depth_cm]).toEqual(['complete', 'dry', 'true', '', '20']);
    expect([a.b_snow_cover, a.b_snow_depth_cm, a.c_snow_cover]).toEqual(['none', '', '']);
  });

  it('neutralises formula starts in text but not in numbers', () => {
    for (const s of ['=1+1', '+1', '-1', '@SUM(A1)', '\tx', '\rx']) expect(csvCell(s).replace(/^"/, '')).toMatch(/^'/);
    expect(csvCell(-1.5)).toBe('-1.5');
    expect(csvCell(null)).toBe('');
    expect(csvCell(true)).toBe('true');
  });

  it('leaves deleted observations out unless asked', () => {
    const b = sampleBundle();
    (b.observations[1] as { deleted: boolean }).deleted = true;
    expect(writeCsv(b)).toHaveLength(2);
    expect(writeCsv(b, { includeDeleted: true })).toHaveLength(3);
  });
});

describe('GeoJSON', () => {
  it('has points with [lon, lat] (RFC 7946 section 3.1.1), null geometry for no position, flat properties', () => {
    const fc = toGeoJson(sampleBundle());
    const [p1, p2] = fc.features;
    expect(p1?.geometry).toEqual({ type: 'Point', coordinates: [-15.5, 78.25] });
    expect(p1?.properties?.a_stage_sigrid3).toBe('93');
    expect(p1?.properties?.feature_kind).toBe('observation');
    expect(Object.values(p1?.properties ?? {}).every((v) => v === null || typeof v !== 'object')).toBe(true);
    expect(p2?.geometry).toBeNull();
  });

  it('cuts the track at the antimeridian into a MultiLineString (RFC 7946 section 3.1.9)', () => {
    const fc = toGeoJson(sampleBundle());
    const track = fc.features.find((f) => f.properties?.feature_kind === 'track');
    expect(track?.geometry?.type).toBe('MultiLineString');
    const lines = (track?.geometry as { coordinates: number[][][] }).coordinates;
    expect(lines).toHaveLength(2);
    // 179.5 -> -179.5 crosses halfway: latitude 78.25 at +-180.
    expect(lines[0]?.[lines[0].length - 1]?.[0]).toBe(180);
    expect(lines[0]?.[lines[0].length - 1]?.[1]).toBeCloseTo(78.25, 9);
    expect(lines[1]?.[0]).toEqual([-180, lines[0]?.[lines[0].length - 1]?.[1]]);
    for (const l of lines) for (let i = 1; i < l.length; i++) expect(Math.abs((l[i]?.[0] ?? 0) - (l[i - 1]?.[0] ?? 0))).toBeLessThanOrEqual(180);
  });

  it('keeps a track that does not cross as one LineString, and crosses westward too', () => {
    expect(splitAtAntimeridian([{ lat: 0, lon: 10 }, { lat: 1, lon: 11 }])).toEqual([[[10, 0], [11, 1]]]);
    const west = splitAtAntimeridian([{ lat: 60, lon: -179 }, { lat: 62, lon: 179 }]);
    expect(west).toEqual([[[-179, 60], [-180, 61]], [[180, 61], [179, 62]]]);
  });

  it('writes valid JSON text', () => {
    const parsed = JSON.parse(writeGeoJson(sampleBundle()).join('')) as { type: string; features: unknown[] };
    expect(parsed.type).toBe('FeatureCollection');
    expect(parsed.features).toHaveLength(3);
  });
});

describe('NDJSON', () => {
  it('writes one flat record per line', () => {
    const lines = writeNdjson(sampleBundle()).join('').split('\n');
    expect(lines).toHaveLength(3);
    const first = JSON.parse(lines[0] as string) as Record<string, unknown>;
    expect(Object.keys(first)).toEqual([...FLAT_COLUMNS]);
    expect(first.a_thickness_cm).toBe(140);
  });
});

// A total of 0/10 with some ice noted (a trace stage So, or a category) is "open water": less than
// 1/10 of ice (WMO-No. 259, concentration terms). SIGRID-3 (WMO/TD-No. 1214) codes it `01`
// ("less than 1/10"), not `00` ("ice free"). Every export must say so: the JSON log (both the
// encodeLog path and the fast export writer), CSV, NDJSON and GeoJSON.
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import type { Observation } from '../../src/domain/model';
import { writeCsv } from '../../src/format/csv';
import { encodeLog, exportLogJson, versionJson, writeLogJson } from '../../src/format/encode';
import { toGeoJson, writeGeoJson } from '../../src/format/geojson';
import { writeNdjson } from '../../src/format/ndjson';
import { readLogText } from '../../src/format/read';
import type { LogBundle } from '../../src/format/types';
import { sampleBundle } from './arbitraries';

const OPTS = { exportedAt: '2026-04-01T00:00:00Z' };

/** The sample log with o-2 turned into 0/10 and a trace of grey ice, o-1's history kept. */
function traceBundle(): LogBundle {
  const b = sampleBundle();
  const o2 = b.observations[1] as Observation;
  b.observations[1] = { ...o2, totalConcentration: 0, traceStage: 'grey' };
  // A third one: 0/10 and nothing noted stays ice free, `00`.
  b.observations.push({ ...o2, id: 'o-3', time: '2026-03-02T12:00:00Z', totalConcentration: 0 });
  return b;
}

type Rec = Record<string, unknown>;
const byId = (records: Rec[]) => new Map(records.map((r) => [r.observation_id ?? r.id, r]));

describe('0/10 with a trace is SIGRID-3 01, not 00 (WMO/TD-No. 1214; WMO-No. 259 "open water")', () => {
  it('JSON log, the fast export writer', () => {
    const doc = JSON.parse(exportLogJson(traceBundle(), OPTS).join('')) as { observations: Rec[] };
    const m = byId(doc.observations);
    expect(m.get('o-2')).toMatchObject({ totalConcentration: 0, totalConcentrationSigrid3: '01', traceStageSigrid3: '84' });
    expect(m.get('o-3')).toMatchObject({ totalConcentration: 0, totalConcentrationSigrid3: '00' });
    // The code stands right after its term, as for every other coded field.
    expect(exportLogJson(traceBundle(), OPTS).join('')).toContain('"totalConcentration":0,"totalConcentrationSigrid3":"01"');
  });

  it('JSON log, encodeLog and writeLogJson give the same document', () => {
    const fast = JSON.parse(exportLogJson(traceBundle(), OPTS).join('')) as unknown;
    const slow = JSON.parse(writeLogJson(encodeLog(traceBundle(), OPTS)).join('')) as unknown;
    expect(fast).toEqual(slow);
    expect(JSON.parse(versionJson(traceBundle().observations[1] as Observation))).toMatchObject({ totalConcentrationSigrid3: '01' });
  });

  it('JSON log reads back to the same observations, with no code problem', () => {
    const r = readLogText(exportLogJson(traceBundle(), OPTS).join(''), { rules: null });
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.bundle.observations.find((o) => o.id === 'o-2')).toMatchObject({ totalConcentration: 0, traceStage: 'grey' });
  });

  it('a file written before the fix (00 beside a trace) still reads', () => {
    const old = exportLogJson(traceBundle(), OPTS).join('').replace('"totalConcentration":0,"totalConcentrationSigrid3":"01"', '"totalConcentration":0,"totalConcentrationSigrid3":"00"');
    expect(old).not.toContain('"totalConcentrationSigrid3":"01"');
    expect(readLogText(old, { rules: null }).ok).toBe(true);
  });

  it('a code that is neither is still refused, naming the field', () => {
    const bad = exportLogJson(traceBundle(), OPTS).join('').replace('"totalConcentration":0,"totalConcentrationSigrid3":"01"', '"totalConcentration":0,"totalConcentrationSigrid3":"10"');
    const r = readLogText(bad, { rules: null });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems.listed.map((p) => `${p.path} ${p.message}`).join('\n')).toMatch(/totalConcentrationSigrid3 is "10" but the total concentration 0 has code "01"/);
  });

  it('CSV: code 01 and the WMO term "Open water"; 0/10 with nothing noted is 00 "Ice free"', () => {
    const rows = Papa.parse<Record<string, string>>(writeCsv(traceBundle()).join(''), { header: true, skipEmptyLines: true }).data;
    const m = byId(rows);
    expect(m.get('o-2')).toMatchObject({ total_concentration_tenths: '0', total_concentration_sigrid3: '01', total_concentration_term: 'Open water' });
    expect(m.get('o-3')).toMatchObject({ total_concentration_tenths: '0', total_concentration_sigrid3: '00', total_concentration_term: 'Ice free' });
  });

  it('NDJSON', () => {
    const lines = writeNdjson(traceBundle()).join('').trim().split('\n').map((l) => JSON.parse(l) as Rec);
    const m = byId(lines);
    expect(m.get('o-2')).toMatchObject({ total_concentration_sigrid3: '01', total_concentration_term: 'Open water' });
    expect(m.get('o-3')).toMatchObject({ total_concentration_sigrid3: '00' });
  });

  it('GeoJSON (points need a position: o-2 gets one here)', () => {
    const b = traceBundle();
    b.observations[1] = { ...(b.observations[1] as Observation), position: { lat: 77.9, lon: -12.25, source: 'manual' } };
    const doc = JSON.parse(writeGeoJson(b).join('')) as ReturnType<typeof toGeoJson>;
    const props = doc.features.map((f) => f.properties as Rec).filter((p) => p.feature_kind === 'observation');
    expect(byId(props).get('o-2')).toMatchObject({ total_concentration_sigrid3: '01', total_concentration_term: 'Open water' });
  });
});

// A generator of hostile or broken log files, every one of which must be rejected: prototype keys,
// huge arrays, deep nesting, numbers out of range, wrong types, missing and unknown fields,
// truncation, bad versions, inconsistent codes and references. Built from a valid file by
// mutations that are each invalid for every field they touch, so no case is accidentally valid.
import { encodeLog, writeLogJson } from '../../src/format/encode';
import type { LogFileV2 } from '../../src/format/types';
import { sampleBundle } from './arbitraries';

export interface HostileCase {
  name: string;
  text: string;
}

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

function validFile(): LogFileV2 {
  return encodeLog(sampleBundle(), { exportedAt: '2026-04-01T00:00:00Z' });
}

/**
 * A version-1 log whose track holds `rows` rows, each with exactly one schema error (latitude
 * 95), or all valid (latitude 75) when `valid` is set: the error-dense file of issue 16.
 */
export function errorDenseLog(rows: number, valid = false): Record<string, unknown> {
  const file = validFile() as unknown as Record<string, unknown>;
  const t0 = Date.UTC(2026, 2, 1);
  const points = Array.from({ length: rows }, (_, i) => [new Date(t0 + i * 1000).toISOString().replace('.000', ''), valid ? 75 : 95, 10, 'gps-serial', null, null, null]);
  return { ...file, track: { ...(file.track as object), points } };
}

export function validText(): string {
  return writeLogJson(validFile()).join('');
}

function clone(x: unknown): Json {
  return JSON.parse(JSON.stringify(x)) as Json;
}

/** Every path in the document, with the value there. */
function walk(v: Json, path: (string | number)[] = [], out: { path: (string | number)[]; value: Json }[] = []) {
  out.push({ path, value: v });
  if (Array.isArray(v)) v.forEach((x, i) => walk(x, [...path, i], out));
  else if (v !== null && typeof v === 'object') for (const [k, x] of Object.entries(v)) walk(x, [...path, k], out);
  return out;
}

function setAt(doc: Json, path: (string | number)[], value: Json | undefined): Json {
  const copy = clone(doc);
  let cur = copy as Record<string | number, Json>;
  for (const seg of path.slice(0, -1)) cur = cur[seg] as Record<string | number, Json>;
  const last = path[path.length - 1] as string | number;
  if (value === undefined) delete cur[last];
  else cur[last] = value;
  return copy;
}

/** A value no field of that kind accepts. */
function wrongTypes(v: Json): Json[] {
  if (typeof v === 'string') return [12345, true, [], { a: 1 }];
  if (typeof v === 'number') return ['12', true, [], { n: 1 }];
  if (typeof v === 'boolean') return ['true', 0];
  if (Array.isArray(v)) return [{}, 'list', 7];
  if (v !== null && typeof v === 'object') return [[], 'object', 3];
  return [];
}

/** Keys the scan or the schema must refuse, spliced into raw text so JSON.stringify cannot hide them. */
const PROTO_PAYLOADS = [
  '"__proto__": {"polluted": "yes"}',
  '"constructor": {"prototype": {"polluted": "yes"}}',
  '"\\u005f_proto__": {"polluted": "yes"}',
  '"prototype": {"polluted": "yes"}',
  '"__proto__": null',
];

export function hostileCases(): HostileCase[] {
  const file = clone(validFile());
  const text = validText();
  const cases: HostileCase[] = [];
  const add = (name: string, t: string) => cases.push({ name, text: t });
  const nodes = walk(file).filter((n) => n.path.length > 0 && n.path[0] !== '$schema');

  for (const n of nodes) {
    const where = n.path.join('.');
    wrongTypes(n.value).forEach((w, i) => add(`wrong type ${i} at ${where}`, JSON.stringify(setAt(file, n.path, w))));
    if (typeof n.value === 'number') {
      add(`huge number at ${where}`, JSON.stringify(setAt(file, n.path, 1e308)));
      add(`huge negative number at ${where}`, JSON.stringify(setAt(file, n.path, -1e308)));
      add(`overflowing literal at ${where}`, JSON.stringify(setAt(file, n.path, 424242)).replace('424242', '1e400'));
    }
    if (typeof n.value === 'string' && n.path[n.path.length - 1] !== 'name' && n.path[0] !== 'units') {
      add(`overlong string at ${where}`, JSON.stringify(setAt(file, n.path, 'x'.repeat(100_001))));
    }
    if (n.value !== null && typeof n.value === 'object' && !Array.isArray(n.value)) {
      add(`unknown field at ${where}`, JSON.stringify(setAt(file, [...n.path, 'extraField'], 1)));
    }
  }
  // Prototype keys in every object of the document, spliced in as text.
  const objectStarts: number[] = [];
  for (let i = 0, inStr = false; i < text.length; i++) {
    const c = text[i];
    if (inStr) {
      if (c === '\\') i++;
      else if (c === '"') inStr = false;
    } else if (c === '"') inStr = true;
    else if (c === '{') objectStarts.push(i);
  }
  for (const at of objectStarts) {
    PROTO_PAYLOADS.forEach((payload, k) => add(`prototype key ${k} in the object at offset ${at}`, `${text.slice(0, at + 1)}${payload},${text.slice(at + 1)}`));
  }
  // Missing required fields at the top and in the first observation.
  for (const k of ['format', 'formatVersion', 'exportedAt', 'units', 'cruise', 'vessel', 'observers', 'observations', 'track', 'photos']) {
    add(`missing ${k}`, JSON.stringify(setAt(file, [k], undefined)));
  }
  for (const k of ['id', 'cruiseId', 'time', 'position', 'observerId', 'totalConcentration', 'categories', 'notes', 'photoIds', 'revision', 'savedAt', 'savedBy', 'deviceId', 'deleted']) {
    add(`missing observations.0.${k}`, JSON.stringify(setAt(file, ['observations', 0, k], undefined)));
  }
  // Range and pattern violations on chosen fields.
  const o = ['observations', 0];
  const bad: [string, (string | number)[], Json][] = [
    ['latitude 91', [...o, 'position', 'lat'], 91],
    ['longitude -181', [...o, 'position', 'lon'], -181],
    ['total 11 tenths', [...o, 'totalConcentration'], 11],
    ['total 4.5 tenths', [...o, 'totalConcentration'], 4.5],
    ['negative partial', [...o, 'categories', 0, 'partialConcentration'], -1],
    ['revision 0', [...o, 'revision'], 0],
    ['four categories', [...o, 'categories'], clone([0, 1, 2, 3].map(() => (file as { observations: { categories: Json[] }[] }).observations[0]?.categories[0] ?? null))],
    ['local time', [...o, 'time'], '2026-03-02T10:00:00+01:00'],
    ['no seconds', [...o, 'time'], '2026-03-02T10:00Z'],
    ['not on the calendar', [...o, 'time'], '2026-02-30T10:00:00Z'],
    ['month 13', [...o, 'time'], '2026-13-02T10:00:00Z'],
    ['unknown stage', [...o, 'categories', 0, 'stage'], 'blue-ice'],
    ['stage code not matching', [...o, 'categories', 0, 'stageSigrid3'], '81'],
    ['concentration code not matching', [...o, 'totalConcentrationSigrid3'], '50'],
    ['wrong cruise id', [...o, 'cruiseId'], 'another-cruise'],
    ['history revision not below current', [...o, 'history', 0, 'revision'], 5],
    ['history of another observation', [...o, 'history', 0, 'id'], 'o-2'],
    ['photo of no observation', ['photos', 0, 'observationId'], 'o-404'],
    ['duplicate observation id', ['observations', 1, 'id'], 'o-1'],
    ['duplicate observer id', ['observers', 1, 'id'], 'obs-a'],
    ['id with a space', [...o, 'id'], 'o 1'],
    ['id with markup', [...o, 'id'], '<img src=x onerror=alert(1)>'],
    ['track row too short', ['track', 'points', 0], ['2026-03-02T09:00:00Z', 78, 10]],
    ['track row too long', ['track', 'points', 0], ['2026-03-02T09:00:00Z', 78, 10, 'manual', null, null, null, 'extra']],
    ['unit changed', ['units', 'thickness'], 'inches'],
    ['version 3', ['formatVersion'], 3],
    ['a version-2 file labelled version 1 (groups unknown to version 1)', ['formatVersion'], 1],
    ['snow wetness not a class of Fierz et al. 2009', [...o, 'snow', 'a', 'wetness'], 'slushy'],
    ['snow crust as text', [...o, 'snow', 'a', 'crust'], 'yes'],
    ['empty snow entry', [...o, 'snow', 'a'], {}],
    ['deformation of ice type d', [...o, 'deformation', 'd'], { ridgedTenths: 1 }],
    ['ridged share of 11 tenths', [...o, 'deformation', 'a', 'ridgedTenths'], 11],
    ['old snow kind inside a version-2 ice type', [...o, 'categories', 0, 'snowKind'], 'wet'],
    ['version -1', ['formatVersion'], -1],
    ['version 1.5', ['formatVersion'], 1.5],
    ['version as text', ['formatVersion'], '1'],
    ['another format', ['format'], 'some-other-log'],
    ['photo path escaping the archive', ['photos', 0, 'archivePath'], '../../etc/passwd'],
    ['photo of another media type', ['photos', 0, 'mediaType'], 'text/html'],
  ];
  for (const [name, path, value] of bad) add(name, JSON.stringify(setAt(file, path, value)));
  // Truncated files: the valid text cut at many points.
  const step = Math.max(1, Math.floor(text.length / 300));
  for (let cut = 0; cut < text.length - 2; cut += step) add(`truncated at ${cut}`, text.slice(0, cut));
  add('truncated before the last brace', text.slice(0, text.lastIndexOf('}')));
  // Deep nesting, huge arrays, not JSON at all.
  for (const d of [13, 100, 10_000, 200_000]) {
    add(`nesting ${d} arrays deep`, '['.repeat(d) + ']'.repeat(d));
    add(`nesting ${d} objects deep`, '{"a":'.repeat(d) + '1' + '}'.repeat(d));
    add(`notes nested ${d} deep`, text.replace('"notes":"first try"', `"notes":${'['.repeat(d)}${']'.repeat(d)}`));
  }
  add('an array of 5,000,001 elements', `{"format":"floe-ledger-log","formatVersion":1,"observations":[${'0,'.repeat(5_000_000)}0]}`);
  add('empty', '');
  add('whitespace', '  \n ');
  add('byte order mark only', '\ufeff');
  add('null', 'null');
  add('a number', '42');
  add('a string', '"floe-ledger-log"');
  add('an array', '[]');
  add('an empty object', '{}');
  add('binary garbage', String.fromCharCode(...Array.from({ length: 512 }, (_, i) => (i * 7919) % 256)));
  add('a zip signature as text', 'PK\u0003\u0004 not really a zip');
  add('trailing garbage', `${text}garbage`);
  add('two documents', `${text}${text}`);
  add('single quotes', text.replace(/"/g, "'"));
  add('trailing comma', text.replace(/\]\n\s*\}\n$/, '],\n}\n').replace('"photos": [', '"photos": [,'));
  add('comment', `// a log\n${text}`);
  add('NaN literal', JSON.stringify(setAt(file, [...o, 'revision'], 7777)).replace('7777', 'NaN'));
  add('Infinity literal', JSON.stringify(setAt(file, [...o, 'revision'], 7777)).replace('7777', 'Infinity'));
  add('unterminated string', text.replace('"first try"', '"first try'));
  add('lone backslash', text.replace('"first try"', '"first try\\"'));
  return cases;
}

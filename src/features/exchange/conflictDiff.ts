// The fields in which two versions of an observation differ, as dotted paths with both values.
import type { Observation } from '../../domain/model';

export interface FieldDifference {
  path: string;
  stored: string;
  copy: string;
}

const BOOKKEEPING = new Set(['savedAt', 'savedBy', 'deviceId']);

function flatten(v: unknown, prefix: string, out: Map<string, string>) {
  if (v !== null && typeof v === 'object') {
    const entries = Array.isArray(v) ? v.map((x, i) => [String(i), x] as const) : Object.entries(v as Record<string, unknown>);
    if (entries.length === 0) out.set(prefix, Array.isArray(v) ? '(none)' : '(empty)');
    for (const [k, x] of entries) flatten(x, prefix ? `${prefix}.${k}` : k, out);
  } else if (v !== undefined) {
    out.set(prefix, v === null ? '(blank)' : String(v));
  }
}

export function differences(stored: Observation, copy: Observation): FieldDifference[] {
  const a = new Map<string, string>();
  const b = new Map<string, string>();
  flatten(stored, '', a);
  flatten(copy, '', b);
  const keys = [...new Set([...a.keys(), ...b.keys()])].filter((k) => !BOOKKEEPING.has(k)).sort();
  return keys.filter((k) => a.get(k) !== b.get(k)).map((k) => ({ path: k, stored: a.get(k) ?? '(blank)', copy: b.get(k) ?? '(blank)' }));
}

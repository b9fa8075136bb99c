// NDJSON (one JSON object per line, "\n" separated): the flat observation records, for tools
// that stream (jq, pandas.read_json(lines=True), DuckDB).
import { exportedObservations, flatContext, flatRecord, type FlatOptions } from './flat';
import type { LogBundle } from './types';

export function writeNdjson(bundle: LogBundle, opts: FlatOptions = {}): string[] {
  const ctx = flatContext(bundle.cruise, opts.collocation);
  return exportedObservations(bundle.observations, opts).map((o) => JSON.stringify(flatRecord(o, ctx)) + '\n');
}

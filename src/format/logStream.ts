// The log file written piece by piece: the head, then observations a batch at a time, then the
// track a batch of rows at a time, then the photo list. The text is the same, byte for byte, as
// exportLogJson writes for the same records, but no piece needs more than its own batch in
// memory, so a season's log can be written from the store without holding it whole.
import type { Cruise, Observation } from '../domain/model';
import { encodeLog, observationsJson, trackRowsJson, type EncodeOptions, type VersionsById } from './encode';
import type { LogFileV2, PhotoMeta, TrackRow } from './types';

type Stage = 'head' | 'observations' | 'track' | 'done';

export class LogTextStream {
  private readonly file: LogFileV2;
  private stage: Stage = 'head';
  private written = 0;

  /** `photos` is the photo list of the cruise (metadata only; it is small and goes last). */
  constructor(cruise: Cruise, photos: PhotoMeta[], opts: EncodeOptions = {}) {
    this.file = encodeLog({ cruise, observations: [], history: [], conflicts: [], track: [], photos }, opts);
  }

  /** The opening of the file, up to the list of observations. */
  head(): string {
    this.expect('head');
    this.stage = 'observations';
    const { observations: _o, track: _t, photos: _p, ...head } = this.file;
    let out = '{\n';
    for (const [k, v] of Object.entries(head)) out += `  ${JSON.stringify(k)}: ${JSON.stringify(v)},\n`;
    return `${out}  "observations": [`;
  }

  /**
   * The next observations in file order (time, then id), with the earlier revisions and
   * conflict copies of exactly these observations.
   */
  observations(batch: readonly Observation[], history: VersionsById, conflicts: VersionsById): string {
    this.expect('observations');
    if (batch.length === 0) return '';
    return this.item(observationsJson(batch, history, conflicts));
  }

  /** Closes the observations and opens the track. */
  startTrack(): string {
    this.expect('observations');
    this.stage = 'track';
    const close = this.close('  ],\n');
    return `${close}  "track": {\n    "columns": ${JSON.stringify(this.file.track.columns)},\n    "points": [`;
  }

  /** The next track rows, in time order. */
  trackRows(rows: readonly TrackRow[]): string {
    this.expect('track');
    if (rows.length === 0) return '';
    return this.item(trackRowsJson(rows));
  }

  /** Closes the track, writes the photo list and ends the file. */
  end(): string {
    this.expect('track');
    this.stage = 'done';
    const close = this.close('    ]\n  },\n');
    const photos = this.file.photos;
    const list = photos.length === 0 ? '  "photos": []\n' : `  "photos": [\n    ${photos.map((p) => JSON.stringify(p)).join(',\n    ')}\n  ]\n`;
    return `${close}${list}}\n`;
  }

  private item(json: string): string {
    return `${this.written++ === 0 ? '\n' : ',\n'}    ${json}`;
  }

  private close(closing: string): string {
    const out = this.written === 0 ? closing.trimStart() : `\n${closing}`;
    this.written = 0;
    return out;
  }

  private expect(stage: Stage): void {
    if (this.stage !== stage) throw new Error(`log writer: called in the "${this.stage}" part, expected "${stage}"`);
  }
}

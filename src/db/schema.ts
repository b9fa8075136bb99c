// Every schema version of the database, oldest first. A version that has shipped is never
// edited: a change is a new entry with a higher number, its full `stores` and, when existing
// rows must change shape, an `upgrade` function. See docs/dev/db.md.
import type { Transaction } from 'dexie';
import { upgradeToIceTypeGroups } from './upgradeIceTypes';
import { convertTrackPointsToChunks } from './trackUpgrade';

export interface SchemaVersion {
  version: number;
  /** Dexie store specs: the primary key first, then the indexes. `null` deletes a table. */
  stores: Record<string, string | null>;
  /** Rewrites existing rows for this version; runs inside the upgrade transaction. */
  upgrade?: (tx: Transaction) => Promise<void> | void;
  /** Tables whose existing rows `upgrade` rewrites; the fixture test compares the others exactly. */
  rewrites?: readonly string[];
  /** One line for the contributor guide: what this version changed. */
  note: string;
}

export const SCHEMA_VERSIONS: readonly SchemaVersion[] = [
  {
    version: 1,
    note: 'first shipped version',
    stores: {
      cruises: 'id, name',
      // Observations are looked up by id, listed by cruise and time, and filtered by observer.
      observations: 'id, [cruiseId+time], observerId, cruiseId',
      // Append-only: one row per superseded version of an observation.
      revisions: '[observationId+revision], observationId',
      // One fix per cruise and instant; the key doubles as the time-range index.
      trackPoints: '[cruiseId+time]',
      photos: 'id, observationId, cruiseId',
      drafts: '[cruiseId+form], cruiseId',
      settings: 'key',
      meta: 'key',
    },
  },
  {
    version: 2,
    note: 'conflicts: copies of an observation that an import found with the same revision but other content, kept for review',
    stores: {
      cruises: 'id, name',
      observations: 'id, [cruiseId+time], observerId, cruiseId',
      revisions: '[observationId+revision], observationId',
      trackPoints: '[cruiseId+time]',
      photos: 'id, observationId, cruiseId',
      drafts: '[cruiseId+form], cruiseId',
      settings: 'key',
      meta: 'key',
      conflicts: 'id, observationId, cruiseId',
    },
  },
  {
    version: 3,
    note: 'log format 2 layout: deformation and snow of each ice type move into groups of their own (observations, revisions, conflicts and drafts rewritten; old snow kinds mapped or kept in the notes)',
    stores: {
      cruises: 'id, name',
      observations: 'id, [cruiseId+time], observerId, cruiseId',
      revisions: '[observationId+revision], observationId',
      trackPoints: '[cruiseId+time]',
      photos: 'id, observationId, cruiseId',
      drafts: '[cruiseId+form], cruiseId',
      settings: 'key',
      meta: 'key',
      conflicts: 'id, observationId, cruiseId',
    },
    upgrade: upgradeToIceTypeGroups,
    rewrites: ['observations', 'revisions', 'conflicts', 'drafts'],
  },
  {
    version: 4,
    note: 'track stored in chunks: one trackChunks row per cruise and UTC hour with columnar typed arrays; trackPoints rows converted and the table removed',
    stores: {
      cruises: 'id, name',
      observations: 'id, [cruiseId+time], observerId, cruiseId',
      revisions: '[observationId+revision], observationId',
      trackPoints: null,
      // One row per cruise and UTC hour (also the unit of a sync document). The second index
      // carries the point count, so counting a track reads index keys, not the arrays.
      trackChunks: '[cruiseId+hour], [cruiseId+hour+count]',
      photos: 'id, observationId, cruiseId',
      drafts: '[cruiseId+form], cruiseId',
      settings: 'key',
      meta: 'key',
      conflicts: 'id, observationId, cruiseId',
    },
    rewrites: ['trackPoints'],
    upgrade: (tx) => convertTrackPointsToChunks(tx),
  },
  {
    version: 5,
    note: 'ice information: imported ice charts (SIGRID-3) and satellite concentration grids, each with its time',
    stores: {
      cruises: 'id, name',
      observations: 'id, [cruiseId+time], observerId, cruiseId',
      revisions: '[observationId+revision], observationId',
      trackChunks: '[cruiseId+hour], [cruiseId+hour+count]',
      photos: 'id, observationId, cruiseId',
      drafts: '[cruiseId+form], cruiseId',
      settings: 'key',
      meta: 'key',
      conflicts: 'id, observationId, cruiseId',
      // Charts and grids are area products, not tied to one cruise; listed by their valid time.
      iceCharts: 'id, chartTime',
      iceGrids: 'id, gridTime',
    },
  },
  {
    version: 6,
    note: 'syncMarks and syncState: which documents a ship server holds, and the pull checkpoint and refusals per server database (src/sync)',
    stores: {
      cruises: 'id, name',
      observations: 'id, [cruiseId+time], observerId, cruiseId',
      revisions: '[observationId+revision], observationId',
      trackChunks: '[cruiseId+hour], [cruiseId+hour+count]',
      photos: 'id, observationId, cruiseId',
      drafts: '[cruiseId+form], cruiseId',
      settings: 'key',
      meta: 'key',
      conflicts: 'id, observationId, cruiseId',
      // One row per document the server is known to hold (sent, or pulled from it).
      syncMarks: '[server+docId], [server+cruiseId]',
      syncState: 'key',
      iceCharts: 'id, chartTime',
      iceGrids: 'id, gridTime',
    },
  },
  {
    version: 7,
    note: 'observations lose the index on cruiseId alone: [cruiseId+time] answers every query by cruise, and each write of an observation keeps one index entry fewer (an import of 50,000 observations writes about 1.5 s faster on the 2-core machine)',
    stores: {
      cruises: 'id, name',
      observations: 'id, [cruiseId+time], observerId',
      revisions: '[observationId+revision], observationId',
      trackChunks: '[cruiseId+hour], [cruiseId+hour+count]',
      photos: 'id, observationId, cruiseId',
      drafts: '[cruiseId+form], cruiseId',
      settings: 'key',
      meta: 'key',
      conflicts: 'id, observationId, cruiseId',
      syncMarks: '[server+docId], [server+cruiseId]',
      syncState: 'key',
      iceCharts: 'id, chartTime',
      iceGrids: 'id, gridTime',
    },
  },
  {
    version: 8,
    note: 'observations lose the index on observerId: nothing in the app looks observations up by observer across cruises, and in Chromium each index entry costs about as much as the row put itself (an import of 50,000 observations: 7.1 s of raw puts with the key alone, 11.6 s with two indexes)',
    stores: {
      cruises: 'id, name',
      observations: 'id, [cruiseId+time]',
      revisions: '[observationId+revision], observationId',
      trackChunks: '[cruiseId+hour], [cruiseId+hour+count]',
      photos: 'id, observationId, cruiseId',
      drafts: '[cruiseId+form], cruiseId',
      settings: 'key',
      meta: 'key',
      conflicts: 'id, observationId, cruiseId',
      syncMarks: '[server+docId], [server+cruiseId]',
      syncState: 'key',
      iceCharts: 'id, chartTime',
      iceGrids: 'id, gridTime',
    },
  },
];

export const LATEST_SCHEMA_VERSION = SCHEMA_VERSIONS[SCHEMA_VERSIONS.length - 1]?.version ?? 0;

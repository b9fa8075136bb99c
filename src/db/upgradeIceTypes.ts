// Database schema 3: rows written before log format 2 kept deformation and snow inside each ice
// type. The upgrade lifts every stored observation, earlier revision, conflicting copy and form
// draft into the new shape with the same pure functions the format migration uses
// (src/domain/legacyIceTypes.ts), so a row and the same observation read from an old file come
// out equal and merge as "identical". Nothing is dropped: a snow kind with no equal in the new
// fields is appended to the notes after a marker, as in the format migration.
import type { Transaction } from 'dexie';
import { liftLegacyObservation, notesWithKept, snowFromLegacyKind } from '../domain/legacyIceTypes';
import { iceTypeLetter } from '../domain/iceTypes';
import type { Observation } from '../domain/model';

/** A stored observation row as schema 2 holds it (categories may still carry the old fields). */
type StoredV2 = Observation & { categories: object[] };

export function liftStoredObservation(o: StoredV2): Observation {
  return liftLegacyObservation(o) as Observation;
}

/**
 * The form draft of schema 2 (`{ draft: { categories: [...], notes }, editing }`, see
 * src/features/log/useDraftAutosave.ts) with each ice type's old `snowKind` turned into the
 * snow fields the form has now. Drafts of any other shape are returned unchanged: a draft holds
 * typed text, and text the code does not recognise is better kept as it is than guessed at.
 */
export function liftDraftData(data: unknown): unknown {
  if (typeof data !== 'object' || data === null) return data;
  const draft = (data as { draft?: unknown }).draft;
  if (typeof draft !== 'object' || draft === null) return data;
  const cats = (draft as { categories?: unknown }).categories;
  if (!Array.isArray(cats)) return data;
  const kept: string[] = [];
  const categories = cats.map((c: unknown, i: number) => {
    if (typeof c !== 'object' || c === null || !('snowKind' in c)) return c;
    const { snowKind, ...rest } = c as Record<string, unknown> & { snowKind: unknown };
    const kind = typeof snowKind === 'string' ? snowKind : '';
    const mapped = kind === '' ? {} : snowFromLegacyKind(kind);
    if (mapped === null) kept.push(`ice type ${iceTypeLetter(i)} snow: ${kind}`);
    return {
      ...rest,
      snowCover: mapped?.cover ?? '',
      snowWetness: mapped?.wetness ?? '',
      snowCrust: mapped?.crust ?? false,
      snowDrifts: mapped?.drifts ?? false,
    };
  });
  const notes = (draft as { notes?: unknown }).notes;
  const nextDraft: Record<string, unknown> = { ...(draft as Record<string, unknown>), categories };
  if (kept.length > 0) nextDraft.notes = notesWithKept(typeof notes === 'string' ? notes : '', kept);
  return { ...(data as Record<string, unknown>), draft: nextDraft };
}

/** The upgrade function of schema version 3 (runs inside the upgrade transaction). */
export async function upgradeToIceTypeGroups(tx: Transaction): Promise<void> {
  await tx.table('observations').toCollection().modify((o: StoredV2, ref: { value: unknown }) => {
    ref.value = liftStoredObservation(o);
  });
  for (const table of ['revisions', 'conflicts']) {
    await tx.table(table).toCollection().modify((row: { observation: StoredV2 }) => {
      row.observation = liftStoredObservation(row.observation);
    });
  }
  await tx.table('drafts').toCollection().modify((row: { data: unknown }) => {
    row.data = liftDraftData(row.data);
  });
}

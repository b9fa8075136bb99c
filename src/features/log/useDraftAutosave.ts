// Nothing typed is lost: the form in progress is written to the drafts table on every change,
// and brought back when the log screen opens (after a reload, a crash or a closed lid).
import { useEffect, useState } from 'react';
import { listDrafts, loadDraft, saveDraft } from '../../db';
import { useObservationForm, withCategoryDefaults, type EditTarget, type ObservationDraft } from '../../state/observationForm';
import { OBSERVATION_DRAFT_FORM } from './logData';

export interface StoredDraft {
  draft: ObservationDraft;
  editing: EditTarget | null;
}

/** A new entry has one draft per cruise; each edit has its own, so starting one never loses the other. */
export function draftFormName(editing: EditTarget | null): string {
  return editing ? `${OBSERVATION_DRAFT_FORM}:${editing.id}` : OBSERVATION_DRAFT_FORM;
}

function isStoredDraft(x: unknown): x is StoredDraft {
  if (typeof x !== 'object' || x === null) return false;
  const d = (x as { draft?: unknown }).draft;
  return typeof d === 'object' && d !== null && Array.isArray((d as { categories?: unknown }).categories);
}

export type AutosaveState = { kind: 'idle' } | { kind: 'saved'; at: string } | { kind: 'failed'; message: string };

/**
 * Restores the cruise's draft once, then saves every change. Returns what happened to the
 * last write, for the small "draft kept" line under the form, and whether restoring is done.
 */
export function useDraftAutosave(cruiseId: string, newDraft: () => ObservationDraft): { state: AutosaveState; restored: string | null; ready: boolean } {
  const [state, setState] = useState<AutosaveState>({ kind: 'idle' });
  const [restored, setRestored] = useState<string | null>(null);
  const [ready, setReady] = useState(false);

  useEffect(() => {
    // The log screen is keyed by cruise, so this runs once per cruise and mount.
    let cancelled = false;
    void (async () => {
      const row = await loadDraft<unknown>(cruiseId, OBSERVATION_DRAFT_FORM).catch(() => undefined);
      const edits = await listDrafts(cruiseId).catch(() => []);
      if (cancelled) return;
      // An unsaved edit is newer work than the new-entry draft only if it was written later.
      const edit = edits.find((d) => d.form.startsWith(`${OBSERVATION_DRAFT_FORM}:`));
      const pick = edit && (!row || edit.savedAt > row.savedAt) ? edit : row;
      if (pick && isStoredDraft(pick.data)) {
        useObservationForm.getState().load(cruiseId, withCategoryDefaults(pick.data.draft), pick.data.editing, true);
        setRestored(pick.savedAt);
      } else {
        useObservationForm.getState().load(cruiseId, newDraft(), null, false);
      }
      setReady(true);
    })();
    return () => {
      cancelled = true;
    };
    // The factory only matters once per cruise.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [cruiseId]);

  useEffect(() => {
    if (!ready) return;
    return useObservationForm.subscribe((s, prev) => {
      if (s.changeCount === prev.changeCount || !s.dirty || s.cruiseId !== cruiseId) return;
      const data: StoredDraft = { draft: s.draft, editing: s.editing };
      saveDraft(cruiseId, draftFormName(s.editing), data)
        .then((r) => setState({ kind: 'saved', at: r.savedAt }))
        .catch((err: unknown) => setState({ kind: 'failed', message: err instanceof Error ? err.message : String(err) }));
    });
  }, [cruiseId, ready]);

  return { state, restored, ready };
}

/** Back to the new entry after an edit: the kept draft if there is one, else a fresh form. */
export async function resumeNewEntry(cruiseId: string, fresh: () => ObservationDraft): Promise<void> {
  const row = await loadDraft<unknown>(cruiseId, OBSERVATION_DRAFT_FORM).catch(() => undefined);
  const form = useObservationForm.getState();
  if (row && isStoredDraft(row.data) && !row.data.editing) form.load(cruiseId, withCategoryDefaults(row.data.draft), null, true);
  else form.load(cruiseId, fresh(), null, false);
}

/** Opens an observation for editing, with its unsaved edit draft if one was kept. */
export async function openEdit(cruiseId: string, id: string, fromStored: () => StoredDraft): Promise<void> {
  const row = await loadDraft<unknown>(cruiseId, `${OBSERVATION_DRAFT_FORM}:${id}`).catch(() => undefined);
  const form = useObservationForm.getState();
  if (row && isStoredDraft(row.data) && row.data.editing) form.load(cruiseId, withCategoryDefaults(row.data.draft), row.data.editing, true);
  else {
    const d = fromStored();
    form.load(cruiseId, d.draft, d.editing, false);
  }
}

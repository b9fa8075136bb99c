// From a review finding to the observation: on the map (the shared selection, which the map
// follows) or in the watch log's form, opened for editing.
import type { Observation } from '../../domain/model';
import { useNavigation } from '../../state/navigation';
import { useObservationForm } from '../../state/observationForm';
import { useSelection } from '../../state/selection';
import { observationToDraft } from '../log/formModel';
import { openEdit } from '../log/useDraftAutosave';

export function showOnMap(id: string): void {
  useSelection.getState().select(id, 'list');
  useNavigation.getState().go('map');
}

/**
 * Selects the observation, switches to the watch log and opens it in the form. The log restores
 * its own draft when it mounts; the edit is opened right after that first load, so it is not
 * overwritten (or after a second if the log was already showing its form).
 */
export function openInForm(cruiseId: string, o: Observation): void {
  useSelection.getState().select(o.id, 'list');
  let done = false;
  const open = (): void => {
    if (done) return;
    done = true;
    unsubscribe();
    clearTimeout(timer);
    void openEdit(cruiseId, o.id, () => ({ draft: observationToDraft(o, { asNext: false }), editing: { id: o.id, expectedRevision: o.revision } }));
  };
  const unsubscribe = useObservationForm.subscribe((s, prev) => {
    if (s.draft !== prev.draft || s.editing !== prev.editing) open();
  });
  const timer = setTimeout(open, 1000);
  useNavigation.getState().go('log');
}

// Time range and observer filters, kept in src/state so the list filters alike.
import type { Observer } from '../../domain/model';
import { useObservationFilters } from '../../state/observationFilters';

/** `2026-03-09T06:00` (a datetime-local value, read as UTC) to ISO 8601 UTC, or null when empty. */
export function utcFromInput(value: string): string | null {
  if (value === '') return null;
  const t = Date.parse(`${value}:00Z`);
  return Number.isNaN(t) ? null : new Date(t).toISOString().replace('.000Z', 'Z');
}

export function inputFromUtc(iso: string | null): string {
  return iso === null ? '' : iso.slice(0, 16);
}

export function MapFilters({ observers }: { observers: readonly Observer[] }) {
  const { from, to, observerIds, setRange, setObservers, reset } = useObservationFilters();
  // An empty set means everyone: unticking one observer then shows all the others.
  const toggle = (id: string) => {
    const shown = observerIds.length === 0 ? observers.map((o) => o.id) : observerIds;
    const next = shown.includes(id) ? shown.filter((x) => x !== id) : [...shown, id];
    setObservers(next.length === observers.length ? [] : next);
  };
  return (
    <fieldset className="map-filters">
      <legend>Show observations</legend>
      <label>
        From (UTC)
        <input type="datetime-local" value={inputFromUtc(from)} onChange={(e) => setRange(utcFromInput(e.target.value), to)} />
      </label>
      <label>
        To (UTC)
        <input type="datetime-local" value={inputFromUtc(to)} onChange={(e) => setRange(from, utcFromInput(e.target.value))} />
      </label>
      {observers.length > 0 && (
        <div role="group" aria-label="Observers">
          {observers.map((o) => (
            <label key={o.id} className="check">
              <input type="checkbox" checked={observerIds.length === 0 || observerIds.includes(o.id)} onChange={() => toggle(o.id)} />
              {o.name}
            </label>
          ))}
        </div>
      )}
      <button type="button" className="button" onClick={reset}>
        Show all
      </button>
    </fieldset>
  );
}

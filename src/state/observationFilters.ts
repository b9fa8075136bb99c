import { create } from 'zustand';

/**
 * Filters on the observations shown, shared by the map and the list: a time range (UTC, both
 * ends inclusive, either open) and a set of observers (empty means everyone).
 */
export interface ObservationFilters {
  /** ISO 8601 UTC or null for open. */
  from: string | null;
  to: string | null;
  observerIds: string[];
}

interface FilterState extends ObservationFilters {
  setRange: (from: string | null, to: string | null) => void;
  toggleObserver: (id: string) => void;
  setObservers: (ids: string[]) => void;
  reset: () => void;
}

const initial: ObservationFilters = { from: null, to: null, observerIds: [] };

export const useObservationFilters = create<FilterState>((set) => ({
  ...initial,
  setRange: (from, to) => set({ from, to }),
  toggleObserver: (id) =>
    set((s) => ({ observerIds: s.observerIds.includes(id) ? s.observerIds.filter((o) => o !== id) : [...s.observerIds, id] })),
  setObservers: (observerIds) => set({ observerIds }),
  reset: () => set(initial),
}));

/** Whether an observation passes the filters (the list uses this; the map uses a layer filter). */
export function passesFilters(f: ObservationFilters, o: { time: string; observerId: string }): boolean {
  const t = Date.parse(o.time);
  if (f.from !== null && t < Date.parse(f.from)) return false;
  if (f.to !== null && t > Date.parse(f.to)) return false;
  return f.observerIds.length === 0 || f.observerIds.includes(o.observerId);
}

import { create } from 'zustand';

/**
 * The observation selected on the map or in the list: one store, so selecting in either place
 * shows in both. `source` says where the selection was made (the map pans to a selection made
 * elsewhere, but not to one made on the map itself).
 */
interface SelectionState {
  selectedId: string | null;
  source: 'map' | 'list' | null;
  select: (id: string | null, source: 'map' | 'list') => void;
  clear: () => void;
}

export const useSelection = create<SelectionState>((set) => ({
  selectedId: null,
  source: null,
  select: (selectedId, source) => set({ selectedId, source: selectedId === null ? null : source }),
  clear: () => set({ selectedId: null, source: null }),
}));

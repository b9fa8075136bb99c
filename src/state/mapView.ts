import { create } from 'zustand';

/** `auto`: the globe when the cruise is polar, Mercator otherwise. */
export type ProjectionChoice = 'auto' | 'globe' | 'mercator';

interface MapViewState {
  projection: ProjectionChoice;
  setProjection: (p: ProjectionChoice) => void;
}

export const useMapView = create<MapViewState>((set) => ({
  projection: 'auto',
  setProjection: (projection) => set({ projection }),
}));

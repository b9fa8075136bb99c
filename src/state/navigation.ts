import { create } from 'zustand';

export const SCREENS = ['log', 'map', 'review', 'exchange', 'settings'] as const;
export type Screen = (typeof SCREENS)[number];

interface NavigationState {
  screen: Screen;
  go: (screen: Screen) => void;
}

export const useNavigation = create<NavigationState>((set) => ({
  screen: 'log',
  go: (screen) => set({ screen }),
}));

import { create } from 'zustand';

/** Day display, a dark night display, and a red one that keeps dark adaptation best. */
export type Theme = 'day' | 'night' | 'red';
/** `auto` follows the sun's elevation at the ship (see the watch log); the others are manual. */
export type ThemeMode = Theme | 'auto';

interface ThemeState {
  mode: ThemeMode;
  /** The theme chosen by the automatic rule, used while `mode` is `auto`. */
  autoTheme: Theme;
  setMode: (mode: ThemeMode) => void;
  setAutoTheme: (theme: Theme) => void;
}

export const useThemeStore = create<ThemeState>((set) => ({
  mode: 'day',
  autoTheme: 'day',
  setMode: (mode) => set({ mode }),
  setAutoTheme: (autoTheme) => set({ autoTheme }),
}));

export function effectiveTheme(state: Pick<ThemeState, 'mode' | 'autoTheme'>): Theme {
  return state.mode === 'auto' ? state.autoTheme : state.mode;
}

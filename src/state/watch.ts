// The watch on this laptop: who is on watch (per cruise) and how the reminder may call them.
// The observer on watch is also written to the settings table by the log screen, so a reload
// keeps it; this store is what the screens read.
import { create } from 'zustand';

interface WatchStoreState {
  /** Observer id on watch, per cruise id. */
  observerOnWatch: Record<string, string>;
  /** When the current observer took over, per cruise id (ISO UTC). */
  handoverAt: Record<string, string>;
  soundOn: boolean;
  /** The due slot (ISO UTC) whose reminder the observer silenced. */
  silencedSlot: string | null;
  setObserverOnWatch: (cruiseId: string, observerId: string, at?: string) => void;
  setSoundOn: (on: boolean) => void;
  silence: (slot: string | null) => void;
}

export const useWatchStore = create<WatchStoreState>((set) => ({
  observerOnWatch: {},
  handoverAt: {},
  soundOn: true,
  silencedSlot: null,
  setObserverOnWatch: (cruiseId, observerId, at) =>
    set((s) => ({
      observerOnWatch: { ...s.observerOnWatch, [cruiseId]: observerId },
      handoverAt: at ? { ...s.handoverAt, [cruiseId]: at } : s.handoverAt,
    })),
  setSoundOn: (soundOn) => set({ soundOn }),
  silence: (silencedSlot) => set({ silencedSlot }),
}));

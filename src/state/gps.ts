// The ship's GPS as the screens see it: connection state, the latest fix, sentence counts and
// the track-writing interval. The serial reader (src/gps) feeds it; the form, the watch and the
// night display read it. Only what is not persisted lives here.
import { create } from 'zustand';
import type { GpsFix } from '../gps/tracker';

export type GpsStatus = 'disconnected' | 'connecting' | 'connected' | 'error';

export type { GpsFix };

interface GpsState {
  status: GpsStatus;
  /** Why the connection failed or closed, in words for the observer. */
  message: string | null;
  baudRate: number;
  fix: GpsFix | null;
  /** When `fix` was taken from the reader (epoch ms); its age then was `fix.ageMs`. */
  fixAtMs: number;
  goodSentences: number;
  badSentences: number;
  /** The last bad sentence and why it was skipped. */
  lastBad: string | null;
  /** Seconds between track points written while connected. */
  trackIntervalS: number;
  lastTrackWrite: string | null;
  patch: (p: Partial<Omit<GpsState, 'patch'>>) => void;
}

export const useGpsStore = create<GpsState>((set) => ({
  status: 'disconnected',
  message: null,
  baudRate: 4800,
  fix: null,
  fixAtMs: 0,
  goodSentences: 0,
  badSentences: 0,
  lastBad: null,
  trackIntervalS: 60,
  lastTrackWrite: null,
  patch: (p) => set(p),
}));

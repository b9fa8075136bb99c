// The observation form in progress. Every field is kept as the text the observer typed (so a
// half-typed "-1," or "12" survives a re-render and a reload); src/features/log/formModel.ts
// turns it into an Observation and reports what it cannot read. The draft is autosaved to the
// database by the log screen on every change.
import { create } from 'zustand';
import type { FloeSizeKey, OpenWaterKind, Position, PositionSource, SnowCoverKey, SnowWetness, StageKey } from '../domain/model';

/**
 * One ice type as typed, with its deformation and snow rows: the form shows those in fieldsets
 * of their own, but they belong to the ice type and move with it when the types are reordered.
 */
export interface CategoryDraft {
  /** Stable key for React and for focus, independent of the category's place in the order. */
  key: string;
  partial: string;
  stage: StageKey | '';
  floeSize: FloeSizeKey | '';
  thicknessCm: string;
  ridged: string;
  rafted: string;
  sailHeightM: string;
  snowCover: SnowCoverKey | '';
  snowWetness: SnowWetness | '';
  snowCrust: boolean;
  snowDrifts: boolean;
  snowDepthCm: string;
}

export type MeltPondState = '' | 'open' | 'frozen' | 'drained';

export interface ObservationDraft {
  /** The observation's id, fixed when the draft starts, so photos can be attached before saving. */
  id: string;
  /** Empty while the time follows the clock; otherwise `YYYY-MM-DD HH:MM` (UTC) as typed. */
  time: string;
  positionSource: PositionSource;
  /** The typed position, for the manual source. */
  positionText: string;
  /** The position taken from the GPS, geolocation or the track; null until one is taken. */
  position: Position | null;
  observerId: string;
  total: string;
  categories: CategoryDraft[];
  traceStage: StageKey | '';
  remainingStage: StageKey | '';
  openWaterKind: OpenWaterKind | '';
  openWaterWidthM: string;
  openWaterOrientationDeg: string;
  meltCover: string;
  meltState: MeltPondState;
  icebergs: string;
  bergyBits: string;
  growlers: string;
  airTempC: string;
  waterTempC: string;
  salinityPsu: string;
  windSpeedKn: string;
  windFromDeg: string;
  visibilityKm: string;
  cloudOktas: string;
  notes: string;
  photoIds: string[];
  /** Notes the observer gave on warnings, keyed `code@path`. */
  warningNotes: Record<string, string>;
}

export interface EditTarget {
  id: string;
  expectedRevision: number;
}

export const MAX_CATEGORIES = 3;

let keyCounter = 0;
export function newCategoryKey(): string {
  keyCounter += 1;
  return `c${Date.now().toString(36)}${keyCounter}`;
}

export function emptyCategory(): CategoryDraft {
  return {
    key: newCategoryKey(),
    partial: '',
    stage: '',
    floeSize: '',
    thicknessCm: '',
    ridged: '',
    rafted: '',
    sailHeightM: '',
    snowCover: '',
    snowWetness: '',
    snowCrust: false,
    snowDrifts: false,
    snowDepthCm: '',
  };
}

/**
 * A stored draft with every field of today's ice-type rows: a draft kept by an older version
 * (or by another tab still running one) may lack a field added since, and the form reads them all.
 */
export function withCategoryDefaults(draft: ObservationDraft): ObservationDraft {
  return { ...draft, categories: draft.categories.map((c) => ({ ...emptyCategory(), ...c })) };
}

export function emptyDraft(observerId = '', positionSource: PositionSource = 'manual'): ObservationDraft {
  return {
    id: crypto.randomUUID(),
    time: '',
    positionSource,
    positionText: '',
    position: null,
    observerId,
    total: '',
    categories: [emptyCategory()],
    traceStage: '',
    remainingStage: '',
    openWaterKind: '',
    openWaterWidthM: '',
    openWaterOrientationDeg: '',
    meltCover: '',
    meltState: '',
    icebergs: '',
    bergyBits: '',
    growlers: '',
    airTempC: '',
    waterTempC: '',
    salinityPsu: '',
    windSpeedKn: '',
    windFromDeg: '',
    visibilityKm: '',
    cloudOktas: '',
    notes: '',
    photoIds: [],
    warningNotes: {},
  };
}

const pad = (n: number) => String(n).padStart(2, '0');

/** The minute now, as the time field shows it (`YYYY-MM-DD HH:MM`, UTC). */
export function utcMinuteText(d: Date): string {
  return `${d.getUTCFullYear()}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())} ${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}`;
}

/**
 * The time follows the clock until the observer starts entering: from the first change on it
 * holds that minute, the moment the ice was looked at.
 */
function withTime(draft: ObservationDraft, changedTime: boolean): ObservationDraft {
  if (changedTime || draft.time !== '') return draft;
  return { ...draft, time: utcMinuteText(new Date()) };
}

export type DraftField = Exclude<keyof ObservationDraft, 'categories' | 'id'>;
export type CategoryField = Exclude<keyof CategoryDraft, 'key'>;

interface ObservationFormState {
  /** The cruise the draft belongs to; null before a cruise is loaded. */
  cruiseId: string | null;
  draft: ObservationDraft;
  editing: EditTarget | null;
  /** True once the observer changed anything since the form was opened or saved. */
  dirty: boolean;
  /** Counts changes, so the autosave can tell a new change from a re-render. */
  changeCount: number;
  /** Shown once after the categories were put thickest first. */
  notice: string | null;

  setField: <K extends DraftField>(field: K, value: ObservationDraft[K]) => void;
  setCategoryField: <K extends CategoryField>(key: string, field: K, value: CategoryDraft[K]) => void;
  addCategory: () => string | null;
  removeCategory: (key: string) => void;
  /** Replaces the categories with the same drafts in a new order (the thickest-first rule). */
  reorderCategories: (keys: string[], notice: string) => void;
  /** Loads a draft (restored, started from the previous one, or opened for an edit). */
  load: (cruiseId: string, draft: ObservationDraft, editing: EditTarget | null, dirty: boolean) => void;
  setNotice: (notice: string | null) => void;
}

export const useObservationForm = create<ObservationFormState>((set, get) => ({
  cruiseId: null,
  draft: emptyDraft(),
  editing: null,
  dirty: false,
  changeCount: 0,
  notice: null,

  setField: (field, value) =>
    set((s) => ({
      draft: withTime({ ...s.draft, [field]: value }, field === 'time'),
      dirty: true,
      changeCount: s.changeCount + 1,
    })),

  setCategoryField: (key, field, value) =>
    set((s) => ({
      draft: withTime(
        { ...s.draft, categories: s.draft.categories.map((c) => (c.key === key ? { ...c, [field]: value } : c)) },
        false,
      ),
      dirty: true,
      changeCount: s.changeCount + 1,
    })),

  addCategory: () => {
    const { draft } = get();
    if (draft.categories.length >= MAX_CATEGORIES) return null;
    const c = emptyCategory();
    set((s) => ({
      draft: { ...s.draft, categories: [...s.draft.categories, c] },
      dirty: true,
      changeCount: s.changeCount + 1,
    }));
    return c.key;
  },

  removeCategory: (key) =>
    set((s) => ({
      draft: { ...s.draft, categories: s.draft.categories.filter((c) => c.key !== key) },
      dirty: true,
      changeCount: s.changeCount + 1,
    })),

  reorderCategories: (keys, notice) =>
    set((s) => {
      const byKey = new Map(s.draft.categories.map((c) => [c.key, c]));
      const ordered = keys.map((k) => byKey.get(k)).filter((c): c is CategoryDraft => c !== undefined);
      if (ordered.length !== s.draft.categories.length) return {};
      return { draft: { ...s.draft, categories: ordered }, notice, dirty: true, changeCount: s.changeCount + 1 };
    }),

  load: (cruiseId, draft, editing, dirty) =>
    set((s) => ({ cruiseId, draft, editing, dirty, notice: null, changeCount: s.changeCount + 1 })),

  setNotice: (notice) => set({ notice }),
}));

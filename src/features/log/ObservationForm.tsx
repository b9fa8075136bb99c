// The observation form: keyboard first. Tab moves field by field, number keys fill tenths and
// move on, lists narrow as you type, Page Down / Page Up jump a section, Enter saves.
// Shortcuts are listed under the form (see docs/dev/log.md for the whole keyboard map).
import { useEffect, useMemo, useRef, useState, type FormEvent } from 'react';
import { ObservationConflictError, FloeDbError, clearDraft, saveObservation } from '../../db';
import type { Cruise, Finding, FindingReview, Observation, Position } from '../../domain/model';
import { toIsoUtc } from '../../domain/watch';
import { emptyDraft, useObservationForm, type DraftField, type ObservationDraft } from '../../state/observationForm';
import { useWatchStore } from '../../state/watch';
import { CategoryFieldset } from './CategoryFieldset';
import { thickestFirst } from './categoryOrder';
import { describedBy, Field, FindingLines, findingsAt } from './Field';
import { FindingsSummary } from './FindingsSummary';
import { jumpSection } from './focusNav';
import { CATEGORY_LETTERS, filledCategories, findingKey, isBlankCategory, observationToDraft, readDraft, type ObservationFields } from './formModel';
import { DeformationFieldset, groupControlId, SnowFieldset } from './IceTypeGroupFieldsets';
import { draftFormName, resumeNewEntry } from './useDraftAutosave';
import { observationFindings } from './findings';
import { MELT_STATE_OPTIONS, OPEN_WATER_OPTIONS, observerOptions, STAGE_OPTIONS } from './options';
import { PhotoField } from './PhotoField';
import { PickList } from './PickList';
import { PositionField } from './PositionField';
import { SidePanel } from './SidePanel';
import { TenthsInput } from './TenthsInput';
import { ConflictPanel } from './ConflictPanel';
import { useNow, zoneTime } from './useNow';

interface Props {
  cruise: Cruise;
  /** The cruise's observations, oldest first. */
  observations: readonly Observation[];
  /** The live position of the draft's source (GPS fix, track at the observation time). */
  livePosition: Position | null;
  /** Why the chosen source has no position, when it has none (e.g. outside the track). */
  positionNote?: string | null;
  /** The source to start a new entry with (the GPS when connected, else the track, else typed). */
  defaultSource: Position['source'];
}

type Status =
  | { kind: 'idle' }
  | { kind: 'saved'; text: string }
  | { kind: 'blocked'; errors: Finding[] }
  | { kind: 'failed'; text: string };

const CATEGORY_PATH_FIELDS: Record<string, string> = {
  partialConcentration: 'partial', stage: 'stage', floeSize: 'floeSize', thicknessCm: 'thicknessCm',
};

/** Control of each group field, by the model's field name (first one for the group itself). */
const GROUP_PATH_FIELDS = {
  deformation: { group: 'def', first: 'ridged', fields: { ridgedTenths: 'ridged', raftedTenths: 'rafted', sailHeightM: 'sailHeightM' } },
  snow: { group: 'snow', first: 'cover', fields: { cover: 'cover', wetness: 'wetness', crust: 'crust', drifts: 'drifts', depthCm: 'depthCm' } },
} as const satisfies Record<string, { group: 'def' | 'snow'; first: string; fields: Record<string, string> }>;

const PLAIN_PATH_FIELDS: Record<string, string> = {
  time: 'f-time', position: 'f-position', observerId: 'f-observer', totalConcentration: 'f-total',
  traceStage: 'f-traceStage', remainingStage: 'f-remainingStage', notes: 'f-notes',
  'openWater.kind': 'f-openWaterKind', 'openWater.widthM': 'f-openWaterWidthM', 'openWater.orientationDeg': 'f-openWaterOrientationDeg',
  'meltPonds.coverTenths': 'f-meltCover', 'meltPonds.state': 'f-meltState',
  'icebergs.icebergs': 'f-icebergs', 'icebergs.bergyBits': 'f-bergyBits', 'icebergs.growlers': 'f-growlers',
};

/** The id of the control a finding's path points at, so a blocked save can put the cursor there. */
export function controlIdForPath(path: string, draft: ObservationDraft): string | null {
  const cat = /^categories\.(\d+)(?:\.(\w+))?/.exec(path);
  if (cat) {
    const c = filledCategories(draft)[Number(cat[1])];
    if (!c) return null;
    return `f-cat-${c.key}-${CATEGORY_PATH_FIELDS[cat[2] ?? 'partialConcentration'] ?? 'partial'}`;
  }
  const grp = /^(deformation|snow)\.([a-z])(?:\.(\w+))?/.exec(path);
  if (grp) {
    const spec = GROUP_PATH_FIELDS[grp[1] as 'deformation' | 'snow'];
    const c = filledCategories(draft)[(CATEGORY_LETTERS as readonly string[]).indexOf(grp[2] ?? '')];
    if (!c) return null;
    const fields: Readonly<Record<string, string>> = spec.fields;
    return groupControlId(spec.group, c.key, fields[grp[3] ?? ''] ?? spec.first);
  }
  if (path.startsWith('weather.')) return `f-${path.slice('weather.'.length)}`;
  return PLAIN_PATH_FIELDS[path] ?? (path.startsWith('position') ? 'f-position' : null);
}

export function ObservationForm({ cruise, observations, livePosition, positionNote = null, defaultSource }: Props) {
  const draft = useObservationForm((s) => s.draft);
  const editing = useObservationForm((s) => s.editing);
  const dirty = useObservationForm((s) => s.dirty);
  const notice = useObservationForm((s) => s.notice);
  const setField = useObservationForm((s) => s.setField);
  const load = useObservationForm((s) => s.load);
  const onWatch = useWatchStore((s) => s.observerOnWatch[cruise.id] ?? '');
  const formRef = useRef<HTMLFormElement>(null);
  const [status, setStatus] = useState<Status>({ kind: 'idle' });
  const [conflict, setConflict] = useState<ObservationConflictError | null>(null);
  const [confirmReplace, setConfirmReplace] = useState(false);
  const now = useNow(1000);

  const previous = useMemo(() => {
    for (let i = observations.length - 1; i >= 0; i--) {
      const o = observations[i];
      if (o && o.id !== draft.id) return o;
    }
    return null;
  }, [observations, draft.id]);

  const reading = useMemo(
    () => readDraft(draft, { id: draft.id, cruiseId: cruise.id, now, livePosition }),
    [draft, cruise.id, now, livePosition],
  );
  // A form nobody has touched yet has nothing to check: findings start with the first change.
  const checked = dirty || editing !== null;
  const findings = useMemo(
    () => (checked ? [...reading.findings, ...observationFindings(reading.observation, cruise, observations)] : []),
    [checked, reading, cruise, observations],
  );
  const filled = filledCategories(draft);

  const focusId = (id: string) => {
    // A save can finish after the page is gone (a closing tab, a torn-down test): nothing to focus.
    if (typeof document === 'undefined') return;
    const el = document.getElementById(id);
    if (el) el.focus();
  };

  const startFromPrevious = () => {
    if (!previous) {
      setStatus({ kind: 'failed', text: 'There is no earlier observation in this cruise to start from.' });
      return;
    }
    if (dirty && !confirmReplace) {
      setConfirmReplace(true);
      return;
    }
    setConfirmReplace(false);
    const next = observationToDraft(previous, { asNext: true, observerId: onWatch || previous.observerId, positionSource: defaultSource });
    load(cruise.id, next, null, false);
    setStatus({ kind: 'idle' });
    queueMicrotask(() => focusId('f-total'));
  };

  const applyOrder = (): ObservationDraft => {
    const current = useObservationForm.getState().draft;
    const order = thickestFirst(current);
    if (!order) return current;
    useObservationForm.getState().reorderCategories(order.keys, order.notice);
    return useObservationForm.getState().draft;
  };

  const save = async () => {
    const current = applyOrder();
    const at = new Date();
    const r = readDraft(current, { id: current.id, cruiseId: cruise.id, now: at, livePosition });
    const all = [...r.findings, ...observationFindings(r.observation, cruise, observations)];
    const errors = all.filter((f) => f.severity === 'error');
    if (errors.length > 0) {
      setStatus({ kind: 'blocked', errors });
      const first = errors[0];
      const id = first ? controlIdForPath(first.path, current) : null;
      if (id) focusId(id);
      return;
    }
    const reviews: FindingReview[] = all
      .filter((f) => f.severity === 'warning' && (current.warningNotes[findingKey(f)] ?? '').trim() !== '')
      .map((f) => ({ code: f.code, path: f.path, comment: (current.warningNotes[findingKey(f)] ?? '').trim(), by: current.observerId, at: toIsoUtc(at.getTime()) }));
    const input: ObservationFields = { ...r.observation };
    if (reviews.length > 0) input.reviews = reviews;
    await store(input, editing?.expectedRevision ?? 0);
  };

  const store = async (input: ObservationFields, expectedRevision: number) => {
    const formName = draftFormName(useObservationForm.getState().editing);
    try {
      const res = await saveObservation(input, { expectedRevision, savedBy: input.observerId });
      await clearDraft(cruise.id, formName).catch(() => undefined);
      setConflict(null);
      const when = input.time.slice(11, 16);
      setStatus({
        kind: 'saved',
        text: res.changed
          ? `Saved: the ${when} UTC observation, revision ${res.observation.revision}.`
          : `Nothing changed: the ${when} UTC observation is stored as it was.`,
      });
      const fresh = () => emptyDraft(onWatch || input.observerId, defaultSource);
      if (expectedRevision > 0 || useObservationForm.getState().editing) await resumeNewEntry(cruise.id, fresh);
      else load(cruise.id, fresh(), null, false);
      queueMicrotask(() => focusId('f-start-previous'));
    } catch (err) {
      if (err instanceof ObservationConflictError) {
        setConflict(err);
        setStatus({ kind: 'failed', text: err.message });
      } else {
        setStatus({ kind: 'failed', text: err instanceof FloeDbError || err instanceof Error ? err.message : String(err) });
      }
    }
  };

  const onSubmit = (e: FormEvent) => {
    e.preventDefault();
    void save();
  };

  // Shortcuts that work anywhere on the log screen, not only inside a field.
  const keys = useRef({ startFromPrevious, save });
  useEffect(() => {
    keys.current = { startFromPrevious, save };
  });
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.altKey && !e.ctrlKey && !e.metaKey) {
        const k = e.key.toLowerCase();
        if (k === 'p') {
          e.preventDefault();
          keys.current.startFromPrevious();
        } else if (k === 'n') {
          e.preventDefault();
          focusId('f-time');
        } else if (k === 'a') {
          e.preventDefault();
          const key = useObservationForm.getState().addCategory();
          if (key) queueMicrotask(() => focusId(`f-cat-${key}-partial`));
        } else if (k === 'x') {
          const holder = (document.activeElement as HTMLElement | null)?.closest<HTMLElement>('[data-category-key]');
          const key = holder?.dataset.categoryKey;
          if (key) {
            e.preventDefault();
            useObservationForm.getState().removeCategory(key);
            queueMicrotask(() => focusId('f-total'));
          }
        }
        return;
      }
      const form = formRef.current;
      if (!form) return;
      if ((e.key === 'PageDown' || e.key === 'PageUp') && !e.altKey && !e.ctrlKey) {
        if (jumpSection(form, document.activeElement, e.key === 'PageDown' ? 1 : -1)) e.preventDefault();
      } else if (e.key === 'Enter' && e.ctrlKey && form.contains(document.activeElement)) {
        e.preventDefault();
        void keys.current.save();
      }
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, []);

  const field = (name: DraftField) => (v: string) => setField(name, v as never);
  const plain = (name: DraftField, label: string, path: string, opts: { mode?: 'decimal' | 'numeric'; hint?: string } = {}) => {
    const id = `f-${name}`;
    const fs = findingsAt(findings, path);
    return (
      <Field id={id} label={label} hint={opts.hint} findings={fs}>
        <input
          id={id}
          type="text"
          inputMode={opts.mode ?? 'decimal'}
          autoComplete="off"
          value={draft[name] as string}
          onFocus={(e) => e.currentTarget.select()}
          onChange={(e) => field(name)(e.currentTarget.value)}
          {...describedBy(id, fs)}
        />
      </Field>
    );
  };

  const pick = <N extends 'traceStage' | 'remainingStage' | 'openWaterKind' | 'meltState'>(
    name: N,
    label: string,
    path: string,
    options: readonly { value: Exclude<ObservationDraft[N], ''>; label: string; code?: string }[],
  ) => (
    <Field id={`f-${name}`} label={label} findings={findingsAt(findings, path)}>
      <PickList id={`f-${name}`} value={draft[name]} onValue={(v) => setField(name, v as ObservationDraft[N])} options={options} aria-label={label} />
    </Field>
  );

  const timeFindings = findingsAt(findings, 'time');
  const editedObservation = editing ? observations.find((o) => o.id === editing.id) : undefined;

  return (
    <div className="log-form-layout">
      <form ref={formRef} className="observation-form" aria-labelledby="form-title" onSubmit={onSubmit} noValidate>
        <div className="form-head">
          <h3 id="form-title">{editing ? `Editing the ${editedObservation?.time.slice(11, 16) ?? ''} UTC observation (revision ${editing.expectedRevision})` : 'New observation'}</h3>
          <button type="button" id="f-start-previous" className="button" onClick={startFromPrevious} disabled={!previous || editing !== null} aria-keyshortcuts="Alt+P">
            Start from the previous observation <kbd>Alt+P</kbd>
          </button>
          {editing && (
            <button
              type="button"
              className="button"
              onClick={() => {
                const name = draftFormName(editing);
                void clearDraft(cruise.id, name)
                  .catch(() => undefined)
                  .then(() => resumeNewEntry(cruise.id, () => emptyDraft(onWatch, defaultSource)));
              }}
            >
              Cancel edit
            </button>
          )}
        </div>
        {confirmReplace && (
          <p className="form-notice" role="alert">
            The entry in progress would be replaced. Press <kbd>Alt+P</kbd> again (or the button) to start from the previous observation anyway.
          </p>
        )}
        {notice && (
          <p className="form-notice" role="status">
            {notice}
          </p>
        )}

        <fieldset className="form-section" data-section="when">
          <legend>When, where, who</legend>
          <Field id="f-time" label="Time, UTC" findings={timeFindings}>
            <div className="inline">
              <input
                id="f-time"
                type="text"
                autoComplete="off"
                placeholder={`${reading.observation.time.slice(0, 10)} ${reading.observation.time.slice(11, 16)} (now)`}
                value={draft.time}
                onFocus={(e) => e.currentTarget.select()}
                onChange={(e) => setField('time', e.currentTarget.value)}
                {...describedBy('f-time', timeFindings)}
              />
              <span className="muted zone-time" aria-label={`Time in ${cruise.displayTimeZone}`}>
                {zoneTime(new Date(reading.observation.time), cruise.displayTimeZone)} {cruise.displayTimeZone}
              </span>
              <button type="button" className="button small" tabIndex={-1} onClick={() => setField('time', '')}>
                Now
              </button>
            </div>
          </Field>
          <PositionField reading={reading.observation.position} livePosition={livePosition} note={positionNote} findings={findingsAt(findings, 'position')} />
          <Field id="f-observer" label="Observer" hint="type" findings={findingsAt(findings, 'observerId')}>
            <PickList id="f-observer" value={draft.observerId} onValue={(v) => setField('observerId', v)} options={observerOptions(cruise.observers)} allowEmpty={false} aria-label="Observer" />
          </Field>
        </fieldset>

        <fieldset className="form-section" data-section="total">
          <legend>Ice concentration</legend>
          <Field id="f-total" label="Total concentration Ct, tenths" hint="0-9, 1 0" findings={findingsAt(findings, 'totalConcentration')}>
            <TenthsInput id="f-total" value={draft.total} onValue={field('total')} {...describedBy('f-total', findingsAt(findings, 'totalConcentration'))} />
          </Field>
        </fieldset>

        <div
          className="categories"
          onBlur={(e) => {
            // Put the types thickest first once the observer leaves the ice types, not while
            // typing in them, so fields never move under the cursor.
            if (!e.currentTarget.contains(e.relatedTarget as Node | null)) applyOrder();
          }}
        >
          {draft.categories.map((c, i) => {
            const pathIndex = isBlankCategory(c) ? null : filled.indexOf(c);
            return <CategoryFieldset key={c.key} category={c} index={i} count={draft.categories.length} pathIndex={pathIndex} findings={findings} />;
          })}
          <div className="category-actions">
            <button type="button" className="button" tabIndex={-1} onClick={() => {
              const key = useObservationForm.getState().addCategory();
              if (key) queueMicrotask(() => focusId(`f-cat-${key}-partial`));
            }} disabled={draft.categories.length >= 3} aria-keyshortcuts="Alt+A">
              Add an ice type <kbd>Alt+A</kbd>
            </button>
            <FindingLines id="f-categories" findings={findings.filter((f) => f.path === 'categories')} />
          </div>
        </div>

        <DeformationFieldset categories={draft.categories} findings={findings} />
        <SnowFieldset categories={draft.categories} findings={findings} />
        <FindingLines id="f-groups" findings={findings.filter((f) => /^(deformation|snow)\.[a-z]$/.test(f.path))} />

        <fieldset className="form-section" data-section="surface">
          <legend>Trace, remaining ice, open water, ponds, bergs</legend>
          <div className="field-row">
            {pick('traceStage', 'Trace of thicker ice So', 'traceStage', STAGE_OPTIONS)}
            {pick('remainingStage', 'Remaining thinner ice Sd', 'remainingStage', STAGE_OPTIONS)}
          </div>
          <div className="field-row">
            {pick('openWaterKind', 'Open water', 'openWater.kind', OPEN_WATER_OPTIONS)}
            {plain('openWaterWidthM', 'Width, m', 'openWater.widthM')}
            {plain('openWaterOrientationDeg', 'Orientation, ° true', 'openWater.orientationDeg')}
          </div>
          <div className="field-row">
            <Field id="f-meltCover" label="Melt ponds, tenths" findings={findingsAt(findings, 'meltPonds.coverTenths')}>
              <TenthsInput id="f-meltCover" value={draft.meltCover} onValue={field('meltCover')} />
            </Field>
            {pick('meltState', 'Ponds are', 'meltPonds.state', MELT_STATE_OPTIONS)}
          </div>
          <div className="field-row">
            {plain('icebergs', 'Icebergs', 'icebergs.icebergs', { mode: 'numeric' })}
            {plain('bergyBits', 'Bergy bits', 'icebergs.bergyBits', { mode: 'numeric' })}
            {plain('growlers', 'Growlers', 'icebergs.growlers', { mode: 'numeric' })}
          </div>
        </fieldset>

        <fieldset className="form-section" data-section="weather">
          <legend>Weather</legend>
          <div className="field-row">
            {plain('airTempC', 'Air, °C', 'weather.airTempC')}
            {plain('waterTempC', 'Water, °C', 'weather.waterTempC')}
            {plain('salinityPsu', 'Salinity, PSU', 'weather.salinityPsu')}
            {plain('windSpeedKn', 'Wind, kn', 'weather.windSpeedKn')}
            {plain('windFromDeg', 'Wind from, ° true', 'weather.windFromDeg')}
            {plain('visibilityKm', 'Visibility, km', 'weather.visibilityKm')}
            {plain('cloudOktas', 'Cloud, oktas', 'weather.cloudOktas', { mode: 'numeric' })}
          </div>
        </fieldset>

        <fieldset className="form-section" data-section="notes">
          <legend>Notes and photos</legend>
          <Field id="f-notes" label="Notes" hint="Ctrl+Enter saves" findings={findingsAt(findings, 'notes')}>
            <textarea id="f-notes" rows={2} value={draft.notes} onChange={(e) => setField('notes', e.currentTarget.value)} />
          </Field>
          <PhotoField cruiseId={cruise.id} />
        </fieldset>

        <FindingsSummary findings={findings} pristine={!checked} />

        <div className="save-bar">
          <button type="submit" className="button primary save-button">
            {editing ? 'Save the edit' : 'Save the observation'} <kbd>Enter</kbd>
          </button>
          <SaveStatus status={status} />
        </div>
        {conflict && (
          <ConflictPanel
            conflict={conflict}
            observers={cruise.observers}
            onKeepMine={() => void store(conflict.mine, conflict.theirs.revision)}
            onTakeTheirs={() => {
              setConflict(null);
              load(cruise.id, observationToDraft(conflict.theirs, { asNext: false }), { id: conflict.theirs.id, expectedRevision: conflict.theirs.revision }, false);
              setStatus({ kind: 'idle' });
            }}
          />
        )}
        <ShortcutLegend />
      </form>
      <SidePanel cruise={cruise} observation={reading.observation} />
    </div>
  );
}

function SaveStatus({ status }: { status: Status }) {
  if (status.kind === 'idle') return <p className="save-status" role="status" />;
  if (status.kind === 'saved') return <p className="save-status ok" role="status">{status.text}</p>;
  if (status.kind === 'failed') return <p className="save-status error" role="alert">{status.text}</p>;
  return (
    <div className="save-status error" role="alert">
      <p>Not saved: {status.errors.length === 1 ? 'one value must be corrected' : `${status.errors.length} values must be corrected`}.</p>
      <ul>
        {status.errors.map((f, i) => (
          <li key={i}>{f.message}</li>
        ))}
      </ul>
    </div>
  );
}

export const SHORTCUTS: readonly [string, string][] = [
  ['Tab / Shift+Tab', 'next / previous field'],
  ['0-9', 'tenths (1 then 0 for 10); moves on'],
  ['type', 'narrow a list; Tab or Enter takes it'],
  ['Page Down / Up', 'next / previous section'],
  ['Enter', 'save'],
  ['Alt+P', 'start from the previous observation'],
  ['Alt+N', 'to the form (time field)'],
  ['Alt+A', 'add an ice type'],
  ['Alt+X', 'remove the ice type you are in'],
  ['Ctrl+Enter', 'save from the notes'],
];

function ShortcutLegend() {
  return (
    <dl className="shortcut-legend" aria-label="Keyboard shortcuts">
      {SHORTCUTS.map(([k, v]) => (
        <div key={k}>
          <dt>
            <kbd>{k}</kbd>
          </dt>
          <dd>{v}</dd>
        </div>
      ))}
    </dl>
  );
}

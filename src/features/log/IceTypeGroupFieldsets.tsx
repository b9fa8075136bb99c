// Deformation and snow: groups of their own, each a fieldset with one row per ice type of the
// form (a, b, c). The values belong to the ice type's draft row, so they move with it when the
// types are put thickest first; findings come from the paths `deformation.<letter>.<field>` and
// `snow.<letter>.<field>` of the observation's letter (its place among the filled ice types).
import type { Finding } from '../../domain/model';
import { useObservationForm, type CategoryDraft, type CategoryField } from '../../state/observationForm';
import { describedBy, Field, findingsAt } from './Field';
import { CATEGORY_LETTERS, filledCategories } from './formModel';
import { SNOW_COVER_OPTIONS, SNOW_WETNESS_OPTIONS } from './options';
import { PickList } from './PickList';
import { TenthsInput } from './TenthsInput';

interface Props {
  categories: readonly CategoryDraft[];
  /** All findings of the observation; each row shows those under its paths. */
  findings: readonly Finding[];
}

/** Control ids of the group fields, shared with the form's "go to the finding" lookup. */
export const groupControlId = (group: 'def' | 'snow', key: string, field: string): string => `f-${group}-${key}-${field}`;

interface RowContext {
  c: CategoryDraft;
  /** The form row's letter (its place in the form). */
  letter: string;
  /** Findings of this ice type's entry in the group (empty while the row is blank). */
  at: (field: string) => Finding[];
  set: <K extends CategoryField>(field: K) => (v: CategoryDraft[K]) => void;
}

function useRows(categories: readonly CategoryDraft[], findings: readonly Finding[], group: 'deformation' | 'snow'): RowContext[] {
  const setCategoryField = useObservationForm((s) => s.setCategoryField);
  const draft = useObservationForm((s) => s.draft);
  const filled = filledCategories(draft);
  return categories.map((c, i) => {
    const pathIndex = filled.indexOf(c);
    const pathLetter = pathIndex < 0 ? null : CATEGORY_LETTERS[pathIndex];
    return {
      c,
      letter: CATEGORY_LETTERS[i] ?? String(i + 1),
      at: (field: string) => (pathLetter ? findingsAt(findings, `${group}.${pathLetter}.${field}`) : []),
      set: <K extends CategoryField>(field: K) => (v: CategoryDraft[K]) => setCategoryField(c.key, field, v),
    };
  });
}

function NumberText({ id, label, value, onValue, findings }: { id: string; label: string; value: string; onValue: (v: string) => void; findings: Finding[] }) {
  return (
    <Field id={id} label={label} findings={findings}>
      <input
        id={id}
        type="text"
        inputMode="decimal"
        autoComplete="off"
        value={value}
        onFocus={(e) => e.currentTarget.select()}
        onChange={(e) => onValue(e.currentTarget.value)}
        {...describedBy(id, findings)}
      />
    </Field>
  );
}

export function DeformationFieldset({ categories, findings }: Props) {
  const rows = useRows(categories, findings, 'deformation');
  return (
    <fieldset className="form-section group-section" data-section="deformation">
      <legend>Deformation</legend>
      {rows.map(({ c, letter, at, set }) => {
        const id = (f: string) => groupControlId('def', c.key, f);
        return (
          <div className="field-row group-row" key={c.key} data-category-key={c.key}>
            <span className="group-row-name">Ice type {letter}</span>
            <Field id={id('ridged')} label={`Ridged (${letter}), tenths`} findings={at('ridgedTenths')}>
              <TenthsInput id={id('ridged')} value={c.ridged} onValue={set('ridged')} {...describedBy(id('ridged'), at('ridgedTenths'))} />
            </Field>
            <Field id={id('rafted')} label={`Rafted (${letter}), tenths`} findings={at('raftedTenths')}>
              <TenthsInput id={id('rafted')} value={c.rafted} onValue={set('rafted')} {...describedBy(id('rafted'), at('raftedTenths'))} />
            </Field>
            <NumberText id={id('sailHeightM')} label={`Sail height (${letter}), m`} value={c.sailHeightM} onValue={set('sailHeightM')} findings={at('sailHeightM')} />
          </div>
        );
      })}
    </fieldset>
  );
}

export function SnowFieldset({ categories, findings }: Props) {
  const rows = useRows(categories, findings, 'snow');
  return (
    <fieldset className="form-section group-section" data-section="snow">
      <legend>Snow</legend>
      {rows.map(({ c, letter, at, set }) => {
        const id = (f: string) => groupControlId('snow', c.key, f);
        return (
          <div className="field-row group-row" key={c.key} data-category-key={c.key}>
            <span className="group-row-name">Ice type {letter}</span>
            <Field id={id('cover')} label={`Snow cover (${letter})`} hint="type" findings={at('cover')}>
              <PickList id={id('cover')} value={c.snowCover} onValue={set('snowCover')} options={SNOW_COVER_OPTIONS} aria-label={`Snow cover (${letter})`} {...describedBy(id('cover'), at('cover'))} />
            </Field>
            <Field id={id('wetness')} label={`Wetness (${letter})`} hint="type" findings={at('wetness')}>
              <PickList id={id('wetness')} value={c.snowWetness} onValue={set('snowWetness')} options={SNOW_WETNESS_OPTIONS} aria-label={`Wetness (${letter})`} {...describedBy(id('wetness'), at('wetness'))} />
            </Field>
            <label className="check-field" htmlFor={id('crust')}>
              <input id={id('crust')} type="checkbox" checked={c.snowCrust} onChange={(e) => set('snowCrust')(e.currentTarget.checked)} />
              Crust ({letter})
            </label>
            <label className="check-field" htmlFor={id('drifts')}>
              <input id={id('drifts')} type="checkbox" checked={c.snowDrifts} onChange={(e) => set('snowDrifts')(e.currentTarget.checked)} />
              Drifts ({letter})
            </label>
            <NumberText id={id('depthCm')} label={`Snow depth (${letter}), cm`} value={c.snowDepthCm} onValue={set('snowDepthCm')} findings={at('depthCm')} />
          </div>
        );
      })}
    </fieldset>
  );
}

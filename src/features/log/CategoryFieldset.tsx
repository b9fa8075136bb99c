// One ice type of the observation (a column of the egg code), in the egg code's order
// (WMO-No. 259): concentration, stage of development, form (floe size), then thickness.
// Deformation and snow have fieldsets of their own (IceTypeGroupFieldsets.tsx).
import type { Finding } from '../../domain/model';
import { useObservationForm, type CategoryDraft, type CategoryField } from '../../state/observationForm';
import { describedBy, Field, findingsAt, FindingLines } from './Field';
import { CATEGORY_LETTERS } from './formModel';
import { FLOE_SIZE_OPTIONS, STAGE_OPTIONS } from './options';
import { PickList } from './PickList';
import { TenthsInput } from './TenthsInput';

interface Props {
  category: CategoryDraft;
  index: number;
  count: number;
  /** This category's index among the filled ones (the observation's), or null while blank. */
  pathIndex: number | null;
  /** All findings of the observation; this fieldset shows those under its path. */
  findings: readonly Finding[];
}

export function CategoryFieldset({ category: c, index, count, pathIndex, findings: all }: Props) {
  const setCategoryField = useObservationForm((s) => s.setCategoryField);
  const removeCategory = useObservationForm((s) => s.removeCategory);
  const letter = CATEGORY_LETTERS[index] ?? String(index + 1);
  const base = `categories.${pathIndex ?? 'none'}`;
  const findings = pathIndex === null ? [] : findingsAt(all, base);
  const id = (f: string) => `f-cat-${c.key}-${f}`;
  const set = <K extends CategoryField>(field: K) => (v: CategoryDraft[K]) => setCategoryField(c.key, field, v);
  const at = (f: string) => findingsAt(findings, `${base}.${f}`);
  const own = findings.filter((f) => f.path === base);

  const text = (field: 'thicknessCm', label: string, path: string, unit: string) => {
    const fs = at(path);
    return (
      <Field id={id(field)} label={`${label} (${letter}), ${unit}`} findings={fs}>
        <input
          id={id(field)}
          type="text"
          inputMode="decimal"
          autoComplete="off"
          value={c[field]}
          onFocus={(e) => e.currentTarget.select()}
          onChange={(e) => set(field)(e.currentTarget.value)}
          {...describedBy(id(field), fs)}
        />
      </Field>
    );
  };
  const tenths = (field: 'partial', label: string, path: string, hint?: string) => {
    const fs = at(path);
    return (
      <Field id={id(field)} label={label} hint={hint} findings={fs}>
        <TenthsInput id={id(field)} value={c[field]} onValue={set(field)} {...describedBy(id(field), fs)} />
      </Field>
    );
  };

  return (
    <fieldset className="category" data-section={`category-${letter}`} data-category-key={c.key}>
      <legend>
        Ice type {letter}
        {index === 0 && count > 1 ? ' (thickest)' : ''}
      </legend>
      <div className="category-main">
        {tenths('partial', `Concentration C${letter}, tenths`, 'partialConcentration', '0-9')}
        <Field id={id('stage')} label={`Stage S${letter}`} hint="type" findings={at('stage')}>
          <PickList id={id('stage')} value={c.stage} onValue={set('stage')} options={STAGE_OPTIONS} aria-label={`Stage S${letter}`} {...describedBy(id('stage'), at('stage'))} />
        </Field>
        <Field id={id('floeSize')} label={`Floe size F${letter}`} hint="type" findings={at('floeSize')}>
          <PickList id={id('floeSize')} value={c.floeSize} onValue={set('floeSize')} options={FLOE_SIZE_OPTIONS} aria-label={`Floe size F${letter}`} {...describedBy(id('floeSize'), at('floeSize'))} />
        </Field>
        {text('thicknessCm', 'Thickness', 'thicknessCm', 'cm')}
      </div>
      <FindingLines id={`f-cat-${c.key}`} findings={own} />
      <button type="button" className="button small" tabIndex={-1} onClick={() => removeCategory(c.key)} aria-label={`Remove ice type ${letter}`}>
        Remove ice type {letter}
      </button>
    </fieldset>
  );
}

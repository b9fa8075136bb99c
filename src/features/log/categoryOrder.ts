// Keeps the form's ice types thickest first, as the egg code needs them, using the domain's
// ordering. A reorder is only made when every filled type has a stage, so a half-entered row
// does not jump about, and the observer is told what moved.
import type { IceCategory } from '../../domain/model';
import { stageLabel } from '../../domain/nomenclature';
import { sortCategoriesThickestFirst } from '../../domain/ordering';
import type { ObservationDraft } from '../../state/observationForm';
import { CATEGORY_LETTERS, isBlankCategory } from './formModel';

export interface Reorder {
  keys: string[];
  notice: string;
}

function thickness(text: string): number | undefined {
  const n = Number(text.trim().replace(',', '.'));
  return text.trim() !== '' && Number.isFinite(n) ? n : undefined;
}

/** The thickest-first order of the draft's ice types, or null when it is already so (or not decidable). */
export function thickestFirst(draft: ObservationDraft): Reorder | null {
  const filled = draft.categories.filter((c) => !isBlankCategory(c));
  if (filled.length < 2 || filled.some((c) => c.stage === '')) return null;
  const byCat = new Map<IceCategory, string>();
  const cats = filled.map((c) => {
    const cat: IceCategory = { partialConcentration: 0, stage: c.stage === '' ? 'undetermined' : c.stage };
    const t = thickness(c.thicknessCm);
    if (t !== undefined) cat.thicknessCm = t;
    byCat.set(cat, c.key);
    return cat;
  });
  const sorted = sortCategoriesThickestFirst(cats);
  if (!sorted.reordered) return null;
  const keys = sorted.categories.map((c) => byCat.get(c) ?? '');
  const blanks = draft.categories.filter((c) => isBlankCategory(c)).map((c) => c.key);
  const moved = sorted.categories
    .map((c, i) => `${stageLabel(c.stage).toLowerCase()} is now ${CATEGORY_LETTERS[i] ?? i + 1}`)
    .join(', ');
  return { keys: [...keys, ...blanks], notice: `Ice types put thickest first, as the egg code reads them: ${moved}.` };
}

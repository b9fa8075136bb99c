// Keyboard movement inside the observation form: the next field after a decisive keystroke
// (a tenths digit), and section jumps (Page Down / Page Up) over fields that did not change.

const FOCUSABLE = 'input:not([type=hidden]):not([disabled]), select:not([disabled]), textarea:not([disabled]), button:not([disabled])';

function focusables(root: HTMLElement): HTMLElement[] {
  return Array.from(root.querySelectorAll<HTMLElement>(FOCUSABLE)).filter((el) => el.tabIndex >= 0);
}

/** Moves focus to the field after `from` inside `root`, in tab order (which is DOM order here). */
export function focusNext(from: HTMLElement, root: HTMLElement | null = from.closest('form')): void {
  if (!root) return;
  const list = focusables(root);
  const i = list.indexOf(from);
  const next = list[i + 1];
  if (next) next.focus();
}

/** Moves focus to the first field of the next (or previous) `[data-section]` of `root`. */
export function jumpSection(root: HTMLElement, from: Element | null, direction: 1 | -1): boolean {
  const sections = Array.from(root.querySelectorAll<HTMLElement>('[data-section]')).filter((s) => focusables(s).length > 0);
  if (sections.length === 0) return false;
  // The innermost section holding the focus decides where we are.
  let current = -1;
  sections.forEach((s, i) => {
    if (from && s.contains(from)) current = i;
  });
  const target = sections[current === -1 ? (direction === 1 ? 0 : sections.length - 1) : current + direction];
  if (!target) return false;
  const first = focusables(target).find((el) => !el.closest('[data-section]') || el.closest('[data-section]') === target);
  (first ?? focusables(target)[0])?.focus();
  return true;
}

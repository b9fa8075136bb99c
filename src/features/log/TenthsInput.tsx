// A concentration in tenths, typed with the number keys. A digit that can only mean one value
// (0, 2-9, or "10") sets it and moves on to the next field, so a whole row of concentrations is
// one keystroke each; "1" waits for a possible "0" (press Tab to keep 1/10).
import type { InputHTMLAttributes } from 'react';
import { focusNext } from './focusNav';

interface TenthsInputProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'value' | 'onChange'> {
  value: string;
  onValue: (value: string) => void;
  /** Move to the next field after a complete value (default true). */
  autoAdvance?: boolean;
}

/** The value a keystroke produces in a tenths field holding `current` (all selected or not). */
export function tenthsAfterKey(current: string, key: string, selectionAll: boolean): { value: string; complete: boolean } | null {
  if (!/^\d$/.test(key)) return null;
  // Only a lone "1" can grow: "10". Any other key starts the value afresh.
  if (!selectionAll && current === '1' && key === '0') return { value: '10', complete: true };
  return { value: key, complete: key !== '1' };
}

export function TenthsInput({ value, onValue, autoAdvance = true, ...rest }: TenthsInputProps) {
  return (
    <input
      {...rest}
      className={`tenths-input ${rest.className ?? ''}`}
      type="text"
      inputMode="numeric"
      autoComplete="off"
      maxLength={2}
      value={value}
      onFocus={(e) => e.currentTarget.select()}
      onKeyDown={(e) => {
        if (e.altKey || e.ctrlKey || e.metaKey) return;
        const el = e.currentTarget;
        const all = el.selectionStart === 0 && el.selectionEnd === el.value.length && el.value.length > 0;
        const next = tenthsAfterKey(el.value, e.key, all);
        if (!next) return;
        e.preventDefault();
        onValue(next.value);
        if (next.complete && autoAdvance) {
          // After React has rendered the new value, so the next field sees the change.
          queueMicrotask(() => focusNext(el));
        }
      }}
      onChange={(e) => {
        // Paste, touch keyboards and autofill arrive here rather than as key presses.
        onValue(e.currentTarget.value.replace(/[^\d]/g, '').slice(0, 2));
      }}
    />
  );
}

// An on-screen keypad for the form's number fields, for a bridge tablet or a touch screen used
// with gloves: it opens when a number field is touched (or always, once switched on), and its
// keys act on the focused field as typing would, so a tenths field still moves on after one
// digit. The keys never take the focus from the field.
import { useEffect, useRef, useState } from 'react';
import { focusNext } from './focusNav';

const KEYS = ['7', '8', '9', '4', '5', '6', '1', '2', '3', '\u2212', '0', '.'] as const;

function isNumberField(el: EventTarget | null): el is HTMLInputElement {
  return el instanceof HTMLInputElement && el.closest('form.observation-form') !== null && (el.inputMode === 'numeric' || el.inputMode === 'decimal');
}

/** Sets an input's value the way the browser does when typing, so React's onChange sees it. */
function setTyped(el: HTMLInputElement, value: string, caret: number): void {
  Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')?.set?.call(el, value);
  el.dispatchEvent(new Event('input', { bubbles: true }));
  el.setSelectionRange(caret, caret);
}

/** One key on the focused field: a tenths field takes it as a key press (its own rules). */
export function pressKey(el: HTMLInputElement, key: string): void {
  const text = key === '\u2212' ? '-' : key;
  if (/^\d$/.test(text)) {
    const handled = !el.dispatchEvent(new KeyboardEvent('keydown', { key: text, bubbles: true, cancelable: true }));
    if (handled) return;
  }
  const start = el.selectionStart ?? el.value.length;
  const end = el.selectionEnd ?? el.value.length;
  if (key === 'back') {
    const from = start === end ? Math.max(0, start - 1) : start;
    setTyped(el, el.value.slice(0, from) + el.value.slice(end), from);
    return;
  }
  setTyped(el, el.value.slice(0, start) + text + el.value.slice(end), start + text.length);
}

export function NumberKeypad() {
  const [target, setTarget] = useState<HTMLInputElement | null>(null);
  const [always, setAlways] = useState(false);
  const alwaysRef = useRef(always);
  const pointer = useRef('mouse');
  const pad = useRef<HTMLDivElement>(null);

  useEffect(() => {
    const onPointer = (e: PointerEvent) => {
      pointer.current = e.pointerType;
      // A touch on the field that already has the focus fires no focusin: open the keypad here.
      if ((e.pointerType === 'touch' || e.pointerType === 'pen') && isNumberField(e.target) && e.target === document.activeElement) setTarget(e.target);
    };
    const onFocus = (e: FocusEvent) => {
      if (isNumberField(e.target)) {
        if (alwaysRef.current || pointer.current === 'touch' || pointer.current === 'pen') setTarget(e.target);
        else setTarget(null);
      } else if (!(e.target instanceof Node && pad.current?.contains(e.target))) {
        setTarget(null);
      }
    };
    document.addEventListener('pointerdown', onPointer, true);
    document.addEventListener('focusin', onFocus);
    return () => {
      document.removeEventListener('pointerdown', onPointer, true);
      document.removeEventListener('focusin', onFocus);
    };
  }, []);

  // The keys keep the focus in the field: no focus change on press, the action on click.
  const key = (label: string, name: string, act: (el: HTMLInputElement) => void, className = '') => (
    <button
      type="button"
      tabIndex={-1}
      className={`keypad-key ${className}`}
      aria-label={name}
      onPointerDown={(e) => e.preventDefault()}
      onMouseDown={(e) => e.preventDefault()}
      onClick={() => {
        if (target?.isConnected) act(target);
      }}
    >
      {label}
    </button>
  );

  return (
    <>
      <button
        type="button"
        className="button small keypad-toggle"
        aria-pressed={always}
        onClick={() => {
          alwaysRef.current = !always;
          setAlways(!always);
        }}
      >
        On-screen keypad {always ? 'on' : 'for touch'}
      </button>
      {target && (
        <div className="keypad" role="group" aria-label="Number keypad" ref={pad} data-testid="keypad">
          {KEYS.map((k) => key(k, k === '\u2212' ? 'minus' : k === '.' ? 'decimal point' : k, (el) => pressKey(el, k)))}
          {key('\u232b', 'delete', (el) => pressKey(el, 'back'))}
          {key('Next', 'next field', (el) => focusNext(el), 'wide')}
          {key('Done', 'close the keypad', (el) => {
            el.blur();
            setTarget(null);
          }, 'wide')}
        </div>
      )}
    </>
  );
}

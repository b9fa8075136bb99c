// Type-to-pick: a combobox whose list narrows as the observer types a label, a word of it or
// its code (e.g. "thick", "grey w" or the egg-code symbol "4."). Tab or Enter takes the
// highlighted entry; Enter with the list closed saves the form as anywhere else.
import { useId, useState, type InputHTMLAttributes } from 'react';

export interface PickOption<V extends string = string> {
  value: V;
  label: string;
  /** A short code that picks the option when typed exactly (e.g. an egg-code symbol). */
  code?: string;
}

/** Options matching `query`, best first: exact code, label prefix, word prefix, anywhere. */
export function matchOptions<V extends string>(options: readonly PickOption<V>[], query: string): PickOption<V>[] {
  const q = query.trim().toLowerCase();
  if (q === '') return [...options];
  const scored: { o: PickOption<V>; score: number; i: number }[] = [];
  options.forEach((o, i) => {
    const label = o.label.toLowerCase();
    const words = label.split(/[\s\-(),/]+/).filter(Boolean);
    const qWords = q.split(/[\s-]+/).filter(Boolean);
    let score = -1;
    if (o.code !== undefined && o.code.toLowerCase() === q) score = 0;
    else if (label.startsWith(q)) score = 1;
    // Every typed word begins some word of the label, in order ("grey w" -> "grey-white ice").
    else if (wordsInOrder(words, qWords)) score = 2;
    else if (label.includes(q)) score = 3;
    if (score >= 0) scored.push({ o, score, i });
  });
  return scored.sort((a, b) => a.score - b.score || a.i - b.i).map((s) => s.o);
}

function wordsInOrder(words: string[], qWords: string[]): boolean {
  let w = 0;
  for (const q of qWords) {
    while (w < words.length && !words[w]!.startsWith(q)) w += 1;
    if (w === words.length) return false;
    w += 1;
  }
  return qWords.length > 0;
}

interface PickListProps<V extends string> extends Omit<InputHTMLAttributes<HTMLInputElement>, 'value' | 'onChange'> {
  value: V | '';
  onValue: (value: V | '') => void;
  options: readonly PickOption<V>[];
  /** Whether the field may be left empty (typing nothing and leaving clears it). */
  allowEmpty?: boolean;
  emptyLabel?: string;
}

export function PickList<V extends string>({
  value, onValue, options, allowEmpty = true, emptyLabel = '', id, ...rest
}: PickListProps<V>) {
  const autoId = useId();
  const inputId = id ?? autoId;
  const listId = `${inputId}-list`;
  const [query, setQuery] = useState<string | null>(null);
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(0);

  const selected = options.find((o) => o.value === value);
  const shown = query ?? (selected ? selected.label : emptyLabel);
  const matches = open ? matchOptions(options, query ?? '') : [];
  const highlighted = matches[Math.min(active, matches.length - 1)];

  const close = () => {
    setOpen(false);
    setQuery(null);
    setActive(0);
  };
  const commit = () => {
    if (query !== null && query.trim() === '' && allowEmpty) onValue('');
    else if (highlighted) onValue(highlighted.value);
    close();
  };

  return (
    <div className="picklist">
      <input
        {...rest}
        id={inputId}
        type="text"
        role="combobox"
        autoComplete="off"
        spellCheck={false}
        aria-autocomplete="list"
        aria-expanded={open}
        aria-controls={listId}
        aria-activedescendant={open && highlighted ? `${listId}-${highlighted.value}` : undefined}
        value={shown}
        onFocus={(e) => e.currentTarget.select()}
        // A click (or tap) opens the whole list with the text selected, so typing starts afresh.
        onClick={(e) => {
          e.currentTarget.select();
          setOpen(true);
        }}
        onBlur={() => {
          if (open) commit();
        }}
        onChange={(e) => {
          setQuery(e.currentTarget.value);
          setOpen(true);
          setActive(0);
        }}
        onKeyDown={(e) => {
          if (e.altKey || e.ctrlKey || e.metaKey) {
            if (e.altKey && e.key === 'ArrowDown') {
              e.preventDefault();
              setOpen(true);
            }
            return;
          }
          if (e.key === 'ArrowDown' || e.key === 'ArrowUp') {
            e.preventDefault();
            if (!open) {
              setOpen(true);
              const at = options.findIndex((o) => o.value === value);
              setActive(at < 0 ? 0 : at);
              return;
            }
            const n = matches.length;
            if (n > 0) setActive((a) => (Math.min(a, n - 1) + (e.key === 'ArrowDown' ? 1 : n - 1)) % n);
          } else if (e.key === 'Enter') {
            if (open) {
              e.preventDefault();
              commit();
            }
          } else if (e.key === 'Tab') {
            if (open) commit();
          } else if (e.key === 'Escape') {
            if (open) {
              e.preventDefault();
              e.stopPropagation();
              close();
            }
          }
        }}
      />
      {open && (
        <ul className="picklist-options" role="listbox" id={listId} aria-label={`${rest['aria-label'] ?? 'Choices'}`}>
          {matches.length === 0 && <li className="picklist-none">No match for “{query}”</li>}
          {matches.slice(0, 12).map((o) => (
            <li
              key={o.value}
              id={`${listId}-${o.value}`}
              role="option"
              aria-selected={o === highlighted}
              className={o === highlighted ? 'active' : undefined}
              onMouseDown={(e) => {
                e.preventDefault();
                onValue(o.value);
                close();
              }}
            >
              {o.label}
              {o.code !== undefined && <span className="picklist-code">{o.code}</span>}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

// One labelled field with its findings underneath, tied to the control for screen readers.
import type { ReactNode } from 'react';
import type { Finding } from '../../domain/model';

/** Findings that belong to the field at `path` (the field itself or anything below it). */
export function findingsAt(findings: readonly Finding[], path: string): Finding[] {
  return findings.filter((f) => f.path === path || f.path.startsWith(`${path}.`));
}

/** Props a control needs so assistive technology reads its findings and error state. */
export function describedBy(id: string, findings: readonly Finding[]) {
  return {
    'aria-describedby': findings.length > 0 ? `${id}-findings` : undefined,
    'aria-invalid': findings.some((f) => f.severity === 'error') ? (true as const) : undefined,
  };
}

const SEVERITY_WORD = { error: 'Error', warning: 'Warning', info: 'Note' } as const;

export function FindingLines({ id, findings }: { id: string; findings: readonly Finding[] }) {
  if (findings.length === 0) return null;
  return (
    <ul className="field-findings" id={`${id}-findings`}>
      {findings.map((f, i) => (
        <li key={`${f.code}-${f.path}-${i}`} className={`finding finding-${f.severity}`} data-severity={f.severity}>
          <span className="finding-severity">{SEVERITY_WORD[f.severity]}:</span> {f.message}
        </li>
      ))}
    </ul>
  );
}

interface FieldProps {
  id: string;
  label: ReactNode;
  /** Keyboard hint shown beside the label, e.g. "0-9". */
  hint?: string;
  findings: readonly Finding[];
  className?: string;
  children: ReactNode;
}

export function Field({ id, label, hint, findings, className, children }: FieldProps) {
  const worst = findings.some((f) => f.severity === 'error') ? 'error' : findings.some((f) => f.severity === 'warning') ? 'warning' : '';
  return (
    <div className={`field ${className ?? ''} ${worst ? `field-has-${worst}` : ''}`}>
      <span className="field-label">
        <label htmlFor={id}>{label}</label>
        {hint && (
          <kbd className="field-hint" aria-hidden="true">
            {hint}
          </kbd>
        )}
      </span>
      {children}
      <FindingLines id={id} findings={findings} />
    </div>
  );
}

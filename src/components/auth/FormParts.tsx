/** Small pieces the auth islands share: a labelled field with its error, and a status line. */
import type { ReactNode } from 'react';

interface FieldProps {
  id: string;
  label: string;
  type?: string;
  value: string;
  onChange(value: string): void;
  error?: string | null;
  hint?: string;
  autoComplete?: string;
  autoFocus?: boolean;
  /** Read-only until the island has hydrated, so nothing typed before then is lost. */
  readOnly?: boolean;
}

export function Field(props: FieldProps): ReactNode {
  const errorId = `${props.id}-error`;
  const hintId = `${props.id}-hint`;
  const describedBy = [props.error ? errorId : null, props.hint ? hintId : null].filter(Boolean).join(' ') || undefined;
  return (
    <div className="field">
      <label htmlFor={props.id}>{props.label}</label>
      <input
        id={props.id}
        name={props.id}
        type={props.type ?? 'text'}
        value={props.value}
        onChange={(e) => props.onChange(e.target.value)}
        autoComplete={props.autoComplete}
        autoFocus={props.autoFocus}
        readOnly={props.readOnly}
        aria-invalid={props.error ? true : undefined}
        aria-describedby={describedBy}
      />
      {props.hint && (
        <span id={hintId} className="text-ink-faint text-xs">
          {props.hint}
        </span>
      )}
      {props.error && (
        <span id={errorId} className="field-error" data-testid={`${props.id}-error`}>
          <span aria-hidden="true">✕ </span>
          {props.error}
        </span>
      )}
    </div>
  );
}

export type Tone = 'ok' | 'bad' | 'busy';
const ICON: Record<Tone, string> = { ok: '✓', bad: '✕', busy: '…' };
const CLASS: Record<Tone, string> = {
  ok: 'border-ok text-ok bg-ok-wash',
  bad: 'border-bad text-bad bg-bad-wash',
  busy: 'border-rule text-ink-soft',
};

export function StatusLine({ tone, children }: { tone: Tone; children: ReactNode }): ReactNode {
  return (
    <p role={tone === 'bad' ? 'alert' : 'status'} className={`border rounded px-3 py-2 text-sm ${CLASS[tone]}`} data-testid="form-status">
      <span aria-hidden="true">{ICON[tone]} </span>
      {children}
    </p>
  );
}

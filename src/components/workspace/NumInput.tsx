import { sig } from '../../lib/units.ts';
import { useEffect, useId, useState } from 'react';

interface Props {
  label: string;
  value: number | null;
  onValue: (value: number) => void;
  unit?: string;
  /** Display scale: shown = value × scale (e.g. 1000 to show mA for a value in A). */
  scale?: number;
  error?: string;
  hint?: string;
  testId?: string;
  /** When given, an empty field is allowed and reported by this call (e.g. "no limit" → null). */
  onEmpty?: () => void;
}

const show = (v: number | null, scale: number): string => (v == null ? '' : sig(v * scale, 6));

/** A numeric field that keeps what the person types and reports the number once it parses. */
export default function NumInput({ label, value, onValue, unit, scale = 1, error, hint, testId, onEmpty }: Props) {
  const id = useId();
  const [text, setText] = useState(show(value, scale));
  const [bad, setBad] = useState(false);
  useEffect(() => {
    const parsed = Number(text.replace(',', '.'));
    if (value == null || !Number.isFinite(parsed) || Math.abs(parsed / scale - value) > Math.abs(value) * 1e-9) setText(show(value, scale));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [value, scale]);
  const message = bad ? 'Enter a number.' : error;
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      <div className="flex items-center gap-1">
        <input
          id={id}
          inputMode="decimal"
          value={text}
          data-testid={testId}
          className="w-full min-w-0"
          aria-invalid={message ? true : undefined}
          aria-describedby={message ? `${id}-e` : undefined}
          onChange={(e) => {
            setText(e.target.value);
            if (onEmpty && e.target.value.trim() === '') {
              setBad(false);
              onEmpty();
              return;
            }
            const n = Number(e.target.value.replace(',', '.'));
            const ok = e.target.value.trim() !== '' && Number.isFinite(n);
            setBad(!ok);
            if (ok) onValue(n / scale);
          }}
        />
        {unit ? <span className="text-ink-soft text-sm min-w-8">{unit}</span> : null}
      </div>
      {hint && !message ? <span className="text-xs text-ink-faint">{hint}</span> : null}
      {message ? (
        <span id={`${id}-e`} className="field-error" role="alert">
          ⚠ {message}
        </span>
      ) : null}
    </div>
  );
}

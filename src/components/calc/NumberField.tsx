import { createContext, useContext } from 'react';

/**
 * The id prefix of the form a field sits in. Ids come from prefix + name rather than useId(), whose values
 * differ between the server render and the hydration of separate islands on one page.
 */
export const FieldPrefix = createContext('field');

interface Props {
  label: string;
  value: string;
  onChange: (value: string) => void;
  error?: string;
  unit?: string;
  units?: readonly string[];
  onUnitChange?: (unit: string) => void;
  hint?: string;
  name: string;
}

/** A labelled numeric input with an optional unit picker and a field-level error. */
export default function NumberField({ label, value, onChange, error, unit, units, onUnitChange, hint, name }: Props) {
  const id = `${useContext(FieldPrefix)}-${name}`;
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      <div className="flex gap-1">
        <input
          id={id}
          name={name}
          inputMode="decimal"
          value={value}
          onChange={(e) => onChange(e.target.value)}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id}-err` : undefined}
          className="w-full min-w-0"
        />
        {units && onUnitChange ? (
          <select aria-label={`${label} unit`} value={unit} onChange={(e) => onUnitChange(e.target.value)}>
            {units.map((u) => (
              <option key={u} value={u}>
                {u}
              </option>
            ))}
          </select>
        ) : unit ? (
          <span className="self-center text-ink-soft text-sm w-10">{unit}</span>
        ) : null}
      </div>
      {hint && !error ? <span className="text-xs text-ink-faint">{hint}</span> : null}
      {error ? (
        <span id={`${id}-err`} className="field-error" role="alert">
          ⚠ {error}
        </span>
      ) : null}
    </div>
  );
}

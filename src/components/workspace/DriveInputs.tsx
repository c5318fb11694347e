import { useId } from 'react';
import type { DesignInput, StallProtection } from '../../lib/domain/design.ts';
import NumInput from './NumInput.tsx';

/** A separate driver rail's default when the designer first picks one: a common gate-driver rail [practice]. */
const SEPARATE_RAIL_DEFAULT_V = 12;

/** Where a gate driver takes its supply from: the motor supply, or a separate rail with its value. */
export function DriverSupplyInput({
  input,
  set,
  error,
}: {
  input: DesignInput;
  set: (patch: Partial<DesignInput>) => void;
  error?: string;
}) {
  const separate = input.driverSupplyV != null;
  return (
    <>
      <label className="field">
        Driver supply
        <select
          value={separate ? 'separate' : 'motor'}
          data-testid="driver-supply-kind"
          onChange={(ev) =>
            set({ driverSupplyV: ev.target.value === 'separate' ? (input.driverSupplyV ?? SEPARATE_RAIL_DEFAULT_V) : null })
          }
        >
          <option value="motor">the motor supply</option>
          <option value="separate">a separate rail</option>
        </select>
        <span className="text-xs text-ink-faint">feeds a gate driver when one is used</span>
      </label>
      {separate ? (
        <NumInput
          label="Driver rail"
          unit="V"
          value={input.driverSupplyV}
          onValue={(v) => set({ driverSupplyV: v })}
          error={error}
          hint="judged at ±5 %"
          testId="driver-rail"
        />
      ) : null}
    </>
  );
}

const STALL_HINT: Readonly<Record<StallProtection['kind'], string>> = {
  none: 'Worst case: a jammed shaft holds the switch on at full stall current, judged as a steady state.',
  'current-limit': 'A limiter holds a jam at this current; switch and diode are judged at it as a steady state.',
  'cut-off': 'The drive is cut after this time; judged with the switch’s single-pulse Zth when it has one, else as a steady state.',
};

/** What limits a jammed motor: nothing (the default), a current limit, or a timed cut-off. */
export function StallProtectionInput({
  value,
  onChange,
  errorOf,
}: {
  value: StallProtection;
  onChange: (p: StallProtection) => void;
  errorOf: (path: string) => string | undefined;
}) {
  return (
    <>
      <label className="field">
        Stall protection
        <select
          value={value.kind}
          data-testid="stall-protection"
          onChange={(ev) => {
            const k = ev.target.value;
            onChange(
              k === 'current-limit'
                ? { kind: 'current-limit', limitA: 2 }
                : k === 'cut-off'
                  ? { kind: 'cut-off', afterS: 1 }
                  : { kind: 'none' },
            );
          }}
        >
          <option value="none">none (worst case)</option>
          <option value="current-limit">current limit</option>
          <option value="cut-off">cut-off after a time</option>
        </select>
        <span className="text-xs text-ink-faint" data-testid="stall-protection-hint">
          {STALL_HINT[value.kind]}
        </span>
      </label>
      {value.kind === 'current-limit' ? (
        <NumInput
          label="Current limit"
          unit="A"
          value={value.limitA}
          onValue={(v) => onChange({ kind: 'current-limit', limitA: v })}
          error={errorOf('stallProtection.limitA')}
          testId="stall-limit"
        />
      ) : null}
      {value.kind === 'cut-off' ? (
        <NumInput
          label="Cut off after"
          unit="s"
          value={value.afterS}
          onValue={(v) => onChange({ kind: 'cut-off', afterS: v })}
          error={errorOf('stallProtection.afterS')}
          testId="stall-cutoff"
        />
      ) : null}
    </>
  );
}

/** The designer's record that the motor may run at reset on purpose, with the reason the report prints. */
export function ResetStartIntentInput({
  value,
  onChange,
  error,
}: {
  value: DesignInput['resetStartIntent'];
  onChange: (v: DesignInput['resetStartIntent']) => void;
  error?: string;
}) {
  const id = useId();
  return (
    <div className="col-span-full grid gap-1 text-sm">
      <label className="flex items-center gap-2">
        <input
          type="checkbox"
          checked={value != null}
          data-testid="reset-start-intent"
          onChange={(ev) => onChange(ev.target.checked ? { reason: '' } : null)}
        />
        The motor may run at reset, on purpose
      </label>
      <p className="text-xs p-2 rounded border border-warn bg-warn-wash text-warn" role="note">
        <strong>⚠ Unexpected start-up.</strong> A motor that runs at power-on or reset moves before the firmware is in control. Tick this
        only when that is the intent; guard the moving parts and tell whoever handles the machine.
      </p>
      {value != null ? (
        <div className="field">
          <label htmlFor={id}>Why the motor may run at reset</label>
          <textarea
            id={id}
            rows={2}
            value={value.reason}
            data-testid="reset-start-reason"
            maxLength={500}
            className="border border-rule rounded px-2 py-1 bg-white text-ink"
            aria-invalid={error ? true : undefined}
            aria-describedby={error ? `${id}-e` : undefined}
            onChange={(ev) => onChange({ reason: ev.target.value })}
          />
          {error ? (
            <span id={`${id}-e`} className="field-error" role="alert">
              ⚠ {error}
            </span>
          ) : (
            <span className="text-xs text-ink-faint">at least 10 characters; the report prints it</span>
          )}
        </div>
      ) : null}
    </div>
  );
}

import { useEffect, useState } from 'react';
import type { DesignInput, DesignMotor, MotorOption } from '../../lib/domain/design.ts';
import { LOGIC_PRESETS, motorOptionOf } from '../../lib/domain/design.ts';
import type { Part } from '../../lib/domain/parts.ts';
import NumInput from './NumInput.tsx';
import { DriverSupplyInput, ResetStartIntentInput, StallProtectionInput } from './DriveInputs.tsx';
import { SharedLogicFields, SupplyPresetField, SupplySourceFields, useSupplyCells } from './SupplyInputs.tsx';

export type { MotorOption };
interface Props {
  input: DesignInput;
  motors: MotorOption[];
  errors: Record<string, string>;
  onChange: (next: DesignInput) => void;
  readOnly: boolean;
}

const MANUAL_DEFAULT: DesignMotor = {
  source: 'manual',
  label: 'Motor entered by hand',
  params: {
    ratedVoltageV: 6,
    voltageMinV: null,
    voltageMaxV: null,
    noLoadSpeedRpm: 9000,
    noLoadCurrentA: 0.15,
    stallTorqueNm: 0.011,
    stallCurrentA: 2,
    terminalResistanceOhm: null,
    inductanceH: null,
    rotorInertiaKgM2: null,
  },
};

/**
 * The catalogue motors on offer: the page sends a few; typing searches the whole catalogue (the same
 * text search as Find parts), and the motor in use always stays on the list.
 */
function useMotorSearch(initial: MotorOption[], currentId: number | null) {
  const [text, setText] = useState('');
  const [found, setFound] = useState<MotorOption[]>(initial);
  const [current, setCurrent] = useState<MotorOption | null>(initial.find((o) => o.id === currentId) ?? null);
  useEffect(() => {
    if (currentId != null) setCurrent((c) => (c?.id === currentId ? c : (found.find((o) => o.id === currentId) ?? c)));
  }, [currentId, found]);
  useEffect(() => {
    if (!text.trim()) {
      setFound(initial);
      return;
    }
    const ctrl = new AbortController();
    const timer = setTimeout(async () => {
      const qs = new URLSearchParams({ category: 'motor', q: text.trim(), pageSize: '20', reviewStatus: 'approved,pending' });
      try {
        const res = await fetch(`/api/parts?${qs}`, { signal: ctrl.signal });
        if (res.ok) setFound(((await res.json()) as { items: Part[] }).items.map(motorOptionOf));
      } catch {
        /* superseded by newer typing */
      }
    }, 250);
    return () => {
      clearTimeout(timer);
      ctrl.abort();
    };
  }, [text, initial]);
  const options = current && !found.some((o) => o.id === current.id) ? [current, ...found] : found;
  return { text, setText, options };
}

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <fieldset className="card p-3">
      <legend className="px-1 text-sm font-semibold">{title}</legend>
      <div className="grid gap-2 grid-cols-2 md:grid-cols-4">{children}</div>
    </fieldset>
  );
}

/** Everything the designer enters, in reading order: motor, supply and logic, drive, environment, margins. */
export default function InputsPanel({ input, motors, errors, onChange, readOnly }: Props) {
  const set = (patch: Partial<DesignInput>) => onChange({ ...input, ...patch });
  const e = (path: string) => errors[path];
  const m = input.motor;
  const [cells, setCells] = useSupplyCells(input.supply.preset);
  const motorSearch = useMotorSearch(motors, m.source === 'catalogue' ? m.partId : null);
  return (
    <fieldset disabled={readOnly} className="grid gap-3 lg:grid-cols-2" data-testid="design-inputs">
      <Section title="Motor">
        <label className="field col-span-2">
          Find a motor
          <input
            type="search"
            value={motorSearch.text}
            data-testid="motor-search"
            placeholder="Part number, maker or words"
            onChange={(ev) => motorSearch.setText(ev.target.value)}
          />
        </label>
        <label className="field col-span-2">
          Motor
          <select
            value={m.source === 'catalogue' ? String(m.partId) : 'manual'}
            data-testid="motor-select"
            onChange={(ev) =>
              set({ motor: ev.target.value === 'manual' ? MANUAL_DEFAULT : { source: 'catalogue', partId: Number(ev.target.value) } })
            }
          >
            {motorSearch.options.map((o) => (
              <option key={o.id} value={o.id}>
                {o.label}
              </option>
            ))}
            <option value="manual">Enter datasheet points by hand…</option>
          </select>
        </label>
        {m.source === 'manual' && (
          <>
            <label className="field col-span-2">
              Label
              <input value={m.label} onChange={(ev) => set({ motor: { ...m, label: ev.target.value } })} />
            </label>
            <NumInput
              label="Rated voltage"
              unit="V"
              value={m.params.ratedVoltageV}
              onValue={(v) => set({ motor: { ...m, params: { ...m.params, ratedVoltageV: v } } })}
              error={e('motor.params.ratedVoltageV')}
            />
            <NumInput
              label="No-load speed"
              unit="rpm"
              value={m.params.noLoadSpeedRpm}
              onValue={(v) => set({ motor: { ...m, params: { ...m.params, noLoadSpeedRpm: v } } })}
              error={e('motor.params.noLoadSpeedRpm')}
            />
            <NumInput
              label="No-load current"
              unit="mA"
              scale={1000}
              value={m.params.noLoadCurrentA}
              onValue={(v) => set({ motor: { ...m, params: { ...m.params, noLoadCurrentA: v } } })}
              error={e('motor.params.noLoadCurrentA')}
            />
            <NumInput
              label="Stall current"
              unit="A"
              value={m.params.stallCurrentA}
              onValue={(v) => set({ motor: { ...m, params: { ...m.params, stallCurrentA: v } } })}
              error={e('motor.params.stallCurrentA')}
            />
            <NumInput
              label="Stall torque"
              unit="mN·m"
              scale={1000}
              value={m.params.stallTorqueNm}
              onValue={(v) => set({ motor: { ...m, params: { ...m.params, stallTorqueNm: v } } })}
              error={e('motor.params.stallTorqueNm')}
            />
            <NumInput
              label="Inductance"
              unit="mH"
              scale={1000}
              value={m.params.inductanceH}
              onValue={(v) => set({ motor: { ...m, params: { ...m.params, inductanceH: v > 0 ? v : null } } })}
              hint="optional"
            />
          </>
        )}
        <label className="field">
          Load at the operating point
          <select
            value={input.load.kind}
            onChange={(ev) => {
              const k = ev.target.value;
              set({
                load:
                  k === 'torque'
                    ? { kind: 'torque', torqueNm: 0.002 }
                    : k === 'speed'
                      ? { kind: 'speed', speedRpm: 5000 }
                      : { kind: 'stall-only' },
              });
            }}
          >
            <option value="torque">torque</option>
            <option value="speed">speed</option>
            <option value="stall-only">worst case only (stall)</option>
          </select>
        </label>
        {input.load.kind === 'torque' && (
          <NumInput
            label="Load torque"
            unit="mN·m"
            scale={1000}
            value={input.load.torqueNm}
            onValue={(v) => set({ load: { kind: 'torque', torqueNm: v } })}
            error={e('load.torqueNm')}
          />
        )}
        {input.load.kind === 'speed' && (
          <NumInput
            label="Speed"
            unit="rpm"
            value={input.load.speedRpm}
            onValue={(v) => set({ load: { kind: 'speed', speedRpm: v } })}
            error={e('load.speedRpm')}
          />
        )}
      </Section>

      <Section title="Supply">
        <SupplyPresetField supply={input.supply} onChange={(supply) => set({ supply })} onCells={setCells} />
        <NumInput
          label="Minimum"
          unit="V"
          value={input.supply.minV}
          onValue={(v) => set({ supply: { ...input.supply, minV: v, preset: null } })}
          error={e('supply.minV')}
          testId="supply-min"
        />
        <NumInput
          label="Nominal"
          unit="V"
          value={input.supply.nomV}
          onValue={(v) => set({ supply: { ...input.supply, nomV: v, preset: null } })}
          error={e('supply.nomV')}
        />
        <NumInput
          label="Maximum"
          unit="V"
          value={input.supply.maxV}
          onValue={(v) => set({ supply: { ...input.supply, maxV: v, preset: null } })}
          error={e('supply.maxV')}
          testId="supply-max"
        />
        <NumInput
          label="Wiring"
          unit="Ω"
          value={input.wiringResistanceOhm}
          onValue={(v) => set({ wiringResistanceOhm: v })}
          error={e('wiringResistanceOhm')}
        />
        <NumInput
          label="Shunt"
          unit="Ω"
          value={input.shuntResistanceOhm}
          onValue={(v) => set({ shuntResistanceOhm: v })}
          error={e('shuntResistanceOhm')}
        />
        <SupplySourceFields supply={input.supply} onChange={(supply) => set({ supply })} error={e} cells={cells} onCells={setCells} />
      </Section>

      <Section title="Logic output">
        <label className="field col-span-2">
          Rail
          <select
            value={LOGIC_PRESETS.find((p) => p.railV === input.logic.railV)?.id ?? ''}
            data-testid="logic-preset"
            onChange={(ev) => {
              const p = LOGIC_PRESETS.find((x) => x.id === ev.target.value);
              if (p) set({ logic: { ...input.logic, railV: p.railV, highV: p.highV, lowV: p.lowV } });
            }}
          >
            <option value="">custom</option>
            {LOGIC_PRESETS.map((p) => (
              <option key={p.id} value={p.id}>
                {p.label}
              </option>
            ))}
          </select>
        </label>
        <NumInput
          label="Output high (min)"
          unit="V"
          value={input.logic.highV}
          onValue={(v) => set({ logic: { ...input.logic, highV: v } })}
          error={e('logic.highV')}
        />
        <NumInput
          label="Output low (max)"
          unit="V"
          value={input.logic.lowV}
          onValue={(v) => set({ logic: { ...input.logic, lowV: v } })}
          error={e('logic.lowV')}
        />
        <NumInput
          label="Pin source"
          unit="mA"
          scale={1000}
          value={input.logic.pinSourceCurrentA}
          onValue={(v) => set({ logic: { ...input.logic, pinSourceCurrentA: v } })}
          error={e('logic.pinSourceCurrentA')}
        />
        <NumInput
          label="Pin sink"
          unit="mA"
          scale={1000}
          value={input.logic.pinSinkCurrentA}
          onValue={(v) => set({ logic: { ...input.logic, pinSinkCurrentA: v } })}
          error={e('logic.pinSinkCurrentA')}
        />
        <label className="field">
          Pin at reset
          <select
            value={input.logic.resetPull}
            onChange={(ev) => set({ logic: { ...input.logic, resetPull: ev.target.value as DesignInput['logic']['resetPull'] } })}
          >
            <option value="none">floating (no pull)</option>
            <option value="up">internal pull-up</option>
            <option value="down">internal pull-down</option>
          </select>
        </label>
        {input.logic.resetPull !== 'none' && (
          <>
            <NumInput
              label="Internal pull"
              unit="kΩ"
              scale={0.001}
              value={input.logic.resetPullOhms}
              onValue={(v) => set({ logic: { ...input.logic, resetPullOhms: v } })}
              error={e('logic.resetPullOhms')}
            />
            <NumInput
              label="Pull tolerance"
              unit="±%"
              scale={100}
              value={input.logic.resetPullTolerance}
              onValue={(v) => set({ logic: { ...input.logic, resetPullTolerance: v } })}
              error={e('logic.resetPullTolerance')}
            />
          </>
        )}
        <SharedLogicFields logic={input.logic} onChange={(logic) => set({ logic })} error={e} />
      </Section>

      <Section title="Drive, environment, margins">
        <label className="field">
          Drive
          <select
            value={input.drive.mode}
            data-testid="drive-mode"
            onChange={(ev) =>
              set({ drive: ev.target.value === 'pwm' ? { mode: 'pwm', frequencyHz: 20000, dutyMin: 0.2, dutyMax: 1 } : { mode: 'onoff' } })
            }
          >
            <option value="onoff">on / off</option>
            <option value="pwm">PWM</option>
          </select>
        </label>
        {input.drive.mode === 'pwm' && (
          <>
            <NumInput
              label="PWM frequency"
              unit="kHz"
              scale={0.001}
              value={input.drive.frequencyHz}
              onValue={(v) => input.drive.mode === 'pwm' && set({ drive: { ...input.drive, frequencyHz: v } })}
              error={e('drive.frequencyHz')}
            />
            <NumInput
              label="Duty min"
              unit="%"
              scale={100}
              value={input.drive.dutyMin}
              onValue={(v) => input.drive.mode === 'pwm' && set({ drive: { ...input.drive, dutyMin: v } })}
              error={e('drive.dutyMin')}
            />
            <NumInput
              label="Duty max"
              unit="%"
              scale={100}
              value={input.drive.dutyMax}
              onValue={(v) => input.drive.mode === 'pwm' && set({ drive: { ...input.drive, dutyMax: v } })}
              error={e('drive.dutyMax')}
            />
          </>
        )}
        <NumInput
          label="Ambient min"
          unit="°C"
          value={input.ambientMinC}
          onValue={(v) => set({ ambientMinC: v })}
          error={e('ambientMinC')}
        />
        <NumInput
          label="Ambient max"
          unit="°C"
          value={input.ambientMaxC}
          onValue={(v) => set({ ambientMaxC: v })}
          error={e('ambientMaxC')}
        />
        <NumInput
          label="Voltage derating"
          unit="×"
          value={input.margins.voltageDerating}
          onValue={(v) => set({ margins: { ...input.margins, voltageDerating: v } })}
          error={e('margins.voltageDerating')}
          hint="default 0.8"
        />
        <NumInput
          label="Thermal margin"
          unit="K"
          value={input.margins.thermalMarginC}
          onValue={(v) => set({ margins: { ...input.margins, thermalMarginC: v } })}
          error={e('margins.thermalMarginC')}
          hint="below Tj max; default 25"
        />
        <NumInput
          label="Boards per build"
          value={input.boardQuantity}
          onValue={(v) => set({ boardQuantity: Math.max(1, Math.round(v)) })}
          error={e('boardQuantity')}
        />
        <DriverSupplyInput input={input} set={set} error={e('driverSupplyV')} />
        <StallProtectionInput value={input.stallProtection} onChange={(stallProtection) => set({ stallProtection })} errorOf={e} />
        <ResetStartIntentInput
          value={input.resetStartIntent}
          onChange={(resetStartIntent) => set({ resetStartIntent })}
          error={e('resetStartIntent.reason')}
        />
      </Section>
    </fieldset>
  );
}

import { useEffect, useRef, useState } from 'react';
import { postJson } from '../api-client.ts';
import type { PullResistorResult } from '../../lib/pull-resistor.ts';
import NumberField, { FieldPrefix } from './NumberField.tsx';
import StaleResults from './StaleResults.tsx';
import { refusalOf } from './refusal.ts';
import { fixed, formatOhms } from '../../lib/units.ts';

interface Form {
  internalPull: 'up' | 'down' | 'none';
  internalPullKOhm: string;
  pinRailV: string;
  pinMaxMa: string;
  externalTo: 'up' | 'down';
  externalRailV: string;
  mustBe: 'low' | 'high';
  limitV: string;
  series: 'E6' | 'E12' | 'E24' | 'E48' | 'E96';
}

const DEFAULTS: Form = {
  internalPull: 'up',
  internalPullKOhm: '40',
  pinRailV: '3.3',
  pinMaxMa: '4',
  externalTo: 'down',
  externalRailV: '0',
  mustBe: 'low',
  limitV: '0.5',
  series: 'E12',
};

type NumberKey = 'internalPullKOhm' | 'pinRailV' | 'pinMaxMa' | 'externalRailV' | 'limitV';

/** The labels the form shows, used to name refused fields (never the API's paths). */
const LABELS: Record<NumberKey, string> = {
  internalPullKOhm: 'Internal pull (min.)',
  pinRailV: 'Pin supply',
  pinMaxMa: 'Pin current limit',
  externalRailV: 'External rail',
  limitV: 'Limit',
};

const PATHS: Record<string, NumberKey> = {
  'pin.internalPullOhms': 'internalPullKOhm',
  'pin.railV': 'pinRailV',
  'pin.maxCurrentA': 'pinMaxMa',
  'external.railV': 'externalRailV',
  'node.limitV': 'limitV',
};

function Select<T extends string>({
  label,
  value,
  options,
  onChange,
}: {
  label: string;
  value: T;
  options: [T, string][];
  onChange: (v: T) => void;
}) {
  return (
    <label className="field">
      {label}
      <select value={value} onChange={(e) => onChange(e.target.value as T)}>
        {options.map(([v, text]) => (
          <option key={v} value={v}>
            {text}
          </option>
        ))}
      </select>
    </label>
  );
}

const fmtOhm = (ohm: number | null) => (ohm === null ? '—' : formatOhms(ohm));

/** Size an external pull resistor that overrides a pin's internal pull at reset. */
export default function PullResistorCalculator() {
  const [form, setForm] = useState<Form>(DEFAULTS);
  const [result, setResult] = useState<PullResistorResult | null>(null);
  const [errors, setErrors] = useState<Partial<Record<NumberKey, string>>>({});
  const [message, setMessage] = useState('');
  const abort = useRef<AbortController | null>(null);
  const set =
    <K extends keyof Form>(key: K) =>
    (value: Form[K]) =>
      setForm((f) => ({ ...f, [key]: value }));

  useEffect(() => {
    const body = {
      pin: {
        internalPull: form.internalPull,
        internalPullOhms: Number(form.internalPullKOhm) * 1000,
        railV: Number(form.pinRailV),
        maxCurrentA: Number(form.pinMaxMa) / 1000,
      },
      external: { to: form.externalTo, railV: Number(form.externalRailV) },
      node: { mustBe: form.mustBe, limitV: Number(form.limitV) },
      series: form.series,
    };
    const timer = setTimeout(async () => {
      abort.current?.abort();
      const ctrl = new AbortController();
      abort.current = ctrl;
      try {
        const res = await postJson<PullResistorResult>('/api/calc/pull-resistor', body, ctrl.signal);
        if (res.ok) {
          setResult(res.data);
          setErrors({});
          setMessage('');
        } else {
          const refusal = refusalOf(res.issues, PATHS, LABELS, res.error);
          setErrors(refusal.errors);
          setMessage(res.issues.length ? refusal.message : res.error);
        }
      } catch {
        /* superseded */
      }
    }, 200);
    return () => clearTimeout(timer);
  }, [form]);

  return (
    <FieldPrefix.Provider value="pull-calc">
      <section aria-labelledby="pull-title" data-testid="pull-calculator">
        <h2 id="pull-title" className="text-xl mb-2">
          Pull resistor for a safe reset state
        </h2>
        <form className="card p-3 grid gap-3 grid-cols-2 md:grid-cols-5" onSubmit={(e) => e.preventDefault()} noValidate>
          <Select
            label="Pin's internal pull at reset"
            value={form.internalPull}
            onChange={set('internalPull')}
            options={[
              ['up', 'pull-up'],
              ['down', 'pull-down'],
              ['none', 'none (floating)'],
            ]}
          />
          <NumberField
            name="internalPullKOhm"
            label="Internal pull (min.)"
            unit="kΩ"
            value={form.internalPullKOhm}
            onChange={set('internalPullKOhm')}
            error={errors.internalPullKOhm}
            hint="lowest value over tolerance"
          />
          <NumberField
            name="pinRailV"
            label="Pin supply"
            unit="V"
            value={form.pinRailV}
            onChange={set('pinRailV')}
            error={errors.pinRailV}
          />
          <NumberField
            name="pinMaxMa"
            label="Pin current limit"
            unit="mA"
            value={form.pinMaxMa}
            onChange={set('pinMaxMa')}
            error={errors.pinMaxMa}
          />
          <Select
            label="E-series"
            value={form.series}
            onChange={set('series')}
            options={[
              ['E6', 'E6'],
              ['E12', 'E12'],
              ['E24', 'E24'],
              ['E48', 'E48'],
              ['E96', 'E96'],
            ]}
          />
          <Select
            label="External resistor to"
            value={form.externalTo}
            onChange={set('externalTo')}
            options={[
              ['down', 'ground (pull-down)'],
              ['up', 'a rail (pull-up)'],
            ]}
          />
          <NumberField
            name="externalRailV"
            label="External rail"
            unit="V"
            value={form.externalRailV}
            onChange={set('externalRailV')}
            error={errors.externalRailV}
          />
          <Select
            label="Node must stay"
            value={form.mustBe}
            onChange={set('mustBe')}
            options={[
              ['low', 'low (≤ limit)'],
              ['high', 'high (≥ limit)'],
            ]}
          />
          <NumberField
            name="limitV"
            label="Limit"
            unit="V"
            value={form.limitV}
            onChange={set('limitV')}
            error={errors.limitV}
            hint="VIL max or VIH min of the input"
          />
        </form>
        {message ? (
          <p role="alert" className="mt-2 text-bad">
            ⚠ {message}
          </p>
        ) : null}
        {result ? (
          <StaleResults stale={message !== ''} testId="pull-result-box" staleTestId="pull-stale">
            <div className="card p-3 mt-3 text-sm" data-testid="pull-result">
              <p className="text-base mb-1">
                {result.ok ? (
                  <strong className="text-ok">✓ Fit {fmtOhm(result.chosenOhms)}</strong>
                ) : (
                  <strong className="text-bad">✕ No standard value fits</strong>
                )}
              </p>
              <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-0.5 num">
                <dt className="text-ink-soft">Largest value that holds the node</dt>
                <dd>{fmtOhm(result.maxOhms)}</dd>
                <dt className="text-ink-soft">Smallest value the pin can drive</dt>
                <dd>{fmtOhm(result.minOhms)}</dd>
                <dt className="text-ink-soft">Node voltage at reset</dt>
                <dd>{result.nodeV === null ? '—' : `${fixed(result.nodeV, 3)} V`}</dd>
                <dt className="text-ink-soft">Pin current when driving against it</dt>
                <dd>{result.activeCurrentA === null ? '—' : `${fixed(result.activeCurrentA * 1000, 2)} mA`}</dd>
              </dl>
              {result.notes.length ? (
                <ul className="mt-2 list-disc pl-5">
                  {result.notes.map((n) => (
                    <li key={n}>{n}</li>
                  ))}
                </ul>
              ) : null}
              <p className="mt-2 text-xs text-ink-faint">
                Verify the motor stays OFF through reset on the real board before attaching loads.
              </p>
            </div>
          </StaleResults>
        ) : null}
      </section>
    </FieldPrefix.Provider>
  );
}

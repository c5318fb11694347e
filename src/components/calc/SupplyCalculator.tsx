import { useEffect, useRef, useState } from 'react';
import { postJson } from '../api-client.ts';
import { SUPPLY_PRESETS } from '../../lib/domain/design.ts';
import type { SupplyReport } from '../../lib/supply.ts';
import Verdict from '../workspace/Verdict.tsx';
import { SupplyChecks, SupplyFigures, SupplyNotes } from '../workspace/SupplyPanel.tsx';
import NumberField, { FieldPrefix } from './NumberField.tsx';
import StaleResults from './StaleResults.tsx';
import { localRefusal, refusalOf } from './refusal.ts';
import {
  DEFAULT_SUPPLY_FORM,
  SUPPLY_FIELD_LABELS,
  SUPPLY_PATH_TO_FIELD,
  formFromPreset,
  toSupplyRequest,
  type SupplyFieldErrors,
  type SupplyForm,
} from './supply-form.ts';

type Status = 'idle' | 'loading' | 'ready' | 'error';

function useSupplyReport(form: SupplyForm) {
  const [report, setReport] = useState<SupplyReport | null>(null);
  const [errors, setErrors] = useState<SupplyFieldErrors>({});
  const [status, setStatus] = useState<Status>('idle');
  const [message, setMessage] = useState('');
  const abort = useRef<AbortController | null>(null);
  useEffect(() => {
    const built = toSupplyRequest(form);
    if (!built.ok) {
      const refusal = localRefusal(built.errors, SUPPLY_FIELD_LABELS);
      setErrors(refusal.errors);
      setStatus('error');
      setMessage(refusal.message);
      return;
    }
    const timer = setTimeout(async () => {
      abort.current?.abort();
      const ctrl = new AbortController();
      abort.current = ctrl;
      setStatus('loading');
      try {
        const res = await postJson<SupplyReport>('/api/calc/supply', built.body, ctrl.signal);
        if (res.ok) {
          setReport(res.data);
          setErrors({});
          setMessage('');
          setStatus('ready');
          return;
        }
        const refusal = refusalOf(res.issues, SUPPLY_PATH_TO_FIELD, SUPPLY_FIELD_LABELS, res.error);
        setErrors(refusal.errors);
        setMessage(res.issues.length ? refusal.message : res.error);
        setStatus('error');
      } catch {
        /* superseded by a newer request */
      }
    }, 200);
    return () => clearTimeout(timer);
  }, [form]);
  return { report, errors, status, message };
}

/** Can a source start the motor, and does a controller on the same source survive the start? */
export default function SupplyCalculator() {
  const [form, setForm] = useState<SupplyForm>(DEFAULT_SUPPLY_FORM);
  const [preset, setPreset] = useState('');
  const { report, errors, status, message } = useSupplyReport(form);
  const set = (key: Exclude<keyof SupplyForm, 'logicShared'>) => (value: string) => {
    setForm((f) => ({ ...f, [key]: value }));
    if (['supplyV', 'internalOhm', 'continuousA', 'limitA'].includes(key)) setPreset('');
  };
  const field = (key: Exclude<keyof SupplyForm, 'logicShared'>, unit?: string, hint?: string) => (
    <NumberField
      name={key}
      label={SUPPLY_FIELD_LABELS[key]}
      unit={unit}
      value={form[key]}
      onChange={set(key)}
      error={errors[key]}
      hint={hint}
    />
  );
  const chosen = SUPPLY_PRESETS.find((p) => p.id === preset);
  return (
    <FieldPrefix.Provider value="supply-calc">
      <section aria-labelledby="supply-calc-title" className="mb-8" data-testid="supply-calculator">
        <h2 id="supply-calc-title" className="text-xl mb-2">
          Supply: can it start the motor?
        </h2>
        <form className="card p-3 grid gap-3 grid-cols-2 md:grid-cols-4 lg:grid-cols-6" onSubmit={(e) => e.preventDefault()} noValidate>
          {field('ratedV', 'V')}
          {field('noLoadSpeedRpm', 'rpm')}
          {field('noLoadCurrentA', 'A')}
          {field('stallCurrentA', 'A')}
          {field('rotorInertiaGcm2', 'g·cm²', 'empty: no capacitor figure')}
          {field('loadTorqueMNm', 'mN·m', 'at start')}
          <label className="field col-span-2">
            Source preset
            <select
              value={preset}
              data-testid="calc-supply-preset"
              onChange={(ev) => {
                const p = SUPPLY_PRESETS.find((x) => x.id === ev.target.value);
                setPreset(p?.id ?? '');
                if (p) setForm((f) => formFromPreset(f, p));
              }}
            >
              <option value="">custom</option>
              {SUPPLY_PRESETS.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.label}
                </option>
              ))}
            </select>
            {chosen ? (
              <span className="text-xs text-ink-faint">
                Limit: {chosen.source.currentLimit}. Internal resistance: {chosen.source.internalResistance}.
              </span>
            ) : null}
          </label>
          {field('supplyV', 'V', 'open circuit')}
          {field('internalOhm', 'Ω', 'pack: per cell × cells')}
          {field('continuousA', 'A', 'empty: not checked')}
          {field('limitA', 'A', 'empty: does not limit')}
          {field('seriesOhm', 'Ω', 'wiring, shunt')}
          {field('windingC', '°C', 'coldest start draws most')}
          <label className="col-span-2 text-sm flex items-center gap-2 self-end">
            <input
              type="checkbox"
              checked={form.logicShared}
              data-testid="calc-logic-shared"
              onChange={(ev) => setForm((f) => ({ ...f, logicShared: ev.target.checked }))}
            />
            Controller fed from the same source
          </label>
          {form.logicShared ? field('logicMinV', 'V', 'its brown-out level') : null}
          {form.logicShared ? field('dropoutV', 'V', '0 when fed directly') : null}
          {field('allowedDipV', 'V', 'for the capacitor figure')}
          <p className="col-span-2 md:col-span-4 self-end text-sm text-ink-soft" aria-live="polite" data-testid="supply-status">
            {status === 'loading' ? '… computing' : status === 'error' ? `⚠ ${message}` : status === 'ready' ? '✓ up to date' : ''}
          </p>
        </form>
        {report ? (
          <StaleResults stale={status === 'error'} testId="supply-result" staleTestId="supply-stale">
            <div className="grid gap-3 lg:grid-cols-[1.4fr_1fr] mt-3">
              <div>
                <p className="mb-2 text-sm flex items-center gap-2" data-testid="calc-supply-verdict">
                  <Verdict verdict={report.verdict} /> <span>Overall</span>
                </p>
                <SupplyChecks report={report} testId="calc-supply-checks" />
              </div>
              <div className="card p-3">
                <h3 className="font-semibold mb-1 text-sm">Start figures</h3>
                <SupplyFigures report={report} worstCases={false} />
                <h3 className="font-semibold mt-3 mb-1 text-sm">What to change, and cautions</h3>
                <SupplyNotes notes={report.notes} />
              </div>
            </div>
          </StaleResults>
        ) : null}
      </section>
    </FieldPrefix.Provider>
  );
}

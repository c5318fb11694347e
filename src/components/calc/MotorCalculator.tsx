import { useEffect, useMemo, useRef, useState } from 'react';
import { postJson } from '../api-client.ts';
import type { CalcMotorResponse } from '../../lib/calc.ts';
import { fixed, percent, torqueFromNm, type TorqueUnit } from '../../lib/units.ts';
import NumberField, { FieldPrefix } from './NumberField.tsx';
import LineChart, { type ChartMarker, type ChartSeries } from './LineChart.tsx';
import MotorSummary from './MotorSummary.tsx';
import StaleResults from './StaleResults.tsx';
import MotorActions, { type CalculatorViewer } from './MotorActions.tsx';
import { localRefusal, refusalOf } from './refusal.ts';
import type { MotorHandoff } from '../../lib/motor-handoff.ts';
import {
  CURRENT_UNITS,
  DEFAULT_MOTOR_FORM,
  MOTOR_FIELD_LABELS,
  PATH_TO_FIELD,
  SPEED_UNITS,
  TORQUE_UNITS,
  toRequests,
  type FieldErrors,
  type MotorForm,
} from './motor-form.ts';

type Results = { min: CalcMotorResponse; max: CalcMotorResponse };
type Status = 'idle' | 'loading' | 'ready' | 'error';

function useMotorResults(form: MotorForm) {
  const [results, setResults] = useState<Results | null>(null);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [status, setStatus] = useState<Status>('idle');
  const [message, setMessage] = useState('');
  /** True while the shown results belong to earlier inputs (the current ones are refused). */
  const [stale, setStale] = useState(false);
  const abort = useRef<AbortController | null>(null);
  useEffect(() => {
    const built = toRequests(form);
    if (!built.ok) {
      const refusal = localRefusal(built.errors, MOTOR_FIELD_LABELS);
      setErrors(refusal.errors);
      setMessage(refusal.message);
      setStatus('error');
      setStale(true);
      return;
    }
    const timer = setTimeout(async () => {
      abort.current?.abort();
      const ctrl = new AbortController();
      abort.current = ctrl;
      setStatus('loading');
      try {
        const [min, max] = await Promise.all([
          postJson<CalcMotorResponse>('/api/calc/motor', built.requests.min, ctrl.signal),
          postJson<CalcMotorResponse>('/api/calc/motor', built.requests.max, ctrl.signal),
        ]);
        if (min.ok && max.ok) {
          setResults({ min: min.data, max: max.data });
          setErrors({});
          setStale(false);
          setStatus('ready');
        } else {
          const bad = !min.ok ? min : !max.ok ? max : null;
          const refusal = bad ? refusalOf(bad.issues, PATH_TO_FIELD, MOTOR_FIELD_LABELS, bad.error) : { errors: {}, message: '' };
          setErrors(refusal.errors);
          setMessage(bad && bad.issues.length === 0 ? bad.error : refusal.message);
          setStale(true);
          setStatus('error');
        }
      } catch {
        /* superseded by a newer request */
      }
    }, 200);
    return () => clearTimeout(timer);
  }, [form]);
  return { results, errors, status, message, stale };
}

/** The accepted motor in SI with its supply range, for the actions (null while the inputs are refused). */
function handoffOf(results: Results | null, stale: boolean, form: MotorForm): MotorHandoff | null {
  if (!results || stale) return null;
  const built = toRequests(form);
  if (!built.ok) return null;
  const body = built.requests.min as { motor: Omit<MotorHandoff, 'supplyMinV' | 'supplyMaxV'>; supplyV: number };
  const maxBody = built.requests.max as { supplyV: number };
  return { ...body.motor, supplyMinV: body.supplyV, supplyMaxV: maxBody.supplyV };
}

function curveSeries(r: Results, unit: TorqueUnit, pick: (p: CalcMotorResponse['curve'][number]) => number): ChartSeries[] {
  const line = (res: CalcMotorResponse) => res.curve.map((p) => ({ x: torqueFromNm(p.torqueNm, unit), y: pick(p) }));
  return [
    { label: `max supply ${r.max.atSupply.supplyV} V`, points: line(r.max), tone: 'copper' },
    { label: `min supply ${r.min.atSupply.supplyV} V`, points: line(r.min), tone: 'graphite', dashed: true },
  ];
}

/** Motor curves at minimum and maximum supply from datasheet points, in the datasheet's own units. */
export default function MotorCalculator({ viewer = null }: { viewer?: CalculatorViewer | null }) {
  const [form, setForm] = useState<MotorForm>(DEFAULT_MOTOR_FORM);
  const { results, errors, status, message, stale } = useMotorResults(form);
  const handoff = useMemo(() => handoffOf(results, stale, form), [results, stale, form]);
  const set = (key: keyof MotorForm) => (value: string) => setForm((f) => ({ ...f, [key]: value }));
  const unit = form.torqueUnit;
  const charts = useMemo(() => {
    if (!results) return null;
    const t = (nm: number) => torqueFromNm(nm, unit);
    const mp = (r: CalcMotorResponse, tone: ChartMarker['tone']): ChartMarker => ({
      x: t(r.atSupply.maxPower.torqueNm),
      y: r.atSupply.maxPower.powerW,
      shape: 'circle',
      tone,
      label: `max power ${fixed(r.atSupply.maxPower.powerW, 2)} W @ ${r.atSupply.supplyV} V`,
    });
    const me = (r: CalcMotorResponse, tone: ChartMarker['tone']): ChartMarker => ({
      x: t(r.atSupply.maxEfficiency.torqueNm),
      y: r.atSupply.maxEfficiency.efficiency * 100,
      shape: 'diamond',
      tone,
      label: `max efficiency ${percent(r.atSupply.maxEfficiency.efficiency, 1)} @ ${r.atSupply.supplyV} V`,
    });
    const stall = (r: CalcMotorResponse, tone: ChartMarker['tone']): ChartMarker => ({
      x: t(r.atSupply.stallTorqueNm),
      y: r.atSupply.stallCurrentA,
      shape: 'square',
      tone,
      label: `stall ${fixed(r.atSupply.stallCurrentA, 2)} A @ ${r.atSupply.supplyV} V`,
    });
    return [
      <LineChart
        key="speed"
        testId="chart-speed"
        title="Speed"
        xLabel={`torque (${unit})`}
        yLabel="speed (rpm)"
        series={curveSeries(results, unit, (p) => p.speedRpm)}
      />,
      <LineChart
        key="current"
        testId="chart-current"
        title="Current"
        xLabel={`torque (${unit})`}
        yLabel="current (A)"
        series={curveSeries(results, unit, (p) => p.currentA)}
        markers={[stall(results.max, 'copper'), stall(results.min, 'graphite')]}
      />,
      <LineChart
        key="power"
        testId="chart-power"
        title="Output power"
        xLabel={`torque (${unit})`}
        yLabel="power (W)"
        series={curveSeries(results, unit, (p) => p.powerW)}
        markers={[mp(results.max, 'copper'), mp(results.min, 'graphite')]}
      />,
      <LineChart
        key="eff"
        testId="chart-efficiency"
        title="Efficiency"
        xLabel={`torque (${unit})`}
        yLabel="efficiency (%)"
        series={curveSeries(results, unit, (p) => p.efficiency * 100)}
        markers={[me(results.max, 'copper'), me(results.min, 'graphite')]}
      />,
    ];
  }, [results, unit]);

  return (
    <FieldPrefix.Provider value="motor-calc">
      <section aria-labelledby="motor-calc-title" className="mb-8" data-testid="motor-calculator">
        <h2 id="motor-calc-title" className="text-xl mb-2">
          Motor from datasheet points
        </h2>
        <form className="card p-3 grid gap-3 grid-cols-2 md:grid-cols-4 lg:grid-cols-6" onSubmit={(e) => e.preventDefault()} noValidate>
          <NumberField name="ratedV" label="Rated voltage" unit="V" value={form.ratedV} onChange={set('ratedV')} error={errors.ratedV} />
          <NumberField
            name="noLoadSpeed"
            label="No-load speed"
            value={form.noLoadSpeed}
            onChange={set('noLoadSpeed')}
            error={errors.noLoadSpeed}
            units={SPEED_UNITS}
            unit={form.speedUnit}
            onUnitChange={set('speedUnit')}
          />
          <NumberField
            name="noLoadCurrent"
            label="No-load current"
            value={form.noLoadCurrent}
            onChange={set('noLoadCurrent')}
            error={errors.noLoadCurrent}
            units={CURRENT_UNITS}
            unit={form.noLoadCurrentUnit}
            onUnitChange={set('noLoadCurrentUnit')}
          />
          <NumberField
            name="stallCurrent"
            label="Stall current"
            value={form.stallCurrent}
            onChange={set('stallCurrent')}
            error={errors.stallCurrent}
            units={CURRENT_UNITS}
            unit={form.stallCurrentUnit}
            onUnitChange={set('stallCurrentUnit')}
          />
          <NumberField
            name="stallTorque"
            label="Stall torque"
            value={form.stallTorque}
            onChange={set('stallTorque')}
            error={errors.stallTorque}
            units={TORQUE_UNITS}
            unit={form.torqueUnit}
            onUnitChange={set('torqueUnit')}
          />
          <NumberField
            name="seriesOhm"
            label="Series resistance"
            unit="Ω"
            value={form.seriesOhm}
            onChange={set('seriesOhm')}
            error={errors.seriesOhm}
            hint="switch, wiring, shunt"
          />
          <NumberField
            name="supplyMinV"
            label="Supply minimum"
            unit="V"
            value={form.supplyMinV}
            onChange={set('supplyMinV')}
            error={errors.supplyMinV}
            hint="sagged battery"
          />
          <NumberField
            name="supplyMaxV"
            label="Supply maximum"
            unit="V"
            value={form.supplyMaxV}
            onChange={set('supplyMaxV')}
            error={errors.supplyMaxV}
            hint="fresh battery, charger"
          />
          <p className="col-span-2 md:col-span-4 self-end text-sm text-ink-soft" aria-live="polite" data-testid="motor-status">
            {status === 'loading' ? '… computing' : status === 'error' ? `⚠ ${message}` : status === 'ready' ? '✓ up to date' : ''}
          </p>
        </form>
        <StaleResults stale={stale && results !== null} testId="motor-results" staleTestId="motor-stale">
          {results ? <MotorSummary min={results.min} max={results.max} torqueUnit={unit} /> : null}
          {charts ? <div className="grid gap-3 md:grid-cols-2 mt-3">{charts}</div> : null}
        </StaleResults>
        {results ? <MotorActions motor={handoff} viewer={viewer} /> : null}
      </section>
    </FieldPrefix.Provider>
  );
}

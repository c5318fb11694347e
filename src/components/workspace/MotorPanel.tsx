import { sig } from '../../lib/units.ts';
import { Fragment } from 'react';
import LineChart, { type ChartMarker } from '../calc/LineChart.tsx';
import type { MotorView } from '../../lib/design-match.ts';
import type { WorstCase } from '../../lib/design-case.ts';
import { rippleRows, stallRows, type FigureRow } from '../../lib/design-words.ts';
import { pwmFrequencyCaution } from '../../lib/ripple.ts';

function Figures({ rows }: { rows: FigureRow[] }) {
  return (
    <dl className="grid grid-cols-[1fr_auto] gap-x-3 gap-y-0.5 num">
      {rows.map((r) => (
        <Fragment key={r.label}>
          <dt className="text-ink-soft">{r.label}</dt>
          <dd>{r.value}</dd>
        </Fragment>
      ))}
    </dl>
  );
}

/** The current's shape under PWM and the jam, with the caution when the PWM period is long against τe. */
function RippleAndStall({ motor, worstCase }: { motor: MotorView; worstCase: WorstCase }) {
  const inductanceH = motor.params.inductanceH;
  const ripple = rippleRows(worstCase, inductanceH != null);
  const caution =
    worstCase.pwmHz != null && inductanceH != null ? pwmFrequencyCaution(worstCase.pwmHz, inductanceH / motor.atMin.resistanceOhm) : null;
  return (
    <div className="grid gap-3 lg:grid-cols-2 lg:col-span-3">
      <div className="card p-3 text-sm" data-testid="ripple">
        <h3 className="font-semibold mb-1">Current under PWM, where the switch heats most</h3>
        <Figures rows={ripple.rows} />
        {ripple.note ? <p className="mt-1 text-xs text-ink-soft">{ripple.note}</p> : null}
        {worstCase.ripple && !worstCase.ripple.continuous ? (
          <p className="mt-2 text-xs text-warn" data-testid="dcm">
            ! Discontinuous conduction: the current falls to zero each cycle, so RMS and peak currents are well above the mean.
          </p>
        ) : null}
        {caution ? (
          <p className="mt-2 p-2 rounded border border-warn bg-warn-wash text-warn text-xs" role="note" data-testid="pwm-caution">
            <strong>⚠ PWM frequency.</strong> {caution}
          </p>
        ) : null}
      </div>
      <div className="card p-3 text-sm" data-testid="stall-case">
        <h3 className="font-semibold mb-1">Jammed shaft (what switch and diode must survive)</h3>
        <Figures rows={stallRows(worstCase)} />
      </div>
    </div>
  );
}

const f = (v: number, d = 3) => sig(v, d);

/** Motor curves at minimum and maximum supply with the operating point and stall marked, and worst-case currents. */
export default function MotorPanel({ motor, worstCase }: { motor: MotorView; worstCase: WorstCase }) {
  const mNm = (nm: number) => nm * 1000;
  const line = (r: MotorView['atMin'], pick: (p: MotorView['atMin']['curve'][number]) => number) =>
    r.curve.map((p) => ({ x: mNm(p.torqueNm), y: pick(p) }));
  const series = (pick: (p: MotorView['atMin']['curve'][number]) => number) => [
    { label: `max supply ${f(motor.atMax.atSupply.supplyV)} V`, points: line(motor.atMax, pick), tone: 'copper' as const },
    { label: `min supply ${f(motor.atMin.atSupply.supplyV)} V`, points: line(motor.atMin, pick), tone: 'graphite' as const, dashed: true },
  ];
  const op = (o: MotorView['operatingMax'], v: number, tone: ChartMarker['tone'], y: 'speed' | 'current'): ChartMarker[] =>
    o
      ? [{ x: mNm(o.torqueNm), y: y === 'speed' ? o.speedRpm : o.currentA, shape: 'circle', tone, label: `operating point @ ${f(v)} V` }]
      : [];
  const stall = (r: MotorView['atMin'], tone: ChartMarker['tone']): ChartMarker => ({
    x: mNm(r.atSupply.stallTorqueNm),
    y: r.atSupply.stallCurrentA,
    shape: 'square',
    tone,
    label: `stall ${f(r.atSupply.stallCurrentA)} A @ ${f(r.atSupply.supplyV)} V`,
  });
  return (
    <div className="grid gap-3 lg:grid-cols-[1fr_1fr_0.9fr]" data-testid="motor-panel">
      <LineChart
        title="Speed"
        testId="ws-chart-speed"
        xLabel="torque (mN·m)"
        yLabel="speed (rpm)"
        series={series((p) => p.speedRpm)}
        markers={[
          ...op(motor.operatingMax, motor.atMax.atSupply.supplyV, 'copper', 'speed'),
          ...op(motor.operatingMin, motor.atMin.atSupply.supplyV, 'graphite', 'speed'),
        ]}
      />
      <LineChart
        title="Current"
        testId="ws-chart-current"
        xLabel="torque (mN·m)"
        yLabel="current (A)"
        series={series((p) => p.currentA)}
        markers={[
          ...op(motor.operatingMax, motor.atMax.atSupply.supplyV, 'copper', 'current'),
          stall(motor.atMax, 'copper'),
          stall(motor.atMin, 'graphite'),
        ]}
      />
      <div className="card p-3 text-sm" data-testid="worst-case">
        <h3 className="font-semibold mb-1">Worst-case currents</h3>
        <dl className="grid grid-cols-[1fr_auto] gap-x-3 gap-y-0.5 num">
          <dt className="text-ink-soft">Start-up / stall (max supply, {f(worstCase.windingColdC)} °C winding)</dt>
          <dd className="font-semibold">{f(worstCase.stallCurrentMaxA)} A</dd>
          <dt className="text-ink-soft">Running, switch on (duty {f(worstCase.switchDuty * 100)} %)</dt>
          <dd>{f(worstCase.runningCurrentA)} A</dd>
          <dt className="text-ink-soft">Diode mean (freewheeling)</dt>
          <dd>{f(worstCase.diodeMeanCurrentA)} A</dd>
          <dt className="text-ink-soft">Gate drive available (logic high min)</dt>
          <dd>{f(worstCase.gateDriveMinV)} V</dd>
          <dt className="text-ink-soft">Hottest ambient</dt>
          <dd>{f(worstCase.ambientMaxC)} °C</dd>
        </dl>
        {motor.atMax.consistency.warning ? (
          <p className="mt-2 p-2 rounded border border-warn bg-warn-wash text-warn text-xs" role="note">
            <strong>⚠ Datasheet check:</strong> {motor.atMax.consistency.warning}
          </p>
        ) : null}
        <p className="mt-2 p-2 rounded border border-copper bg-copper-wash text-xs">
          <strong>⚠ Stall heat.</strong> At {f(worstCase.stallCurrentMaxA)} A the switch, diode and motor heat within seconds; fuse near the
          supply and size wiring for this current.
        </p>
      </div>
      <RippleAndStall motor={motor} worstCase={worstCase} />
    </div>
  );
}

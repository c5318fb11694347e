import type { CalcMotorResponse } from '../../lib/calc.ts';
import { formatSi, sig, torqueFromNm, type TorqueUnit } from '../../lib/units.ts';

interface Props {
  min: CalcMotorResponse;
  max: CalcMotorResponse;
  torqueUnit: TorqueUnit;
}

const f = (v: number, d = 3) => sig(v, d);

/** Model constants, the consistency verdict and the key points at both supply ends. */
export default function MotorSummary({ min, max, torqueUnit }: Props) {
  const t = (nm: number) => `${f(torqueFromNm(nm, torqueUnit))} ${torqueUnit}`;
  const rows: [string, (r: CalcMotorResponse) => string][] = [
    ['No-load speed', (r) => `${f(r.atSupply.noLoadSpeedRpm, 4)} rpm`],
    ['Stall current', (r) => `${f(r.atSupply.stallCurrentA)} A`],
    ['Stall torque (model)', (r) => t(r.atSupply.stallTorqueNm)],
    [
      'Max power',
      (r) =>
        `${f(r.atSupply.maxPower.powerW)} W at ${t(r.atSupply.maxPower.torqueNm)}, ${f(r.atSupply.maxPower.speedRpm, 4)} rpm, ${f(r.atSupply.maxPower.currentA)} A`,
    ],
    [
      'Max efficiency',
      (r) =>
        `${f(r.atSupply.maxEfficiency.efficiency * 100)} % at ${t(r.atSupply.maxEfficiency.torqueNm)}, ${f(r.atSupply.maxEfficiency.speedRpm, 4)} rpm, ${f(r.atSupply.maxEfficiency.currentA)} A`,
    ],
  ];
  const warning = max.consistency.warning;
  return (
    <div className="grid gap-3 lg:grid-cols-[1fr_1.6fr] mt-3">
      <div className="card p-3 text-sm">
        <h3 className="font-semibold mb-1">Model</h3>
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-0.5 num">
          <dt className="text-ink-soft">Terminal resistance R</dt>
          <dd>{formatSi(max.resistanceOhm, 'Ω', 4)}</dd>
          <dt className="text-ink-soft">Ke = Kt</dt>
          <dd>{formatSi(max.ktNmPerA, 'N·m/A', 4)}</dd>
          <dt className="text-ink-soft">Friction torque</dt>
          <dd>{t(max.frictionTorqueNm)}</dd>
          <dt className="text-ink-soft">Datasheet / model stall torque</dt>
          <dd data-testid="torque-ratio">{f(max.consistency.torqueRatio)}</dd>
        </dl>
        {warning ? (
          <p role="alert" className="mt-2 p-2 rounded border border-warn bg-warn-wash text-warn" data-testid="consistency-warning">
            <strong>⚠ Datasheet disagrees with itself.</strong> {warning}
          </p>
        ) : (
          <p className="mt-2 text-ok" data-testid="consistency-ok">
            ✓ Datasheet points agree with the linear model (ratio within 0.85–1.15).
          </p>
        )}
      </div>
      <div className="card p-3 text-sm overflow-x-auto">
        <table className="data-table w-full">
          <thead>
            <tr>
              <th></th>
              <th>At {min.atSupply.supplyV} V (min)</th>
              <th>At {max.atSupply.supplyV} V (max)</th>
            </tr>
          </thead>
          <tbody>
            {rows.map(([label, get]) => (
              <tr key={label}>
                <th scope="row" className="font-normal text-ink-soft normal-case">
                  {label}
                </th>
                <td className="num">{get(min)}</td>
                <td className="num">{get(max)}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <p className="mt-2 p-2 rounded border border-copper bg-copper-wash" data-testid="stall-callout">
          <strong>⚠ Worst-case start-up current: {f(max.atSupply.stallCurrentA)} A</strong> (stall at {max.atSupply.supplyV} V; a cold
          winding draws more). Size the switch's pulsed rating, the fuse and the wiring for it; at stall the switch, diode and motor heat
          within seconds.
        </p>
      </div>
    </div>
  );
}

import type { PowerOnResult } from '../../lib/power-on.ts';
import { formatOhms } from '../../lib/units.ts';

const STAGE: Record<string, string> = { pin: 'Controller pin', 'pull-network': 'Pull network', driver: 'Driver', gate: 'Gate', motor: 'Motor' };

/** The chain from the pin's reset state to the motor, and the pull resistor that keeps it off. */
export default function PowerOnPanel({ powerOn }: { powerOn: PowerOnResult | null }) {
  if (!powerOn) return <p className="text-sm text-ink-soft">Pick or find a passing switch to walk the power-on chain.</p>;
  const pull = powerOn.recommendedPull;
  return (
    <div data-testid="power-on">
      <ol className="flex flex-wrap items-stretch gap-2 text-sm">
        {powerOn.steps.map((s, i) => (
          <li key={s.stage} className="card p-2 flex-1 min-w-40">
            <div className="text-xs text-ink-soft uppercase tracking-wide">{i + 1}. {STAGE[s.stage] ?? s.stage}</div>
            <div className="font-semibold">{s.state}{s.minV != null ? <span className="font-normal text-ink-soft"> · {s.minV === s.maxV ? `${s.minV.toFixed(2)} V` : `${s.minV.toFixed(2)}–${(s.maxV ?? s.minV).toFixed(2)} V`}</span> : null}</div>
            <div className="text-xs">{s.note}</div>
          </li>
        ))}
      </ol>
      <p className={`mt-2 p-2 rounded border text-sm ${powerOn.motorCanStart ? 'border-bad bg-bad-wash text-bad' : 'border-ok bg-ok-wash text-ok'}`} role="status" data-testid="power-on-verdict">
        <strong>{powerOn.motorCanStart ? '✕ The motor can start at power-up.' : '✓ The motor stays off through reset.'}</strong> {powerOn.note}
      </p>
      {pull && pull.ok && pull.chosenOhms != null ? (
        <p className="mt-1 text-sm" data-testid="recommended-pull">
          Recommended: <strong>{formatOhms(pull.chosenOhms)} pull-{pull.to}</strong>
          {pull.nodeV != null ? <> (node {pull.nodeV.toFixed(2)} V at reset</> : null}{pull.activeCurrentA != null ? <>, pin current {(pull.activeCurrentA * 1000).toFixed(2)} mA when driving)</> : ')'}.
        </p>
      ) : null}
      {powerOn.motorCanStart ? <p className="mt-1 text-xs text-ink-soft">⚠ Unexpected start: verify the drive stays OFF through reset on the real board before attaching loads; guard moving shafts.</p> : null}
    </div>
  );
}

import type { PowerOnResult } from '../../lib/power-on.ts';
import type { DesignInput } from '../../lib/domain/design.ts';
import { motorStateText } from '../../lib/design-words.ts';
import { motorStateAtReset } from '../../lib/readiness.ts';
import { fixed, formatOhms } from '../../lib/units.ts';

const STAGE: Record<string, string> = {
  pin: 'Controller pin',
  'pull-network': 'Pull network',
  driver: 'Driver',
  gate: 'Gate',
  motor: 'Motor',
};

/** The chain from the pin's reset state to the motor, and the pull resistor that keeps it off. */
/** The motor's state at reset as built (the recommended pull fitted), and the designer's recorded intent. */
function ResetState({ powerOn, intent }: { powerOn: PowerOnResult; intent: DesignInput['resetStartIntent'] }) {
  const state = motorStateAtReset(powerOn) ?? powerOn.motorStateAtReset;
  const pull = powerOn.recommendedPull;
  const fitted = pull != null && pull.ok && pull.chosenOhms != null && powerOn.withRecommendedPull != null;
  const icon = state === 'off' ? '✓' : state === 'on' ? '✕' : '!';
  const tone = state === 'off' ? 'text-ok' : intent ? 'text-warn' : 'text-bad';
  return (
    <div className="mt-2 text-sm" data-testid="motor-state-at-reset" data-state={state}>
      <p>
        Motor at reset as built{fitted ? ' (with the recommended pull fitted)' : ''}:{' '}
        <strong className={tone}>
          {icon} {motorStateText(state)}
        </strong>
      </p>
      {intent ? (
        <p className="mt-1 p-2 rounded border border-warn bg-warn-wash text-warn" data-testid="reset-start-recorded">
          <strong>⚠ Start at reset recorded as intended:</strong> “{intent.reason}”
          {state === 'off' ? ' (not needed now: the motor stays off at reset).' : ' Guard the moving parts and verify on the real board.'}
        </p>
      ) : null}
    </div>
  );
}

export default function PowerOnPanel({
  powerOn,
  resetStartIntent = null,
}: {
  powerOn: PowerOnResult | null;
  resetStartIntent?: DesignInput['resetStartIntent'];
}) {
  if (!powerOn) return <p className="text-sm text-ink-soft">Pick or find a passing switch to walk the power-on chain.</p>;
  const pull = powerOn.recommendedPull;
  return (
    <div data-testid="power-on">
      <ol className="flex flex-wrap items-stretch gap-2 text-sm">
        {powerOn.steps.map((s, i) => (
          <li key={s.stage} className="card p-2 flex-1 min-w-40">
            <div className="text-xs text-ink-soft uppercase tracking-wide">
              {i + 1}. {STAGE[s.stage] ?? s.stage}
            </div>
            <div className="font-semibold">
              {s.state}
              {s.minV != null ? (
                <span className="font-normal text-ink-soft">
                  {' '}
                  · {s.minV === s.maxV ? `${fixed(s.minV, 2)} V` : `${fixed(s.minV, 2)}–${fixed(s.maxV ?? s.minV, 2)} V`}
                </span>
              ) : null}
            </div>
            <div className="text-xs">{s.note}</div>
          </li>
        ))}
      </ol>
      <p
        className={`mt-2 p-2 rounded border text-sm ${powerOn.motorCanStart ? 'border-bad bg-bad-wash text-bad' : 'border-ok bg-ok-wash text-ok'}`}
        role="status"
        data-testid="power-on-verdict"
      >
        <strong>{powerOn.motorCanStart ? '✕ The motor can start at power-up.' : '✓ The motor stays off through reset.'}</strong>{' '}
        {powerOn.note}
      </p>
      {pull && pull.ok && pull.chosenOhms != null ? (
        <p className="mt-1 text-sm" data-testid="recommended-pull">
          Recommended:{' '}
          <strong>
            {formatOhms(pull.chosenOhms)} pull-{pull.to}
          </strong>
          {pull.nodeV != null ? <> (node {fixed(pull.nodeV, 2)} V at reset</> : null}
          {pull.activeCurrentA != null ? <>, pin current {fixed(pull.activeCurrentA * 1000, 2)} mA when driving)</> : ')'}.
        </p>
      ) : null}
      <ResetState powerOn={powerOn} intent={resetStartIntent} />
      {powerOn.motorCanStart ? (
        <p className="mt-1 text-xs text-ink-soft">
          ⚠ Unexpected start: verify the drive stays OFF through reset on the real board before attaching loads; guard moving shafts.
        </p>
      ) : null}
    </div>
  );
}

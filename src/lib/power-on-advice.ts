/**
 * The external pull that keeps the motor off at reset [docs/engineering.md §9], proved by re-walking the chain
 * with it fitted at its tolerance. Advice never suggests a pull the re-walk does not show holding the motor off.
 */
import { fmt } from './checks.ts';
import { band, DEFAULT_PIN_LEAKAGE_A, describeKohm, opposingEquivalent, type PullSource } from './power-on-network.ts';
import type { MotorState, PowerOnInput, PowerOnStep, Thresholds } from './power-on.ts';
import { sizePullResistor, worstPullCurrentA, type PullResistorResult } from './pull-resistor.ts';

export interface RecommendedPull extends PullResistorResult {
  to: 'up' | 'down';
  railV: number;
  /** Tolerance the pull was sized and re-walked at (fraction). */
  tolerance: number;
}

export interface PullAdvice {
  pull: RecommendedPull | null;
  rewalk: { steps: PowerOnStep[]; motorState: MotorState } | null;
  drawWhenHighA: number;
  note: string;
}

type Walk = (input: PowerOnInput, sources: readonly PullSource[]) => { steps: PowerOnStep[]; motorState: MotorState };

/** The node keeps a margin of 10 % of the logic rail inside the driver's threshold [practice, docs/engineering.md §9 noise margin]. */
export const PULL_MARGIN_FRACTION_OF_RAIL = 0.1;
const RECOMMENDED_TOLERANCE = 0.01;

/**
 * Current the pin supplies into a recommended pull-DOWN while it drives high, at the worst case: the pin at
 * its highest (pass the logic rail) and the resistor at its low tolerance end, V/(R·(1 − tol))
 * (worstPullCurrentA). A pull-up costs nothing while the pin drives high, so 0; also 0 without a fitted pull.
 * The power-on advice reports it and the switch ranking subtracts it from the pin's current budget when the
 * pin drives the gate directly: both call this, so they cannot disagree.
 */
export function pullDrawCurrentA(pull: RecommendedPull | null, driveHighV: number): number {
  if (pull == null || !pull.ok || pull.to !== 'down' || pull.chosenOhms == null) return 0;
  return worstPullCurrentA(driveHighV, pull.chosenOhms, pull.tolerance);
}

/** Limit the node must hold: the first stage's threshold less the margin (direct drive: ½·VGS(th)min already is one). */
function holdLimitV(input: PowerOnInput, t: Thresholds, needHigh: boolean): number {
  if (input.driver == null) return t.lowMaxV;
  const margin = PULL_MARGIN_FRACTION_OF_RAIL * input.pin.railV;
  if (needHigh) return t.highMinV + Math.max(0, Math.min(margin, (input.pin.railV - t.highMinV) / 2));
  return t.lowMaxV - Math.min(margin, t.lowMaxV / 2);
}

/** What to change when no external pull on the pin can hold the motor off. */
function alternatives(input: PowerOnInput, needHigh: boolean): string {
  if (input.driver == null) {
    return 'Choose a pin whose reset state is a pull-down, or put a buffer or driver with an input pull-down between pin and gate, then fit a gate-to-source pull-down.';
  }
  return needHigh
    ? 'Choose a non-inverting driver (or one whose input pull-up holds its output low), or a pin that resets with a pull-up; a stronger pull-up than the pin can drive low needs a buffer.'
    : 'Choose a driver with an internal input pull-down, or the inverting polarity with a pull-up, or a ' +
        'pin that resets with a pull-down; a stronger pull-down than the pin can drive high needs a buffer.';
}

function sizeFor(input: PowerOnInput, sources: readonly PullSource[], t: Thresholds, needHigh: boolean): PullResistorResult {
  const to = needHigh ? 'up' : 'down';
  const opposing = opposingEquivalent(sources, to);
  return sizePullResistor({
    pin: {
      internalPull: opposing == null ? 'none' : needHigh ? 'down' : 'up',
      internalPullOhms: opposing?.ohms ?? 0,
      internalPullV: opposing?.toV,
      internalPullTolerance: 0,
      railV: input.pin.railV,
      maxCurrentA: needHigh ? input.pin.sinkCurrentA : input.pin.sourceCurrentA,
      leakageA: input.pin.leakageA ?? DEFAULT_PIN_LEAKAGE_A,
    },
    external: { to, railV: needHigh ? input.pin.railV : 0, tolerance: RECOMMENDED_TOLERANCE },
    node: { mustBe: needHigh ? 'high' : 'low', limitV: holdLimitV(input, t, needHigh) },
    series: input.series ?? 'E12',
    ceilingOhms: input.ceilingOhms,
  });
}

export function recommendPull(input: PowerOnInput, sources: readonly PullSource[], t: Thresholds, walk: Walk): PullAdvice {
  const needHigh = input.driver?.params.inverting === true;
  const to = needHigh ? 'up' : 'down';
  const railV = needHigh ? input.pin.railV : 0;
  const sized = sizeFor(input, sources, t, needHigh);
  if (!sized.ok || sized.chosenOhms == null) {
    // The calculator's "pull the other way" would start the motor here, so the walk words its own reason.
    const reason =
      sized.maxOhms == null
        ? `a pull-${to} to ${fmt(railV)} V cannot take the node ${needHigh ? 'up to' : 'down to'} ${fmt(holdLimitV(input, t, needHigh))} ` +
          `V, where the ${input.driver == null ? 'gate' : 'driver input'} is surely ${needHigh ? 'high' : 'low'}.`
        : sized.notes[0];
    return {
      pull: null,
      rewalk: null,
      drawWhenHighA: 0,
      note: `No external pull-${to} on the pin can hold it: ${reason} ${alternatives(input, needHigh)}`,
    };
  }
  const fitted: PullSource = {
    label: `recommended pull-${to}`,
    direction: to,
    toV: { minV: railV, maxV: railV },
    ohms: band(sized.chosenOhms, RECOMMENDED_TOLERANCE),
    basis: `${describeKohm(sized.chosenOhms)} ±1 %`,
  };
  const rewalk = walk(input, [...sources, fitted]);
  if (rewalk.motorState !== 'off') {
    return {
      pull: null,
      rewalk,
      drawWhenHighA: 0,
      note: `A ${describeKohm(sized.chosenOhms)} pull-${to} would still leave the motor ${rewalk.motorState} at reset, so none is recommended. ${alternatives(input, needHigh)}`,
    };
  }
  const pull: RecommendedPull = { ...sized, to, railV, tolerance: RECOMMENDED_TOLERANCE };
  const drawWhenHighA = pullDrawCurrentA(pull, input.pin.railV);
  const where = input.driver == null ? 'gate node' : 'driver input';
  const draw =
    to === 'down'
      ? ` While the pin drives high it supplies up to ${fmt(drawWhenHighA * 1000)} mA into it.`
      : ` While the pin drives low it sinks up to ${fmt((sized.activeCurrentA ?? 0) * 1000)} mA from it.`;
  return {
    pull,
    rewalk,
    drawWhenHighA,
    note:
      `Fit a ${describeKohm(sized.chosenOhms)} ±1 % pull-${to} from the pin (${where}) to ${fmt(railV)} V: re-walked at ` +
      `every tolerance corner, it holds the node ${needHigh ? 'high' : 'low'} and the motor off through reset.${draw}`,
  };
}

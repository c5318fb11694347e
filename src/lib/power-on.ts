/**
 * Walks the reset state from the controller pin to the motor [docs/engineering.md §9 "Driver at reset"]:
 * pin → pull network (pin pull, external pull, the driver's own input pull, each at its tolerance extremes,
 * plus pin leakage) → driver input → driver output → gate → motor. The motor must stay off.
 */
import { fmt } from './checks.ts';
import type { DriverParams } from './domain/parts.ts';
import { driverInputThresholdsV, type SupplyRange } from './driver-checks.ts';
import type { ESeriesName } from './eseries.ts';
import {
  band,
  clampToPin,
  DEFAULT_PIN_LEAKAGE_A,
  describeSource,
  nodeRangeV,
  rangeText,
  type NodeRange,
  type PullSource,
} from './power-on-network.ts';
import { recommendPull, type RecommendedPull } from './power-on-advice.ts';
import type { InternalPull } from './pull-resistor.ts';

export { sizePullResistor } from './pull-resistor.ts';
export { pullDrawCurrentA, type RecommendedPull } from './power-on-advice.ts';
export { DEFAULT_PIN_LEAKAGE_A } from './power-on-network.ts';

export type LineState = 'low' | 'high' | 'undetermined';
export type MotorState = 'off' | 'on' | 'may-run';

export interface PowerOnStep {
  stage: 'pin' | 'pull-network' | 'driver' | 'gate' | 'motor';
  state: LineState | MotorState;
  /** Node voltage range where one applies (every tolerance corner and leakage). */
  minV: number | null;
  maxV: number | null;
  note: string;
}

export interface ResetDefault {
  pull: InternalPull;
  pullOhms: number;
  /** Fractional tolerance, e.g. 0.3 for ±30 %. */
  pullTolerance: number;
}

export interface PowerOnInput {
  pin: {
    railV: number;
    resetDefault: ResetDefault;
    sourceCurrentA: number;
    sinkCurrentA: number;
    /** Input leakage, A; absent = DEFAULT_PIN_LEAKAGE_A. */
    leakageA?: number;
    /** True for a pin without a protection diode to its supply (5 V-tolerant): no clamp above its rail. */
    tolerant?: boolean;
  };
  /** An external pull already on the board; tolerance absent = 1 %. */
  externalPull?: { to: 'up' | 'down'; ohms: number; railV: number; tolerance?: number } | null;
  /**
   * inputPullTolerance absent = DRIVER_PULL_TOLERANCE; inputPullRailV absent = the logic rail for an 'input-rail'
   * driver, else the driver's own supply range (where a single-supply driver's input pull-up goes).
   */
  driver?: { params: DriverParams; supply: SupplyRange; inputPullTolerance?: number; inputPullRailV?: number } | null;
  mosfet: { vgsThMinV: number };
  series?: ESeriesName;
  /** Largest pull resistor worth recommending; absent = 1 MΩ. */
  ceilingOhms?: number;
}

export interface PowerOnResult {
  steps: PowerOnStep[];
  /** True when the chain as entered lets the motor run at reset. */
  motorCanStart: boolean;
  motorStateAtReset: MotorState;
  note: string;
  /** A pull that the re-walk proved keeps the motor off; null when none is needed or none works. */
  recommendedPull: RecommendedPull | null;
  withRecommendedPull: { steps: PowerOnStep[]; motorState: MotorState } | null;
  /** What the pin supplies into a recommended pull-down while it drives high (0 without one). */
  pullDrawWhenHighA: number;
}

/** A gate held below half of VGS(th) min counts as surely off, leaving room for coupling through C_gd [judgement]. */
export const GATE_OFF_FRACTION_OF_VTH_MIN = 0.5;
/** External resistors are 1 % parts unless stated [docs/engineering.md §9]. */
export const DEFAULT_EXTERNAL_TOLERANCE = 0.01;
/** On-chip pull resistors spread widely with process and temperature; ±30 % when only a typical is stated [judgement]. */
export const DRIVER_PULL_TOLERANCE = 0.3;
/** A driver input pull whose value the datasheet omits is bracketed over this range [judgement]. */
export const UNSTATED_DRIVER_PULL_OHMS = { min: 10_000, max: 1_000_000 } as const;

export interface Thresholds {
  lowMaxV: number;
  highMinV: number;
}

/** Thresholds of the first stage after the pin: the driver input at its supply extremes, or the gate itself. */
export function firstStageThresholds(input: PowerOnInput): Thresholds {
  if (input.driver == null) {
    return { lowMaxV: GATE_OFF_FRACTION_OF_VTH_MIN * input.mosfet.vgsThMinV, highMinV: input.mosfet.vgsThMinV };
  }
  const { params, supply } = input.driver;
  const lowMaxV = driverInputThresholdsV(params, supply.minV, input.pin.railV).lowMaxV;
  const highMinV = driverInputThresholdsV(params, supply.maxV, input.pin.railV).highMinV;
  return { lowMaxV, highMinV };
}

function driverPullSource(input: PowerOnInput): PullSource | null {
  const d = input.driver;
  if (d == null || d.params.inputPull === 'none') return null;
  const stated = d.params.inputPullOhms;
  const tol = d.inputPullTolerance ?? DRIVER_PULL_TOLERANCE;
  const ohms = stated == null ? { ...UNSTATED_DRIVER_PULL_OHMS } : band(stated, tol);
  const basis =
    stated == null
      ? 'value not stated: bracketed 10 kΩ–1 MΩ [judgement]'
      : `${fmt(stated / 1000)} kΩ ±${fmt(tol * 100)} %${d.inputPullTolerance == null ? ' [judgement]' : ''}`;
  const upRail =
    d.inputPullRailV != null
      ? { minV: d.inputPullRailV, maxV: d.inputPullRailV }
      : d.params.inputLogic === 'input-rail'
        ? { minV: input.pin.railV, maxV: input.pin.railV }
        : { minV: d.supply.minV, maxV: d.supply.maxV };
  const toV = d.params.inputPull === 'up' ? upRail : { minV: 0, maxV: 0 };
  return { label: `driver input pull-${d.params.inputPull}`, direction: d.params.inputPull, toV, ohms, basis };
}

/** Every pull on the pin / driver-input node as entered. */
export function pullSources(input: PowerOnInput): PullSource[] {
  const sources: PullSource[] = [];
  const rd = input.pin.resetDefault;
  if (rd.pull !== 'none') {
    const v = rd.pull === 'up' ? input.pin.railV : 0;
    sources.push({
      label: `pin pull-${rd.pull}`,
      direction: rd.pull,
      toV: { minV: v, maxV: v },
      ohms: band(rd.pullOhms, rd.pullTolerance),
      basis: `${fmt(rd.pullOhms / 1000)} kΩ ±${fmt(rd.pullTolerance * 100)} %`,
    });
  }
  const ext = input.externalPull;
  if (ext != null) {
    const tol = ext.tolerance ?? DEFAULT_EXTERNAL_TOLERANCE;
    sources.push({
      label: `external pull-${ext.to}`,
      direction: ext.to,
      toV: { minV: ext.railV, maxV: ext.railV },
      ohms: band(ext.ohms, tol),
      basis: `${fmt(ext.ohms / 1000)} kΩ ±${fmt(tol * 100)} %`,
    });
  }
  const drv = driverPullSource(input);
  if (drv != null) sources.push(drv);
  return sources;
}

function classify(range: NodeRange | null, t: Thresholds): LineState {
  if (range == null) return 'undetermined';
  if (range.maxV <= t.lowMaxV) return 'low';
  if (range.minV >= t.highMinV) return 'high';
  return 'undetermined';
}

function driverOutput(params: DriverParams, inputState: LineState): LineState {
  if (inputState === 'undetermined') return 'undetermined';
  const flipped: LineState = inputState === 'high' ? 'low' : 'high';
  return params.inverting ? flipped : inputState;
}

const MOTOR_NOTE: Record<MotorState, string> = {
  off: 'The gate is held low through reset: the motor stays off.',
  on: 'The gate is driven high at reset: the motor starts as soon as power is applied.',
  'may-run': 'The gate is not defined at reset: the motor may start unexpectedly.',
};

function pinStep(input: PowerOnInput, leakageA: number): PowerOnStep {
  const rd = input.pin.resetDefault;
  const leak = `, leakage up to ${fmt(leakageA * 1e6)} µA`;
  return {
    stage: 'pin',
    state: rd.pull === 'none' ? 'undetermined' : rd.pull === 'up' ? 'high' : 'low',
    minV: null,
    maxV: null,
    note:
      rd.pull === 'none'
        ? `The pin floats at reset (input, no internal pull${leak}).`
        : `The pin is an input with a ${fmt(rd.pullOhms / 1000)} kΩ ±${fmt(rd.pullTolerance * 100)} % internal pull-${rd.pull} at reset${leak}.`,
  };
}

function networkStep(
  sources: readonly PullSource[],
  range: NodeRange | null,
  clamped: boolean,
  t: Thresholds,
  input: PowerOnInput,
): PowerOnStep {
  const state = classify(range, t);
  if (range == null) {
    return {
      stage: 'pull-network',
      state,
      minV: null,
      maxV: null,
      note: 'Nothing pulls the node (no pin pull, no external pull, no driver input pull): it floats, and leakage or pick-up decide its level.',
    };
  }
  const clampNote = clamped
    ? ` A pull above the pin's ${fmt(input.pin.railV)} V supply is clamped by the pin's protection diode near ${fmt(range.maxV)} V [mem]; a tolerant pin would not clamp.`
    : '';
  return {
    stage: 'pull-network',
    state,
    minV: range.minV,
    maxV: range.maxV,
    note:
      `${sources.map(describeSource).join('; ')}: the node sits at ${rangeText(range)} over every tolerance corner ` +
      `and leakage, against ${fmt(t.lowMaxV)} V (low) and ${fmt(t.highMinV)} V (high), so it is ${state}.${clampNote}`,
  };
}

/** One walk of the chain with a given set of pulls. */
export function walkChain(input: PowerOnInput, sources: readonly PullSource[]): { steps: PowerOnStep[]; motorState: MotorState } {
  const leakageA = input.pin.leakageA ?? DEFAULT_PIN_LEAKAGE_A;
  const raw = nodeRangeV(sources, leakageA);
  const { range, clamped } = raw == null ? { range: null, clamped: false } : clampToPin(raw, input.pin.railV, input.pin.tolerant === true);
  const t = firstStageThresholds(input);
  const net = networkStep(sources, range, clamped, t, input);
  const steps: PowerOnStep[] = [pinStep(input, leakageA), net];
  const d = input.driver;
  const gate = d == null ? (net.state as LineState) : driverOutput(d.params, net.state as LineState);
  if (d != null) {
    steps.push({
      stage: 'driver',
      state: gate,
      minV: null,
      maxV: null,
      note: `${d.params.inverting ? 'Inverting' : 'Non-inverting'} driver: input ${net.state}, so its output is ${gate} at reset.`,
    });
  }
  steps.push({
    stage: 'gate',
    state: gate,
    minV: null,
    maxV: null,
    note:
      d == null
        ? `The pin drives the gate directly: off only below ${fmt(t.lowMaxV)} V (half of VGS(th) min [judgement]).`
        : `Gate ${gate}, as the driver output.`,
  });
  const motorState: MotorState = gate === 'low' ? 'off' : gate === 'high' ? 'on' : 'may-run';
  steps.push({ stage: 'motor', state: motorState, minV: null, maxV: null, note: MOTOR_NOTE[motorState] });
  return { steps, motorState };
}

export function walkPowerOn(input: PowerOnInput): PowerOnResult {
  const sources = pullSources(input);
  const asEntered = walkChain(input, sources);
  const motorCanStart = asEntered.motorState !== 'off';
  const base = { steps: asEntered.steps, motorCanStart, motorStateAtReset: asEntered.motorState };
  if (!motorCanStart) return { ...base, note: MOTOR_NOTE.off, recommendedPull: null, withRecommendedPull: null, pullDrawWhenHighA: 0 };
  const advice = recommendPull(input, sources, firstStageThresholds(input), walkChain);
  return {
    ...base,
    note: `${MOTOR_NOTE[asEntered.motorState]} ${advice.note}`,
    recommendedPull: advice.pull,
    withRecommendedPull: advice.rewalk,
    pullDrawWhenHighA: advice.drawWhenHighA,
  };
}

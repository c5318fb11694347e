/**
 * Walks the reset state from the controller pin to the motor [domain.md §6]: the motor must stay off.
 */
import { fmt } from './checks.ts';
import type { DriverParams } from './domain/parts.ts';
import { driverInputThresholdsV, type SupplyRange } from './driver-checks.ts';
import type { ESeriesName } from './eseries.ts';
import { pullNodeVoltageV, sizePullResistor, type InternalPull, type PullResistorResult } from './pull-resistor.ts';

export { sizePullResistor } from './pull-resistor.ts';

export type LineState = 'low' | 'high' | 'undetermined';
export type MotorState = 'off' | 'on' | 'may-run';

export interface PowerOnStep {
  stage: 'pin' | 'pull-network' | 'driver' | 'gate' | 'motor';
  state: LineState | MotorState;
  /** Node voltage range where one applies (tolerance of the internal pull). */
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
  pin: { railV: number; resetDefault: ResetDefault; sourceCurrentA: number; sinkCurrentA: number };
  externalPull?: { to: 'up' | 'down'; ohms: number; railV: number } | null;
  driver?: { params: DriverParams; supply: SupplyRange } | null;
  mosfet: { vgsThMinV: number };
  series?: ESeriesName;
}

export interface RecommendedPull extends PullResistorResult {
  to: 'up' | 'down';
  railV: number;
}

export interface PowerOnResult {
  steps: PowerOnStep[];
  motorCanStart: boolean;
  note: string;
  recommendedPull: RecommendedPull | null;
}

/** A gate held below half of VGS(th) min counts as surely off, leaving room for coupling through C_gd [judgement]. */
export const GATE_OFF_FRACTION_OF_VTH_MIN = 0.5;

function nodeRangeV(input: PowerOnInput): { minV: number; maxV: number } | null {
  const { resetDefault: rd, railV } = input.pin;
  const ext = input.externalPull;
  const internalV = rd.pull === 'none' ? null : rd.pull === 'up' ? railV : 0;
  if (internalV == null && ext == null) return null;
  if (ext == null) return { minV: internalV as number, maxV: internalV as number };
  const ends = [1 - rd.pullTolerance, 1 + rd.pullTolerance].map((f) => pullNodeVoltageV(internalV, rd.pullOhms * f, ext.railV, ext.ohms));
  return { minV: Math.min(...ends), maxV: Math.max(...ends) };
}

function rangeText(range: { minV: number; maxV: number }): string {
  return range.minV === range.maxV ? `${fmt(range.minV)} V` : `${fmt(range.minV)}–${fmt(range.maxV)} V`;
}

function classify(range: { minV: number; maxV: number } | null, lowMaxV: number, highMinV: number): LineState {
  if (range == null) return 'undetermined';
  if (range.maxV <= lowMaxV) return 'low';
  if (range.minV >= highMinV) return 'high';
  return 'undetermined';
}

/** Thresholds of the first stage after the pin: the driver input, or the gate itself. */
function firstStageThresholds(input: PowerOnInput): { lowMaxV: number; highMinV: number } {
  if (input.driver == null) {
    return { lowMaxV: GATE_OFF_FRACTION_OF_VTH_MIN * input.mosfet.vgsThMinV, highMinV: input.mosfet.vgsThMinV };
  }
  const { params, supply } = input.driver;
  const lowMaxV = driverInputThresholdsV(params, supply.minV, input.pin.railV).lowMaxV;
  const highMinV = driverInputThresholdsV(params, supply.maxV, input.pin.railV).highMinV;
  return { lowMaxV, highMinV };
}

function driverOutput(params: DriverParams, inputState: LineState, floating: boolean): LineState {
  if (floating) {
    if (params.inputPull === 'none') return 'undetermined';
    const inputHigh = params.inputPull === 'up';
    return inputHigh !== params.inverting ? 'high' : 'low';
  }
  if (inputState === 'undetermined') return 'undetermined';
  const flipped: LineState = inputState === 'high' ? 'low' : 'high';
  return params.inverting ? flipped : inputState;
}

function recommendPull(input: PowerOnInput, needHigh: boolean, limits: { lowMaxV: number; highMinV: number }): RecommendedPull {
  const rd = input.pin.resetDefault;
  const to = needHigh ? 'up' : 'down';
  const railV = needHigh ? input.pin.railV : 0;
  const result = sizePullResistor({
    pin: { internalPull: rd.pull, internalPullOhms: rd.pullOhms * (1 - rd.pullTolerance), railV: input.pin.railV, maxCurrentA: needHigh ? input.pin.sinkCurrentA : input.pin.sourceCurrentA },
    external: { to, railV },
    node: { mustBe: needHigh ? 'high' : 'low', limitV: needHigh ? limits.highMinV : limits.lowMaxV },
    series: input.series ?? 'E12',
  });
  return { ...result, to, railV };
}

const MOTOR_NOTE: Record<MotorState, string> = {
  off: 'The gate is held low through reset: the motor stays off.',
  on: 'The gate is driven high at reset: the motor starts as soon as power is applied.',
  'may-run': 'The gate is not defined at reset: the motor may start unexpectedly.',
};

export function walkPowerOn(input: PowerOnInput): PowerOnResult {
  const rd = input.pin.resetDefault;
  const range = nodeRangeV(input);
  const limits = firstStageThresholds(input);
  const nodeState = classify(range, limits.lowMaxV, limits.highMinV);
  const steps: PowerOnStep[] = [
    { stage: 'pin', state: rd.pull === 'none' ? 'undetermined' : rd.pull === 'up' ? 'high' : 'low', minV: null, maxV: null,
      note: rd.pull === 'none' ? 'The pin floats at reset (input, no internal pull).' : `The pin is an input with a ${fmt(rd.pullOhms / 1000)} kΩ ±${fmt(rd.pullTolerance * 100)} % internal pull-${rd.pull} at reset.` },
    { stage: 'pull-network', state: nodeState, minV: range?.minV ?? null, maxV: range?.maxV ?? null,
      note: range == null ? 'Nothing defines the node: it floats.' : `The node sits at ${rangeText(range)} against thresholds ${fmt(limits.lowMaxV)} V (low) and ${fmt(limits.highMinV)} V (high).` },
  ];
  let gate: LineState = nodeState;
  if (input.driver != null) {
    gate = driverOutput(input.driver.params, nodeState, range == null);
    steps.push({ stage: 'driver', state: gate, minV: null, maxV: null,
      note: `${input.driver.params.inverting ? 'Inverting' : 'Non-inverting'} driver: its output is ${gate} at reset${range == null ? ' (its own input default with the input open)' : ''}.` });
  }
  steps.push({ stage: 'gate', state: gate, minV: null, maxV: null, note: `Gate ${gate}.` });
  const motor: MotorState = gate === 'low' ? 'off' : gate === 'high' ? 'on' : 'may-run';
  steps.push({ stage: 'motor', state: motor, minV: null, maxV: null, note: MOTOR_NOTE[motor] });
  const motorCanStart = motor !== 'off';
  const recommendedPull = motorCanStart ? recommendPull(input, input.driver?.params.inverting === true, limits) : null;
  const fix = recommendedPull?.ok
    ? ` Fit a ${fmt((recommendedPull.chosenOhms ?? 0) / 1000)} kΩ pull-${recommendedPull.to} on the pin to hold it ${recommendedPull.to === 'up' ? 'high' : 'low'} through reset.`
    : recommendedPull ? ` ${recommendedPull.notes[0]}` : '';
  return { steps, motorCanStart, note: MOTOR_NOTE[motor] + fix, recommendedPull };
}

/**
 * Sizing an external pull resistor against a pin's internal pull [domain.md §6];
 * the pure core of POST /api/calc/pull-resistor [api-contract.md].
 */
import { fmt } from './checks.ts';
import { roundDownToSeries, roundUpToSeries, type ESeriesName } from './eseries.ts';

export type InternalPull = 'up' | 'down' | 'none';

export interface PullResistorRequest {
  /** internalPullOhms is the worst case (datasheet minimum) internal pull resistance. */
  pin: { internalPull: InternalPull; internalPullOhms: number; railV: number; maxCurrentA: number };
  external: { to: 'up' | 'down'; railV: number };
  node: { mustBe: 'low' | 'high'; limitV: number };
  series: ESeriesName;
}

export interface PullResistorResult {
  maxOhms: number | null;
  minOhms: number | null;
  chosenOhms: number | null;
  nodeV: number | null;
  activeCurrentA: number | null;
  ok: boolean;
  notes: string[];
}

/** With nothing fighting the external pull, leakage sets the ceiling; 100 kΩ is the usual choice [practice]. */
export const PRACTICAL_MAX_PULL_OHMS = 100_000;

/** V_node = (V_int·R_ext + V_ext·R_int)/(R_int + R_ext) [domain.md §6]; no internal pull leaves V_ext. */
export function pullNodeVoltageV(internalV: number | null, internalOhms: number, externalV: number, externalOhms: number): number {
  if (internalV == null) return externalV;
  return (internalV * externalOhms + externalV * internalOhms) / (internalOhms + externalOhms);
}

function internalPullV(pin: PullResistorRequest['pin']): number | null {
  if (pin.internalPull === 'none') return null;
  return pin.internalPull === 'up' ? pin.railV : 0;
}

function holds(voltageV: number, node: PullResistorRequest['node']): boolean {
  return node.mustBe === 'low' ? voltageV <= node.limitV : voltageV >= node.limitV;
}

/**
 * Largest R_ext that holds the node: R_int·|V_ext − V_lim|/|V_lim − V_int| (pull-down: R_int·V_lim/(V_pull − V_lim);
 * pull-up: R_int·(V_ext − VIH)/VIH) [domain.md §6]. Null when no value can hold it.
 */
export function maxPullOhms(req: PullResistorRequest): number | null {
  const internalV = internalPullV(req.pin);
  if (!holds(req.external.railV, req.node)) return null;
  if (internalV == null || holds(internalV, req.node)) return PRACTICAL_MAX_PULL_OHMS;
  return (req.pin.internalPullOhms * Math.abs(req.external.railV - req.node.limitV)) / Math.abs(req.node.limitV - internalV);
}

/** The level the pin drives when it overrides the pull: high when the node rests low, and the reverse. */
function activePinV(req: PullResistorRequest): number {
  return req.node.mustBe === 'low' ? req.pin.railV : 0;
}

/** Smallest R_ext the pin can drive: |V_pin − V_ext|/I_max [domain.md §6]. */
export function minPullOhms(req: PullResistorRequest): number {
  const driveV = Math.abs(activePinV(req) - req.external.railV);
  if (driveV === 0) return 0;
  return req.pin.maxCurrentA > 0 ? driveV / req.pin.maxCurrentA : Infinity;
}

function toleranceNotes(req: PullResistorRequest): string[] {
  const notes: string[] = [];
  if (req.external.to === 'up' && req.external.railV > req.pin.railV) {
    notes.push(`The pull-up goes to ${fmt(req.external.railV)} V, above the pin's ${fmt(req.pin.railV)} V supply: use a ${fmt(req.external.railV)} V-tolerant or open-drain pin.`);
  }
  if (req.pin.internalPull !== 'none') {
    notes.push(`Sized against the internal pull at ${fmt(req.pin.internalPullOhms / 1000)} kΩ; enter the datasheet minimum, not the typical value.`);
  }
  return notes;
}

/** Chooses the largest standard value that holds the node and that the pin can still drive. */
export function sizePullResistor(req: PullResistorRequest): PullResistorResult {
  const notes = toleranceNotes(req);
  const maxRawOhms = maxPullOhms(req);
  const minRawOhms = minPullOhms(req);
  const maxOhms = maxRawOhms == null ? null : roundDownToSeries(maxRawOhms, req.series);
  const minOhms = minRawOhms === 0 ? 0 : roundUpToSeries(minRawOhms, req.series);
  const fail = (reason: string): PullResistorResult => ({ maxOhms, minOhms, chosenOhms: null, nodeV: null, activeCurrentA: null, ok: false, notes: [reason, ...notes] });
  if (maxRawOhms == null) {
    return fail(`A pull-${req.external.to} to ${fmt(req.external.railV)} V cannot hold the node ${req.node.mustBe} against ${fmt(req.node.limitV)} V: pull the other way.`);
  }
  if (maxOhms == null || minOhms == null || maxOhms < minOhms) {
    return fail(`No ${req.series} value fits: holding the node needs at most ${fmt(maxRawOhms)} Ω but the pin can only drive ${fmt(minRawOhms)} Ω or more; use a stronger driver stage or a pin with a weaker internal pull.`);
  }
  const chosenOhms = maxOhms;
  const nodeV = pullNodeVoltageV(internalPullV(req.pin), req.pin.internalPullOhms, req.external.railV, chosenOhms);
  const activeCurrentA = Math.abs(activePinV(req) - req.external.railV) / chosenOhms;
  return { maxOhms, minOhms, chosenOhms, nodeV, activeCurrentA, ok: true, notes };
}

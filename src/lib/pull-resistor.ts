/**
 * Sizing an external pull resistor against a pin's internal pull, with tolerances, pin leakage and a
 * practical ceiling [docs/engineering.md §9 "Pull resistor, with tolerances"]; the pure core of
 * POST /api/calc/pull-resistor [api-contract.md, "Extensions"].
 *
 * Closed form. Let s = +1 when the node must stay low (≤ V_lim) and −1 when it must stay high (≥ V_lim),
 * d_ext = s·(V_lim − V_ext) (> 0: the external rail is on the right side of the limit) and
 * d_int = s·(V_int − V_lim) (> 0: the internal pull opposes). Leakage I pushes the node the wrong way by
 * I·(R_int‖R_ext), so the worst node is V = (V_int·R_e + V_ext·R_i)/(R_i + R_e) + s·I·R_i·R_e/(R_i + R_e).
 * Requiring s·(V − V_lim) ≤ 0 and multiplying by (R_i + R_e):
 *   R_e·(d_int + I·R_i) ≤ R_i·d_ext  ⇒  R_e ≤ R_i·d_ext/(d_int + I·R_i)      (when d_int + I·R_i > 0)
 *   no internal pull:  V = V_ext + s·I·R_e  ⇒  R_e ≤ d_ext/I                   (when I > 0)
 * otherwise nothing bounds R_e. R_e is the external resistor at +tol, so R_ext,max = R_e,max/(1 + tol_ext);
 * R_i is taken at both tolerance extremes R_int·(1 ∓ tol_int) and the smaller bound kept (the node is
 * monotonic in each resistance, so the corners are the extremes: an opposing pull is worst at −tol, a
 * helping one at +tol). The answer is capped at the practical ceiling, then rounded DOWN to the series.
 * With I = 0 and tolerances 0 this is docs/engineering.md §9: R_int·V_lim/(V_pull − V_lim) and R_int·(V_ext − VIH)/VIH.
 * Minimum: the pin driving the other level must carry |V_pin − V_ext|/(R_ext·(1 − tol_ext)) ≤ I_max,
 * so R_ext,min = |V_pin − V_ext|/(I_max·(1 − tol_ext)), rounded UP.
 */
import { fmt } from './checks.ts';
import { roundDownToSeries, roundUpToSeries, type ESeriesName } from './eseries.ts';

export type InternalPull = 'up' | 'down' | 'none';

export interface PullResistorRequest {
  pin: {
    internalPull: InternalPull;
    /** Typical internal pull resistance (or the datasheet minimum with internalPullTolerance 0). */
    internalPullOhms: number;
    railV: number;
    maxCurrentA: number;
    /** Fraction, e.g. 0.3 for ±30 %; absent = 0 (the calculator's old answers). */
    internalPullTolerance?: number;
    /** Pin input leakage in A, pushing the node the wrong way; absent = 0. */
    leakageA?: number;
    /**
     * Where the internal pull goes, when not the pin's rail (up) or 0 V (down). The power-on walk uses it for
     * the Thevenin equivalent of several opposing pulls; not part of the HTTP contract.
     */
    internalPullV?: number;
  };
  external: { to: 'up' | 'down'; railV: number; /** Fraction, absent = 0. */ tolerance?: number };
  node: { mustBe: 'low' | 'high'; limitV: number };
  series: ESeriesName;
  /** Largest resistance worth fitting; absent = PRACTICAL_MAX_PULL_OHMS. */
  ceilingOhms?: number;
}

export interface PullResistorResult {
  maxOhms: number | null;
  minOhms: number | null;
  chosenOhms: number | null;
  /** Node voltage with the chosen value at the worst tolerance corner and leakage. */
  nodeV: number | null;
  /** Pin current when it drives against the chosen value at −tol (the highest it gets). */
  activeCurrentA: number | null;
  ok: boolean;
  notes: string[];
}

/** Above about 1 MΩ leakage, contamination and pick-up decide the node, not the resistor [practice, docs/engineering.md §9]. */
export const PRACTICAL_MAX_PULL_OHMS = 1_000_000;

/**
 * Worst-case current through a pull resistor with a voltage across it: at the low end of its tolerance,
 * I = |V|/(R·(1 − tol)). The one formula for every pull current (the pin driving against a pull, a gate
 * pull-down's draw on the drive budget), so no two places judge the same resistor differently.
 */
export function worstPullCurrentA(acrossV: number, nominalOhms: number, tolerance = 0): number {
  return Math.abs(acrossV) / (nominalOhms * (1 - tolerance));
}

/** V_node = (V_int·R_ext + V_ext·R_int)/(R_int + R_ext) [docs/engineering.md §9]; no internal pull leaves V_ext. */
export function pullNodeVoltageV(internalV: number | null, internalOhms: number, externalV: number, externalOhms: number): number {
  if (internalV == null) return externalV;
  return (internalV * externalOhms + externalV * internalOhms) / (internalOhms + externalOhms);
}

function internalPullV(pin: PullResistorRequest['pin']): number | null {
  if (pin.internalPull === 'none') return null;
  if (pin.internalPullV != null) return pin.internalPullV;
  return pin.internalPull === 'up' ? pin.railV : 0;
}

const sense = (node: PullResistorRequest['node']): number => (node.mustBe === 'low' ? 1 : -1);

function internalExtremesOhms(pin: PullResistorRequest['pin']): number[] {
  const tol = pin.internalPullTolerance ?? 0;
  return [pin.internalPullOhms * (1 - tol), pin.internalPullOhms * (1 + tol)];
}

/** R_e bound for one internal resistance (see the file comment); Infinity when nothing bounds it. */
function holdingBoundOhms(req: PullResistorRequest, internalOhms: number | null): number {
  const s = sense(req.node);
  const leakA = req.pin.leakageA ?? 0;
  const dExt = s * (req.node.limitV - req.external.railV);
  const internalV = internalPullV(req.pin);
  if (internalV == null || internalOhms == null) return leakA > 0 ? dExt / leakA : Infinity;
  const denominator = s * (internalV - req.node.limitV) + leakA * internalOhms;
  return denominator > 0 ? (internalOhms * dExt) / denominator : Infinity;
}

/**
 * Largest R_ext (nominal, before the ceiling and rounding) that holds the node at every tolerance corner
 * with leakage. Infinity when nothing bounds it; null when no value can hold it (wrong direction).
 */
export function maxPullOhms(req: PullResistorRequest): number | null {
  if (sense(req.node) * (req.node.limitV - req.external.railV) <= 0) return null;
  const corners = internalPullV(req.pin) == null ? [null] : internalExtremesOhms(req.pin);
  const boundOhms = Math.min(...corners.map((r) => holdingBoundOhms(req, r)));
  return boundOhms / (1 + (req.external.tolerance ?? 0));
}

/** The level the pin drives when it overrides the pull: high when the node rests low, and the reverse. */
function activePinV(req: PullResistorRequest): number {
  return req.node.mustBe === 'low' ? req.pin.railV : 0;
}

/** Smallest R_ext the pin can drive at −tol: |V_pin − V_ext|/(I_max·(1 − tol)) [docs/engineering.md §9]. */
export function minPullOhms(req: PullResistorRequest): number {
  const driveV = Math.abs(activePinV(req) - req.external.railV);
  if (driveV === 0) return 0;
  return req.pin.maxCurrentA > 0 ? driveV / (req.pin.maxCurrentA * (1 - (req.external.tolerance ?? 0))) : Infinity;
}

/** Worst node voltage with R_ext fitted: every tolerance corner, leakage the unfavourable way. */
export function worstNodeV(req: PullResistorRequest, externalOhms: number): number {
  const s = sense(req.node);
  const leakA = req.pin.leakageA ?? 0;
  const tolExt = req.external.tolerance ?? 0;
  const internalV = internalPullV(req.pin);
  const values: number[] = [];
  for (const re of [externalOhms * (1 - tolExt), externalOhms * (1 + tolExt)]) {
    if (internalV == null) values.push(req.external.railV + s * leakA * re);
    else
      for (const ri of internalExtremesOhms(req.pin))
        values.push(pullNodeVoltageV(internalV, ri, req.external.railV, re) + (s * leakA * ri * re) / (ri + re));
  }
  return s > 0 ? Math.max(...values) : Math.min(...values);
}

function requestNotes(req: PullResistorRequest): string[] {
  const notes: string[] = [];
  if (req.external.to === 'up' && req.external.railV > req.pin.railV) {
    notes.push(
      `The pull-up goes to ${fmt(req.external.railV)} V, above the pin's ${fmt(req.pin.railV)} V supply: use a ${fmt(req.external.railV)} V-tolerant or open-drain pin.`,
    );
  }
  const tolInt = req.pin.internalPullTolerance ?? 0;
  if (req.pin.internalPull !== 'none' && req.pin.internalPullV != null) {
    notes.push(
      `Sized against the opposing pull(s) at their strongest, together equal to ${fmt(req.pin.internalPullOhms / 1000)} kΩ to ${fmt(req.pin.internalPullV)} V.`,
    );
  } else if (req.pin.internalPull !== 'none') {
    notes.push(
      tolInt > 0
        ? `Sized against the internal pull at ${fmt((req.pin.internalPullOhms * (1 - tolInt)) / 1000)}–${fmt((req.pin.internalPullOhms * (1 + tolInt)) / 1000)} ` +
            `kΩ (${fmt(req.pin.internalPullOhms / 1000)} kΩ ±${fmt(tolInt * 100)} %).`
        : `Sized against the internal pull at ${fmt(req.pin.internalPullOhms / 1000)} kΩ with no tolerance: enter the typical value with its tolerance, or the datasheet minimum.`,
    );
  }
  return notes;
}

function worstCaseNote(req: PullResistorRequest, nodeV: number): string {
  const tolExt = req.external.tolerance ?? 0;
  const leakA = req.pin.leakageA ?? 0;
  const conditions =
    tolExt === 0 && leakA === 0 && (req.pin.internalPullTolerance ?? 0) === 0
      ? 'no tolerance or leakage entered, so this is the nominal divider'
      : `worst corner: internal pull at its tolerance extreme, the resistor at ±${fmt(tolExt * 100)} %, ${fmt(leakA * 1e6)} µA leakage pushing toward the threshold`;
  return `The node sits at ${fmt(nodeV)} V (${conditions}); it must stay ${req.node.mustBe === 'low' ? 'at or below' : 'at or above'} ${fmt(req.node.limitV)} V.`;
}

function fitFailure(req: PullResistorRequest, maxRawOhms: number, minRawOhms: number): string {
  return (
    `No ${req.series} value fits: holding the node needs at most ${fmt(maxRawOhms)} Ω but the pin can only ` +
    `drive ${fmt(minRawOhms)} Ω or more; use a stronger driver stage or a pin with a weaker internal pull.`
  );
}

/** Chooses the largest standard value that holds the node at its worst corner and that the pin can still drive. */
export function sizePullResistor(req: PullResistorRequest): PullResistorResult {
  const notes = requestNotes(req);
  const ceilingOhms = req.ceilingOhms ?? PRACTICAL_MAX_PULL_OHMS;
  const holdOhms = maxPullOhms(req);
  const maxRawOhms = holdOhms == null ? null : Math.min(holdOhms, ceilingOhms);
  const minRawOhms = minPullOhms(req);
  const maxOhms = maxRawOhms == null ? null : roundDownToSeries(maxRawOhms, req.series);
  const minOhms = minRawOhms === 0 ? 0 : roundUpToSeries(minRawOhms, req.series);
  const fail = (reason: string): PullResistorResult => ({
    maxOhms,
    minOhms,
    chosenOhms: null,
    nodeV: null,
    activeCurrentA: null,
    ok: false,
    notes: [reason, ...notes],
  });
  if (holdOhms == null || maxRawOhms == null) {
    return fail(
      `A pull-${req.external.to} to ${fmt(req.external.railV)} V cannot hold the node ${req.node.mustBe} against ${fmt(req.node.limitV)} V: pull the other way.`,
    );
  }
  if (maxOhms == null || minOhms == null || maxOhms < minOhms) return fail(fitFailure(req, maxRawOhms, minRawOhms));
  const chosenOhms = maxOhms;
  const nodeV = worstNodeV(req, chosenOhms);
  const activeCurrentA = worstPullCurrentA(activePinV(req) - req.external.railV, chosenOhms, req.external.tolerance ?? 0);
  if (holdOhms > ceilingOhms) {
    notes.push(
      `Capped at the practical ceiling of ${fmt(ceilingOhms / 1000)} kΩ: above it leakage and pick-up, not the resistor, set the node.`,
    );
  }
  return { maxOhms, minOhms, chosenOhms, nodeV, activeCurrentA, ok: true, notes: [worstCaseNote(req, nodeV), ...notes] };
}

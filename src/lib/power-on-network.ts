/**
 * The pull network on the pin / driver-input node at reset [docs/engineering.md §9 "Driver at reset"]:
 * every resistive pull with its tolerance band, plus pin leakage, and the node's voltage range.
 */
import { fmt } from './checks.ts';

/** One pull on the node: a resistance band to a voltage band (the driver's supply may be a range). */
export interface PullSource {
  label: string;
  direction: 'up' | 'down';
  toV: { minV: number; maxV: number };
  ohms: { min: number; max: number };
  /** How the band was chosen, for the step note (e.g. "±30 % [judgement]"). */
  basis: string;
}

export interface NodeRange {
  minV: number;
  maxV: number;
}

/**
 * Node range over every corner: V = (Σ V_k/R_k + I)/(Σ 1/R_k), I = ±I_leak (superposition of the pulls and
 * the leakage source). V is monotonic in each V_k, in each R_k (it moves toward V_k as R_k falls) and in I,
 * so the corners hold the extremes. Null when nothing pulls the node: it floats.
 */
export function nodeRangeV(sources: readonly PullSource[], leakageA: number): NodeRange | null {
  if (sources.length === 0) return null;
  let corners: { currentA: number; conductanceS: number }[] = [-leakageA, leakageA].map((i) => ({ currentA: i, conductanceS: 0 }));
  for (const s of sources) {
    const next: typeof corners = [];
    for (const c of corners) {
      for (const v of [s.toV.minV, s.toV.maxV]) {
        for (const r of [s.ohms.min, s.ohms.max]) next.push({ currentA: c.currentA + v / r, conductanceS: c.conductanceS + 1 / r });
      }
    }
    corners = next;
  }
  const volts = corners.map((c) => c.currentA / c.conductanceS);
  return { minV: Math.min(...volts), maxV: Math.max(...volts) };
}

/** Typical CMOS input leakage ceiling on controller datasheets [mem, docs/engineering.md §9]. */
export const DEFAULT_PIN_LEAKAGE_A = 1e-6;

/** A pin's protection diodes clamp the node about 0.3 V beyond its supply and ground [mem]. */
export const PIN_CLAMP_ABOVE_RAIL_V = 0.3;

/**
 * The node as the pin's protection diodes leave it: at most rail + 0.3 V (not on a tolerant pin) and at least
 * −0.3 V (the diode to ground, on every pin). `clamped` reports the upper clamp, the one a note must explain.
 */
export function clampToPin(range: NodeRange, pinRailV: number, tolerant: boolean): { range: NodeRange; clamped: boolean } {
  const highV = tolerant ? Infinity : pinRailV + PIN_CLAMP_ABOVE_RAIL_V;
  const lowV = -PIN_CLAMP_ABOVE_RAIL_V;
  const clip = (v: number): number => Math.min(highV, Math.max(lowV, v));
  return { range: { minV: clip(range.minV), maxV: clip(range.maxV) }, clamped: range.maxV > highV };
}

/** Band of a resistor at ±tol. */
export function band(ohms: number, tolerance: number): { min: number; max: number } {
  return { min: ohms * (1 - tolerance), max: ohms * (1 + tolerance) };
}

function kohm(ohms: number): string {
  return ohms >= 1e6 ? `${fmt(ohms / 1e6)} MΩ` : `${fmt(ohms / 1000)} kΩ`;
}

function voltText(v: { minV: number; maxV: number }): string {
  return v.minV === v.maxV ? `${fmt(v.minV)} V` : `${fmt(v.minV)}–${fmt(v.maxV)} V`;
}

export function rangeText(range: NodeRange): string {
  return voltText(range);
}

/** "pin pull-up 28–52 kΩ (40 kΩ ±30 %) to 3.3 V" */
export function describeSource(s: PullSource): string {
  return `${s.label} ${kohm(s.ohms.min)}–${kohm(s.ohms.max)} (${s.basis}) to ${voltText(s.toV)}`;
}

export function describeKohm(ohms: number): string {
  return kohm(ohms);
}

/**
 * Thevenin equivalent of the pulls that oppose a recommended pull, each at its strongest (lowest R) and at its
 * worst rail (highest for pulls up, lowest for pulls down): G = Σ1/R_min, V_th = Σ(V_k/R_min)/G.
 */
export function opposingEquivalent(sources: readonly PullSource[], against: 'up' | 'down'): { ohms: number; toV: number } | null {
  const opposing = sources.filter((s) => s.direction !== against);
  if (opposing.length === 0) return null;
  const conductanceS = opposing.reduce((sum, s) => sum + 1 / s.ohms.min, 0);
  const currentA = opposing.reduce((sum, s) => sum + (s.direction === 'up' ? s.toV.maxV : s.toV.minV) / s.ohms.min, 0);
  return { ohms: 1 / conductanceS, toV: currentA / conductanceS };
}

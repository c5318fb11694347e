/**
 * Chart geometry shared by the SVG charts in the browser and the vector drawings in the report PDF:
 * "nice" axis ticks and linear scales. Pure.
 */
import { sig, tidy } from './units.ts';
export interface Scale {
  (value: number): number;
  domain: [number, number];
  range: [number, number];
}

export function linearScale(domain: [number, number], range: [number, number]): Scale {
  const [d0, d1] = domain;
  const [r0, r1] = range;
  const span = d1 - d0 || 1;
  const f = ((v: number) => r0 + ((v - d0) / span) * (r1 - r0)) as Scale;
  f.domain = domain;
  f.range = range;
  return f;
}

/** Step of 1, 2 or 5 × 10^k near `count` intervals: Heckbert's "nice numbers" rounding (Graphics Gems, 1990). */
export function niceStep(min: number, max: number, count = 5): number {
  const raw = Math.abs(max - min) / Math.max(1, count);
  if (!(raw > 0) || !Number.isFinite(raw)) return 1;
  const power = 10 ** Math.floor(Math.log10(raw));
  const fraction = raw / power;
  const nice = fraction < 1.5 ? 1 : fraction < 3 ? 2 : fraction < 7 ? 5 : 10;
  return nice * power;
}

/** Ticks covering [min, max] on a nice step; the returned domain is widened to whole steps. */
export function niceTicks(min: number, max: number, count = 5): { ticks: number[]; domain: [number, number] } {
  if (min === max) max = min + 1;
  const step = niceStep(min, max, count);
  const lo = Math.floor(min / step + 1e-9) * step;
  const hi = Math.ceil(max / step - 1e-9) * step;
  const ticks: number[] = [];
  for (let v = lo; v <= hi + step * 1e-6; v += step) ticks.push(tidy(v));
  return { ticks, domain: [lo, hi] };
}

/** Short tick label: trims float noise, uses k for thousands. */
export function tickLabel(value: number): string {
  const abs = Math.abs(value);
  if (abs >= 10_000) return `${sig(value / 1000, 4)}k`;
  return sig(value, 4);
}

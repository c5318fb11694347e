/**
 * Unit conversions for torque and speed, and a display formatter with SI prefixes.
 * The one place in Stallpoint that knows conversion factors; everything else works in SI.
 */

/** Standard acceleration of gravity, exact by definition [SI Brochure]. */
export const STANDARD_GRAVITY_MS2 = 9.80665;
/** Avoirdupois ounce, exact by definition (international yard and pound agreement). */
const OUNCE_KG = 0.028349523125;
const INCH_M = 0.0254;

export const TORQUE_UNITS = ['N·m', 'mN·m', 'g·cm', 'kgf·cm', 'oz·in'] as const;
export type TorqueUnit = (typeof TORQUE_UNITS)[number];

/** Newton-metres per one unit. Gram-force and ounce-force use g_n; datasheets write g·cm for gf·cm. */
const NM_PER_UNIT: Record<TorqueUnit, number> = {
  'N·m': 1,
  'mN·m': 1e-3,
  'g·cm': 1e-3 * STANDARD_GRAVITY_MS2 * 1e-2,
  'kgf·cm': STANDARD_GRAVITY_MS2 * 1e-2,
  'oz·in': OUNCE_KG * STANDARD_GRAVITY_MS2 * INCH_M,
};

export function torqueToNm(value: number, unit: TorqueUnit): number {
  return value * NM_PER_UNIT[unit];
}

export function torqueFromNm(torqueNm: number, unit: TorqueUnit): number {
  return torqueNm / NM_PER_UNIT[unit];
}

export function convertTorque(value: number, from: TorqueUnit, to: TorqueUnit): number {
  return torqueFromNm(torqueToNm(value, from), to);
}

/** One revolution is 2π rad, one minute 60 s: 1 rpm = π/30 rad/s. */
export function rpmToRadPerS(speedRpm: number): number {
  return (speedRpm * Math.PI) / 30;
}

export function radPerSToRpm(speedRadPerS: number): number {
  return (speedRadPerS * 30) / Math.PI;
}

const SI_PREFIXES: readonly { exponent: number; symbol: string }[] = [
  { exponent: -9, symbol: 'n' },
  { exponent: -6, symbol: 'µ' },
  { exponent: -3, symbol: 'm' },
  { exponent: 0, symbol: '' },
  { exponent: 3, symbol: 'k' },
  { exponent: 6, symbol: 'M' },
];

/** Rounds to `digits` significant digits first, so 999.96 becomes 1.00 k rather than 1000 . */
function roundSignificant(value: number, digits: number): number {
  return Number(value.toPrecision(digits));
}

function prefixFor(magnitude: number): { exponent: number; symbol: string } {
  const engineeringExponent = Math.floor(Math.log10(magnitude) / 3) * 3;
  const lowest = SI_PREFIXES[0];
  const highest = SI_PREFIXES[SI_PREFIXES.length - 1];
  if (engineeringExponent <= lowest.exponent) return lowest;
  if (engineeringExponent >= highest.exponent) return highest;
  return SI_PREFIXES.find((p) => p.exponent === engineeringExponent) ?? SI_PREFIXES[3];
}

/**
 * Formats an SI value with an engineering prefix and `digits` significant digits,
 * e.g. formatSi(0.0033953, 'N·m', 3) → "3.40 mN·m". Non-finite values print as "—".
 */
export function formatSi(value: number, unit: string, digits = 3): string {
  if (!Number.isFinite(value)) return `— ${unit}`;
  const safeDigits = Math.min(Math.max(Math.round(digits), 1), 15);
  if (value === 0) return `${(0).toPrecision(safeDigits)} ${unit}`;
  const rounded = roundSignificant(value, safeDigits);
  const prefix = prefixFor(Math.abs(rounded));
  const scaled = rounded / 10 ** prefix.exponent;
  // Beyond the largest prefix toPrecision would switch to exponent notation; print whole units instead.
  const text = Math.abs(scaled) >= 10 ** safeDigits ? scaled.toFixed(0) : scaled.toPrecision(safeDigits);
  return `${text} ${prefix.symbol}${unit}`;
}

/** A resistor value as people write it: "6.8 kΩ", "820 Ω" (three significant figures, no trailing zeros). */
export function formatOhms(ohm: number): string {
  return ohm >= 1000 ? `${Number((ohm / 1000).toPrecision(3))} kΩ` : `${Number(ohm.toPrecision(3))} Ω`;
}

/*
 * The number formatter family: every number a person reads goes through one of these (islands, pages,
 * the report, the CSVs). "—" stands for a value that is missing or not finite.
 */

/** `digits` significant digits without trailing zeros: sig(0.0012345) → "0.00123", sig(1500) → "1500". */
export function sig(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  return String(Number(value.toPrecision(Math.min(Math.max(Math.round(digits), 1), 15))));
}

/** A fixed number of decimals: fixed(2.345, 2) → "2.35" (also for SVG coordinates). */
export function fixed(value: number | null | undefined, decimals: number): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  return value.toFixed(decimals);
}

/** A value with its unit at `digits` significant digits: quantity(0.48, 'V') → "0.48 V". */
export function quantity(value: number | null | undefined, unit: string, digits = 3): string {
  const text = sig(value, digits);
  return text === '—' ? text : `${text} ${unit}`.trim();
}

/** Units that take SI prefixes (µs, mA, kΩ); the rest print as plain numbers with their unit. */
const PREFIXED_UNITS = new Set(['V', 'A', 's', 'W', 'Ω', 'Hz', 'J', 'H', 'F', 'C', 'N·m']);
/** Units the engines state in a prefixed form: rescaled to the SI unit so 2200 ns reads "2.2 µs". */
const RESCALED_UNITS: Readonly<Record<string, [number, string]>> = { ns: [1e-9, 's'], nC: [1e-9, 'C'] };

/** "85.0 mΩ" → "85 mΩ", "1.50 A" → "1.5 A": significant digits kept, trailing zeros dropped. */
function trimZeros(text: string): string {
  return text.replace(/(\.\d*?)0+(?= )/, '$1').replace(/\.(?= )/, '');
}

/**
 * A measured or limiting value as an engineer writes it: SI prefix for the prefixable units, trailing
 * zeros dropped (measure(1.54e-8, 's') → "15.4 ns", measure(0.085, 'Ω') → "85 mΩ", measure(2200, 'ns') →
 * "2.2 µs"), plain number otherwise (measure(61.2, '°C') → "61.2 °C"), scientific below 0.01 for
 * unprefixed units (measure(0.000943, 'A²s') → "9.43 × 10⁻⁴ A²s").
 */
export function measure(value: number | null | undefined, unit: string, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const rescaled = RESCALED_UNITS[unit];
  if (rescaled && value !== 0) return trimZeros(formatSi(value * rescaled[0], rescaled[1], digits));
  if (PREFIXED_UNITS.has(unit) && value !== 0) return trimZeros(formatSi(value, unit, digits));
  const text = value !== 0 && Math.abs(value) < 0.01 ? scientific(value, digits) : sig(value, digits);
  return unit ? `${text} ${unit}` : text;
}

const SUPERSCRIPT: Readonly<Record<string, string>> = {
  '-': '⁻',
  '0': '⁰',
  '1': '¹',
  '2': '²',
  '3': '³',
  '4': '⁴',
  '5': '⁵',
  '6': '⁶',
  '7': '⁷',
  '8': '⁸',
  '9': '⁹',
};

/** Scientific notation as printed in datasheets: scientific(0.000943) → "9.43 × 10⁻⁴". */
export function scientific(value: number, digits = 3): string {
  const [mantissa, exponent] = value.toExponential(Math.min(Math.max(Math.round(digits), 1), 15) - 1).split('e');
  const power = String(Number(exponent)).replace(/./g, (ch) => SUPERSCRIPT[ch] ?? ch);
  return `${mantissa} × 10${power}`;
}

/** A fraction as a percentage: percent(0.256) → "26 %", percent(0.256, 1) → "25.6 %". */
export function percent(fraction: number | null | undefined, decimals = 0): string {
  if (fraction === null || fraction === undefined || !Number.isFinite(fraction)) return '—';
  return `${(fraction * 100).toFixed(decimals)} %`;
}

/** A unit price: four decimals below 1, two above ("0.0420 EUR", "1.35 EUR"). */
export function price(amount: number | null | undefined, currency: string): string {
  if (amount === null || amount === undefined || !Number.isFinite(amount)) return '—';
  return `${amount < 1 ? amount.toFixed(4) : amount.toFixed(2)} ${currency}`;
}

/** An amount of money to the cent ("1234.50 EUR"): extended costs and totals. */
export function money(amount: number | null | undefined, currency: string): string {
  if (amount === null || amount === undefined || !Number.isFinite(amount)) return '—';
  return `${amount.toFixed(2)} ${currency}`;
}

/** A file size: "2.4 MB", "18 KB". */
export function bytes(count: number): string {
  return count >= 1024 * 1024 ? `${(count / 1024 / 1024).toFixed(1)} MB` : `${Math.max(1, Math.round(count / 1024))} kB`;
}

/** Removes floating-point noise from a value converted between units (for inputs): 0.1 × 3 → 0.3. */
export function tidy(value: number): number {
  return Number(value.toPrecision(12));
}

/** A whole count with thousands separators: whole(1240) → "1,240" (stock, quantities). */
export function whole(count: number | null | undefined): string {
  if (count === null || count === undefined || !Number.isFinite(count)) return '—';
  return count.toLocaleString('en-US', { maximumFractionDigits: 0 });
}

/** A count with its noun in the right number: "1 diode", "25,412 diodes", "1 person", "5 people". */
export function counted(n: number, one: string, many: string): string {
  return `${count(n)} ${n === 1 ? one : many}`;
}

/** A whole count with thousands separators: count(1240) → "1,240", count(0) → "0". */
export function count(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const whole = String(Math.round(Math.abs(value))).replace(/\B(?=(\d{3})+(?!\d))/g, ',');
  return value < 0 ? `-${whole}` : whole;
}

/**
 * How long ago, coarsely, rounded down: under a minute "just now", then "12 min ago", "3 h ago" (under
 * two days), "5 days ago".
 */
export function age(ms: number | null | undefined): string {
  if (ms === null || ms === undefined || !Number.isFinite(ms)) return '—';
  const minutes = Math.floor(Math.max(0, ms) / 60_000);
  if (minutes < 1) return 'just now';
  if (minutes < 60) return `${minutes} min ago`;
  const hours = Math.floor(minutes / 60);
  if (hours < 48) return `${hours} h ago`;
  return `${Math.floor(hours / 24)} days ago`;
}

/** Factor of an SI prefix as people type it ('' 1, 'm' 10⁻³, 'µ'/'u' 10⁻⁶, 'k' 10³); undefined for anything else. */
export function prefixFactor(prefix: string): number | undefined {
  const found = SI_PREFIXES.find((p) => p.symbol === (prefix === 'u' ? 'µ' : prefix));
  return found ? 10 ** found.exponent : undefined;
}

/** A bound as a chip shows it: SI prefix, at most three significant digits, no trailing zeros ("30 V", "10 mΩ", "500 mA"). */
export function bound(value: number, unit: string): string {
  if (!Number.isFinite(value)) return `— ${unit}`;
  if (value === 0) return `0 ${unit}`;
  const rounded = roundSignificant(value, 3);
  const prefix = prefixFor(Math.abs(rounded));
  return `${sig(rounded / 10 ** prefix.exponent)} ${prefix.symbol}${unit}`;
}

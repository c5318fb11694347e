/**
 * An invented catalogue at a real team's size, for the benchmark and for the search tests. Every maker,
 * distributor and part number here is fiction (no real brand); the values are physically plausible and
 * consistent with each other (RDS(on) falls as VGS rises, ID follows from RθJA and RDS(on), the motor
 * points obey V = I·R + ke·ω), so ranking behaves as it would on a real catalogue. Deterministic: the
 * same seed gives the same catalogue.
 */
import type { DiodeKind, Lifecycle, PartSource, ReviewStatus, RdsOnSpecPoint } from '../../src/lib/domain/parts.ts';
import type { NewPart } from '../../src/server/repos/parts.ts';

export interface CatalogueSize {
  mosfets: number;
  diodes: number;
  drivers: number;
  motors: number;
}

export const FULL_SIZE: CatalogueSize = { mosfets: 50_000, diodes: 10_000, drivers: 5_000, motors: 2_000 };

/** mulberry32: a small, fast, seedable generator (public-domain algorithm). */
export function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

type Rand = () => number;
const pick = <T>(r: Rand, list: readonly T[]): T => list[Math.floor(r() * list.length)];
const between = (r: Rand, lo: number, hi: number) => lo + (hi - lo) * r();
const logBetween = (r: Rand, lo: number, hi: number) => Math.exp(between(r, Math.log(lo), Math.log(hi)));
const sig = (x: number, digits = 3) => Number(x.toPrecision(digits));

/** Invented makers (none exists) with the short code their part numbers start with. */
export const BENCH_MAKERS = [
  { name: 'Quillmarsh Semiconductor', code: 'QM' },
  { name: 'Ostrander Vale Devices', code: 'OV' },
  { name: 'Brindlecote Power', code: 'BC' },
  { name: 'Tarnwick Silicon', code: 'TW' },
  { name: 'Yarrowby Microsystems', code: 'YB' },
  { name: 'Felsham Integrated', code: 'FH' },
  { name: 'Wendlebury Components', code: 'WB' },
  { name: 'Corrick Dale Electronics', code: 'CD' },
] as const;

const DISTRIBUTORS = [
  { name: 'Lanthorn Supply', sku: 'LS', currency: 'USD' },
  { name: 'Mossgate Parts Depot', sku: 'MG', currency: 'USD' },
  { name: 'Ribbonfield Distribution', sku: 'RF', currency: 'EUR' },
] as const;

const MOSFET_PACKAGES = [
  { name: 'SOT-23', code: 'S3', rthJa: 250, rScale: 3 },
  { name: 'SOT-323', code: 'S32', rthJa: 340, rScale: 5 },
  { name: 'SOT-89', code: 'S89', rthJa: 120, rScale: 1.5 },
  { name: 'SO-8', code: 'SO8', rthJa: 62, rScale: 0.6 },
  { name: 'DFN-3x3', code: 'DF3', rthJa: 50, rScale: 0.4 },
  { name: 'DPAK', code: 'DP', rthJa: 50, rScale: 0.3 },
  { name: 'TO-220', code: 'T2', rthJa: 62, rScale: 0.2 },
] as const;

const LIFECYCLE_SHARES: [Lifecycle, number][] = [
  ['active', 0.9],
  ['nrnd', 0.05],
  ['last-buy', 0.03],
  ['obsolete', 0.02],
];
/** About 88 % approved, the rest waiting, in draft or rejected. */
const REVIEW_SHARES: [ReviewStatus, number][] = [
  ['approved', 0.88],
  ['pending', 0.08],
  ['draft', 0.02],
  ['rejected', 0.02],
];

function weighted<T>(r: Rand, shares: [T, number][]): T {
  let x = r();
  for (const [v, w] of shares) {
    if (x < w) return v;
    x -= w;
  }
  return shares[shares.length - 1][0];
}

/** 1–3 sources, each with 2–5 falling price breaks. */
function sourcesFor(r: Rand, serial: number, basePrice: number): PartSource[] {
  const n = 1 + Math.floor(r() * 3);
  const chosen = [...DISTRIBUTORS].sort(() => r() - 0.5).slice(0, n);
  return chosen.map((d) => {
    const breaks = [1, 10, 100, 1000, 5000].slice(0, 2 + Math.floor(r() * 4));
    const start = basePrice * between(r, 0.85, 1.25);
    return {
      distributor: d.name,
      sku: `${d.sku}-${String(serial).padStart(7, '0')}`,
      moq: 1,
      orderMultiple: 1,
      leadTimeDays: Math.floor(between(r, 0, 60)),
      stockQty: r() < 0.15 ? 0 : Math.floor(logBetween(r, 10, 200_000)),
      currency: d.currency,
      priceBreaks: breaks.map((qty, i) => ({ qty, unitPrice: sig(start * Math.pow(0.78, i), 4) })),
    };
  });
}

function head(r: Rand) {
  return { lifecycle: weighted(r, LIFECYCLE_SHARES), lifecycleEffectiveDate: null, reviewStatus: weighted(r, REVIEW_SHARES) };
}

type GateClass = 'low-threshold' | 'logic-level' | 'standard-level';
/** The RDS(on) lines of each gate-drive class (2–4 lines) and the factor over the highest-VGS line. */
const LINE_SETS: Record<GateClass, number[][]> = {
  'low-threshold': [
    [1.8, 2.5, 4.5],
    [2.5, 4.5],
    [1.8, 2.5, 3.3, 4.5],
  ],
  'logic-level': [
    [4.5, 10],
    [2.5, 4.5, 10],
    [3.3, 4.5, 10],
    [2.5, 3.3, 4.5, 10],
  ],
  'standard-level': [
    [6, 10],
    [7, 10],
    [6, 8, 10],
  ],
};
/** RDS(on) relative to the line at the highest VGS, by VGS (falls as VGS rises). */
function lineFactor(cls: GateClass, vgsV: number): number {
  const top = cls === 'low-threshold' ? 4.5 : 10;
  const knee = cls === 'low-threshold' ? 1.2 : cls === 'logic-level' ? 2 : 4;
  return Math.pow((top - knee) / (vgsV - knee), 0.8);
}

export function makeMosfet(r: Rand, serial: number): NewPart {
  const maker = pick(r, BENCH_MAKERS);
  const channel = r() < 0.85 ? 'n' : 'p';
  const vdsMaxV = pick(r, [12, 20, 25, 30, 40, 55, 60, 80, 100]);
  const cls: GateClass = pick(r, ['low-threshold', 'logic-level', 'logic-level', 'standard-level', 'standard-level'] as GateClass[]);
  const pkg = pick(r, MOSFET_PACKAGES);
  // Higher voltage and a smaller package: more resistance.
  const topOhm = sig(logBetween(r, 0.003, 0.06) * pkg.rScale * Math.pow(vdsMaxV / 30, 1.3) * (channel === 'p' ? 2 : 1));
  const lines: RdsOnSpecPoint[] = pick(r, LINE_SETS[cls]).map((vgsV) => {
    const maxOhm = sig(topOhm * lineFactor(cls, vgsV));
    return { vgsV, tjC: 25, maxOhm, typOhm: sig(maxOhm * 0.78), idA: sig(Math.max(0.1, 0.5 / Math.sqrt(maxOhm))) };
  });
  const th =
    cls === 'low-threshold'
      ? { min: sig(between(r, 0.35, 0.5), 2), max: sig(between(r, 0.85, 1.0), 2), vgsMax: pick(r, [8, 12]) }
      : cls === 'logic-level'
        ? { min: sig(between(r, 1, 1.2), 2), max: sig(between(r, 2, 2.5), 2), vgsMax: 20 }
        : { min: 2, max: 4, vgsMax: 20 };
  const tjMaxC = pick(r, [150, 150, 175]);
  const rthJa = sig(pkg.rthJa * between(r, 0.85, 1.15));
  const idContinuousA = sig(Math.sqrt((tjMaxC - 25) / (rthJa * topOhm * 1.6)), 2);
  const qg = sig(Math.min(200, Math.max(0.5, (0.3 / Math.pow(topOhm / pkg.rScale, 0.9)) * Math.sqrt(vdsMaxV / 30))), 2);
  const classWord = cls === 'low-threshold' ? 'low-threshold' : cls === 'logic-level' ? 'logic-level' : 'standard-level';
  const chWord = channel === 'n' ? 'N-channel' : 'P-channel';
  const use = pick(r, ['load switching', 'motor drives', 'battery protection', 'DC-DC converters', 'solenoid and relay drivers']);
  const mpn = `${maker.code}${channel.toUpperCase()}${vdsMaxV}${cls[0].toUpperCase()}${serial.toString(36).toUpperCase().padStart(4, '0')}-${pkg.code}`;
  return {
    category: 'mosfet',
    manufacturer: maker.name,
    mpn,
    description: `${chWord} ${classWord} MOSFET, ${vdsMaxV} V, ${lines[lines.length - 1].maxOhm * 1000} mΩ at ${lines[lines.length - 1].vgsV} V, ${pkg.name}, for ${use}.`,
    package: pkg.name,
    ...head(r),
    params: {
      channel,
      vdsMaxV,
      vgsMaxV: th.vgsMax,
      vgsThMinV: th.min,
      vgsThMaxV: th.max,
      vgsThTestCurrentA: 0.00025,
      idContinuousA,
      idPulsedA: sig(idContinuousA * between(r, 3, 5), 2),
      qgTotalNc: qg,
      qgTestVgsV: cls === 'standard-level' ? 10 : 4.5,
      qgsNc: sig(qg * 0.2, 2),
      qgdNc: sig(qg * 0.3, 2),
      vPlateauV: sig(th.max + between(r, 0.4, 1.2), 2),
      rthJaCPerW: rthJa,
      tjMaxC,
      bodyDiodeVfV: sig(between(r, 0.7, 1.2), 2),
      rdsOn: lines,
      zthPoints:
        r() < 0.1
          ? [0.001, 0.01, 0.1, 1, 10, 100].map((pulseS, i) => ({ pulseS, zthCPerW: sig(rthJa * [0.02, 0.08, 0.25, 0.55, 0.85, 0.97][i]) }))
          : [],
    },
    sources: sourcesFor(r, serial, 0.05 + qg * 0.02),
  };
}

export function makeDiode(r: Rand, serial: number): NewPart {
  const maker = pick(r, BENCH_MAKERS);
  const kind: DiodeKind = weighted(r, [
    ['schottky', 0.5],
    ['ultrafast', 0.2],
    ['fast', 0.15],
    ['general', 0.15],
  ] as [DiodeKind, number][]);
  const vrrmV = kind === 'schottky' ? pick(r, [20, 30, 40, 45, 60, 100]) : pick(r, [100, 200, 400, 600, 1000]);
  const ifAvA = sig(logBetween(r, 0.5, 10), 2);
  const pkg = pick(r, ['SOD-123', 'SOD-323', 'SMA', 'SMB', 'SMC', 'DO-41', 'TO-277']);
  const trrNs =
    kind === 'schottky' ? null : kind === 'ultrafast' ? sig(between(r, 25, 75), 2) : kind === 'fast' ? sig(between(r, 150, 500), 2) : 2000;
  return {
    category: 'diode',
    manufacturer: maker.name,
    mpn: `${maker.code}D${kind[0].toUpperCase()}${vrrmV}${serial.toString(36).toUpperCase().padStart(4, '0')}-${pkg.replace(/[^A-Z0-9]/g, '')}`,
    description: `${kind[0].toUpperCase()}${kind.slice(1)} rectifier, ${vrrmV} V, ${ifAvA} A, ${pkg}, for freewheeling and reverse-polarity protection.`,
    package: pkg,
    ...head(r),
    params: {
      kind,
      vrrmV,
      ifAvA,
      ifsmA: sig(ifAvA * between(r, 10, 30), 2),
      vfV: sig(kind === 'schottky' ? between(r, 0.35, 0.6) : between(r, 0.85, 1.2), 2),
      vfAtIfA: ifAvA,
      trrNs,
      ifrmA: r() < 0.5 ? sig(ifAvA * 2, 2) : null,
      rthJaCPerW: r() < 0.6 ? sig(between(r, 40, 250)) : null,
      tjMaxC: r() < 0.6 ? pick(r, [125, 150, 175]) : null,
    },
    sources: sourcesFor(r, serial, 0.03 + ifAvA * 0.03),
  };
}

export function makeDriver(r: Rand, serial: number): NewPart {
  const maker = pick(r, BENCH_MAKERS);
  const kind = r() < 0.8 ? 'gate-driver' : 'level-shifter';
  const inputLogic = weighted(r, [
    ['fixed', 0.6],
    ['ratio', 0.25],
    ['input-rail', 0.15],
  ] as ['fixed' | 'ratio' | 'input-rail', number][]);
  const [supplyMinV, supplyMaxV] = pick(r, [
    [4.5, 18],
    [4.5, 20],
    [3, 18],
    [10, 20],
    [8, 30],
    [2.7, 5.5],
  ]);
  const inverting = r() < 0.2;
  const sourceCurrentA = sig(kind === 'gate-driver' ? logBetween(r, 0.5, 4) : logBetween(r, 0.02, 0.2), 2);
  const inputPull = pick(r, ['up', 'down', 'down', 'none'] as const);
  const pkg = pick(r, ['SOT-23-5', 'SOT-23-6', 'SO-8', 'DFN-6']);
  return {
    category: 'driver',
    manufacturer: maker.name,
    mpn: `${maker.code}G${inverting ? 'I' : 'N'}${Math.round(supplyMaxV)}${serial.toString(36).toUpperCase().padStart(4, '0')}-${pkg.replace(/[^A-Z0-9]/g, '')}`,
    description:
      `${kind === 'gate-driver' ? 'Low-side gate driver' : 'Logic level shifter'}, ${inverting ? 'inverting' : 'non-inverting'}, ` +
      `${supplyMinV}–${supplyMaxV} V supply, ${sourceCurrentA} A source, ${inputLogic} input thresholds, ${pkg}.`,
    package: pkg,
    ...head(r),
    params: {
      kind,
      channels: r() < 0.7 ? 1 : 2,
      inverting,
      supplyMinV,
      supplyMaxV,
      inputLogic,
      inputHighMin: inputLogic === 'fixed' ? sig(between(r, 1.6, 2.4), 2) : 0.7,
      inputLowMax: inputLogic === 'fixed' ? 0.8 : 0.3,
      outputHighDropV: sig(between(r, 0.05, 0.3), 2),
      outputLowMaxV: sig(between(r, 0.03, 0.1), 2),
      sourceCurrentA,
      sinkCurrentA: sig(sourceCurrentA * between(r, 1, 1.5), 2),
      propagationDelayNs: sig(between(r, 15, 80), 2),
      inputPull,
      inputPullOhms: inputPull === 'none' || r() < 0.3 ? null : sig(between(r, 100_000, 250_000), 2),
    },
    sources: sourcesFor(r, serial, 0.3 + sourceCurrentA * 0.2),
  };
}

export function makeMotor(r: Rand, serial: number): NewPart {
  const maker = pick(r, BENCH_MAKERS);
  const ratedVoltageV = pick(r, [3, 5, 6, 9, 12, 18, 24]);
  const stallCurrentA = sig(logBetween(r, 0.3, 12) * Math.sqrt(ratedVoltageV / 6), 3);
  const resistanceOhm = ratedVoltageV / stallCurrentA;
  const noLoadCurrentA = sig(stallCurrentA * between(r, 0.04, 0.12), 3);
  const noLoadSpeedRpm = Math.round(logBetween(r, 2000, 20000) / 10) * 10;
  const omega = (noLoadSpeedRpm * 2 * Math.PI) / 60;
  const keVsPerRad = (ratedVoltageV - noLoadCurrentA * resistanceOhm) / omega;
  return {
    category: 'motor',
    manufacturer: maker.name,
    mpn: `${maker.code}M${ratedVoltageV}${serial.toString(36).toUpperCase().padStart(4, '0')}`,
    description: `Brushed DC motor, ${ratedVoltageV} V, ${noLoadSpeedRpm} rpm no-load, ${stallCurrentA} A stall.`,
    package: pick(r, ['Ø24 mm can', 'Ø28 mm can', 'Ø36 mm can', 'Ø42 mm can']),
    ...head(r),
    params: {
      ratedVoltageV,
      voltageMinV: sig(ratedVoltageV * 0.5, 2),
      voltageMaxV: sig(ratedVoltageV * 1.2, 2),
      noLoadSpeedRpm,
      noLoadCurrentA,
      stallTorqueNm: sig(keVsPerRad * (stallCurrentA - noLoadCurrentA), 4),
      stallCurrentA,
      terminalResistanceOhm: sig(resistanceOhm, 3),
      inductanceH: r() < 0.7 ? sig(resistanceOhm * between(r, 0.0002, 0.0006), 3) : null,
      rotorInertiaKgM2: null,
    },
    sources: sourcesFor(r, serial, ratedVoltageV * 0.4),
  };
}

/** The whole invented catalogue; serials run across categories so every part number is unique. */
export function* generateCatalogue(size: CatalogueSize, seed = 20261202): Generator<NewPart> {
  const r = rng(seed);
  let serial = 1;
  for (let i = 0; i < size.mosfets; i++) yield makeMosfet(r, serial++);
  for (let i = 0; i < size.diodes; i++) yield makeDiode(r, serial++);
  for (let i = 0; i < size.drivers; i++) yield makeDriver(r, serial++);
  for (let i = 0; i < size.motors; i++) yield makeMotor(r, serial++);
}

/**
 * Domain types for catalogue parts (camelCase, units in every name).
 * Row types (snake_case) live in src/server/repos and are mapped there; nothing else sees rows.
 */
export const PART_CATEGORIES = ['motor', 'mosfet', 'driver', 'diode'] as const;
export type PartCategory = (typeof PART_CATEGORIES)[number];

export const LIFECYCLES = ['active', 'nrnd', 'last-buy', 'obsolete'] as const;
export type Lifecycle = (typeof LIFECYCLES)[number];

export const REVIEW_STATUSES = ['draft', 'pending', 'approved', 'rejected'] as const;
export type ReviewStatus = (typeof REVIEW_STATUSES)[number];

/** One RDS(on) line of a MOSFET datasheet: the maximum (and typical) at a stated VGS, Tj and ID. */
export interface RdsOnSpecPoint {
  vgsV: number;
  tjC: number;
  maxOhm: number;
  typOhm: number | null;
  /** Drain current the point was measured at, when the datasheet states it. */
  idA: number | null;
}

export interface MosfetParams {
  channel: 'n' | 'p';
  /** Magnitudes for P-channel parts too: |V(BR)DSS|, |VGS(max)|, |VGS(th)|. */
  vdsMaxV: number;
  vgsMaxV: number;
  vgsThMinV: number;
  vgsThMaxV: number;
  /** Drain current at which VGS(th) is specified (typically 250 µA). */
  vgsThTestCurrentA: number;
  /** Continuous drain current at TA = 25 °C on the datasheet's test board. */
  idContinuousA: number;
  idPulsedA: number;
  qgTotalNc: number;
  /** VGS at which total gate charge is specified. */
  qgTestVgsV: number;
  qgsNc: number | null;
  qgdNc: number | null;
  vPlateauV: number | null;
  /** Junction-to-ambient thermal resistance on the JEDEC-style test board. */
  rthJaCPerW: number;
  tjMaxC: number;
  /** Body-diode forward voltage (typ.), informative only. */
  bodyDiodeVfV: number | null;
  rdsOn: RdsOnSpecPoint[];
  /** Single-pulse transient thermal impedance points, when the datasheet gives its Zth curve (may be empty). */
  zthPoints: ZthPoint[];
}

/** One point of a datasheet's single-pulse Zth(j-a) curve: the impedance after a pulse of pulseS seconds. */
export interface ZthPoint {
  pulseS: number;
  zthCPerW: number;
}

/** How a driver's input thresholds are stated. */
export type DriverInputLogic =
  | 'fixed' // TTL-compatible: VIH/VIL fixed volts, independent of the driver supply
  | 'ratio' // CMOS-ratio: VIH/VIL a fraction of the driver's own supply
  | 'input-rail'; // dual-supply translator: thresholds a fraction of a separate input-side rail (the logic rail)

export interface DriverParams {
  kind: 'gate-driver' | 'level-shifter';
  channels: number;
  inverting: boolean;
  supplyMinV: number;
  supplyMaxV: number;
  inputLogic: DriverInputLogic;
  /** For 'fixed': volts. For 'ratio' and 'input-rail': fraction of the reference rail (0–1). */
  inputHighMin: number;
  inputLowMax: number;
  /** Output high is the driver supply less this drop at rated source current. */
  outputHighDropV: number;
  outputLowMaxV: number;
  sourceCurrentA: number;
  sinkCurrentA: number;
  propagationDelayNs: number;
  /**
   * The input's internal pull as the datasheet states it: 'down' (to ground), 'up' (to the driver's
   * input-side supply), or 'none'. With `inverting`, this fixes the output while the input is left open.
   */
  inputPull: 'up' | 'down' | 'none';
  /** Typical value of that internal pull; null when the datasheet does not state it. */
  inputPullOhms: number | null;
}

export type DiodeKind = 'schottky' | 'ultrafast' | 'fast' | 'general';

export interface DiodeParams {
  kind: DiodeKind;
  vrrmV: number;
  ifAvA: number;
  ifsmA: number;
  vfV: number;
  /** Forward current at which vfV is specified. */
  vfAtIfA: number;
  /** Reverse recovery time; null for Schottky parts (no stored charge). */
  trrNs: number | null;
  /** Repetitive peak forward current IFRM; null when the datasheet gives none. */
  ifrmA: number | null;
  /** Junction-to-ambient thermal resistance on the datasheet's test board; null when not stated. */
  rthJaCPerW: number | null;
  /** Maximum junction temperature; null when not stated. */
  tjMaxC: number | null;
}

export interface MotorParams {
  ratedVoltageV: number;
  voltageMinV: number | null;
  voltageMaxV: number | null;
  noLoadSpeedRpm: number;
  noLoadCurrentA: number;
  stallTorqueNm: number;
  stallCurrentA: number;
  terminalResistanceOhm: number | null;
  inductanceH: number | null;
  rotorInertiaKgM2: number | null;
}

export interface PriceBreak {
  qty: number;
  unitPrice: number;
}

export interface PartSource {
  id?: number;
  distributor: string;
  sku: string;
  moq: number;
  /** Orders go in whole multiples of this (reel, tube or pack size); 1 = any quantity. */
  orderMultiple: number;
  leadTimeDays: number;
  stockQty: number;
  currency: string;
  priceBreaks: PriceBreak[];
}

interface PartBase {
  id?: number;
  manufacturer: string;
  mpn: string;
  description: string;
  package: string;
  lifecycle: Lifecycle;
  lifecycleEffectiveDate: string | null;
  reviewStatus: ReviewStatus;
  version?: number;
  sources: PartSource[];
}

export type Part =
  | (PartBase & { category: 'motor'; params: MotorParams })
  | (PartBase & { category: 'mosfet'; params: MosfetParams })
  | (PartBase & { category: 'driver'; params: DriverParams })
  | (PartBase & { category: 'diode'; params: DiodeParams });

export type PartOf<C extends PartCategory> = Extract<Part, { category: C }>;

/** What a price at a quantity needs of a source: its MOQ, currency and breaks. */
export type PriceSource = Pick<PartSource, 'moq' | 'currency' | 'priceBreaks'>;

/**
 * A catalogue part as the match ranks it: identity, ratings, lifecycle and price breaks (no description,
 * distributor, stock or lead time). A full Part is one too; the match's loader gives each source only the
 * break that applies at the design's build quantity.
 */
export type CandidatePart<C extends PartCategory> = Pick<
  PartOf<C>,
  'id' | 'category' | 'manufacturer' | 'mpn' | 'package' | 'lifecycle' | 'reviewStatus' | 'params'
> & { sources: PriceSource[] };

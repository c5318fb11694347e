/**
 * Assembles the answer of POST /api/designs/:id/match from the engineering core's ranking: each candidate
 * gets the catalogue facts a designer and a buyer need (price at the build quantity, lifecycle).
 * Pure: the service loads the parts and passes them in.
 */
import type { DesignInput } from './domain/design.ts';
import type { Lifecycle, MotorParams, Part, PartOf, ReviewStatus } from './domain/parts.ts';
import { designCaseOf } from './design-input.ts';
import { powerOnFor, rankDesign, type DesignRanking } from './rank-design.ts';
import type { CandidateResult } from './ranking.ts';
import { bestUnitPrice } from './part-summary.ts';
import { calcMotor, type CalcMotorResponse } from './calc.ts';
import { operatingPointAtSpeed, operatingPointAtTorque } from './motor-curve.ts';
import { motorAtSupply, motorModelFromDatasheet } from './motor.ts';
import type { SupplyReport } from './supply.ts';
import { supplyReportForCase } from './supply-design.ts';

export interface PriceAtQty {
  qty: number;
  unitPrice: number;
  currency: string;
}

export type MatchEntry<T extends CandidateResult = CandidateResult> = T & {
  package: string;
  lifecycle: Lifecycle;
  reviewStatus: ReviewStatus;
  priceAtQty: PriceAtQty | null;
};

type Ranked = DesignRanking;

export interface MotorView {
  label: string;
  params: MotorParams;
  /** Curves at the minimum and maximum supply, with the design's series resistance. */
  atMin: CalcMotorResponse;
  atMax: CalcMotorResponse;
  /** Full-on operating point at each end (null for a stall-only load). */
  operatingMin: { torqueNm: number; speedRpm: number; currentA: number } | null;
  operatingMax: { torqueNm: number; speedRpm: number; currentA: number } | null;
}

export interface DesignMatch {
  worstCase: Ranked['worstCase'];
  motor: MotorView;
  switch: MatchEntry<Ranked['switch'][number]>[];
  driverNeeded: boolean;
  driverNeededNote: string | null;
  requiredGateDriveV: number | null;
  switchWithDriver: MatchEntry<Ranked['switchWithDriver'][number]>[];
  driver: MatchEntry<Ranked['driver'][number]>[];
  diode: MatchEntry<Ranked['diode'][number]>[];
  powerOn: Ranked['powerOn'];
  /** The source against the motor (start current, current limit, shared logic rail); null until computed. */
  supply: SupplyReport | null;
  cautions: string[];
  /** Candidates left out before ranking because a rating can never pass (or obsolete). */
  excluded: { switch: number; driver: number; diode: number };
}

export interface MatchCatalogue {
  mosfets: PartOf<'mosfet'>[];
  drivers: PartOf<'driver'>[];
  diodes: PartOf<'diode'>[];
  excluded: DesignMatch['excluded'];
}

function decorate<T extends CandidateResult>(results: T[], parts: Part[], qty: number): MatchEntry<T>[] {
  const byId = new Map(parts.map((p) => [p.id, p]));
  return results.map((r) => {
    const part = r.partId == null ? undefined : byId.get(r.partId);
    const price = part ? bestUnitPrice(part, qty) : null;
    return {
      ...r,
      package: part?.package ?? '',
      lifecycle: part?.lifecycle ?? 'active',
      reviewStatus: part?.reviewStatus ?? 'approved',
      priceAtQty: price ? { qty, unitPrice: price.price, currency: price.currency } : null,
    };
  });
}

function operatingPoint(params: MotorParams, input: DesignInput, supplyV: number): MotorView['operatingMin'] {
  const at = motorAtSupply(motorModelFromDatasheet(params), supplyV, input.wiringResistanceOhm + input.shuntResistanceOhm);
  if (input.load.kind === 'stall-only') return null;
  const p = input.load.kind === 'torque' ? operatingPointAtTorque(at, input.load.torqueNm) : operatingPointAtSpeed(at, input.load.speedRpm);
  return { torqueNm: p.torqueNm, speedRpm: p.speedRpm, currentA: p.currentA };
}

export function motorView(label: string, params: MotorParams, input: DesignInput): MotorView {
  const series = input.wiringResistanceOhm + input.shuntResistanceOhm;
  const motor = {
    ratedVoltageV: params.ratedVoltageV, noLoadSpeedRpm: params.noLoadSpeedRpm, noLoadCurrentA: params.noLoadCurrentA,
    stallCurrentA: params.stallCurrentA, stallTorqueNm: params.stallTorqueNm,
    ...(params.terminalResistanceOhm != null ? { terminalResistanceOhm: params.terminalResistanceOhm } : {}),
  };
  return {
    label,
    params,
    atMin: calcMotor({ motor, supplyV: input.supply.minV, seriesResistanceOhm: series, curvePoints: 41 }),
    atMax: calcMotor({ motor, supplyV: input.supply.maxV, seriesResistanceOhm: series, curvePoints: 41 }),
    operatingMin: operatingPoint(params, input, input.supply.minV),
    operatingMax: operatingPoint(params, input, input.supply.maxV),
  };
}

/** The power-on walk for the parts the designer picked, when a switch is picked. */
function selectedPowerOn(c: ReturnType<typeof designCaseOf>, input: DesignInput, catalogue: MatchCatalogue): DesignRanking['powerOn'] {
  const sw = catalogue.mosfets.find((m) => m.id === input.selections.switch.chosenPartId);
  if (!sw) return null;
  const driver = catalogue.drivers.find((d) => d.id === input.selections.driver.chosenPartId);
  return powerOnFor(c, sw, driver);
}

/** Ranks the catalogue candidates for a design and decorates each with price and lifecycle. */
export function matchDesign(input: DesignInput, motorLabel: string, motor: MotorParams, catalogue: MatchCatalogue): DesignMatch {
  const designCase = designCaseOf(input, motor);
  const ranking = rankDesign(designCase, catalogue);
  const qty = input.boardQuantity;
  const all: Part[] = [...catalogue.mosfets, ...catalogue.drivers, ...catalogue.diodes];
  return {
    worstCase: ranking.worstCase,
    motor: motorView(motorLabel, motor, input),
    switch: decorate(ranking.switch, all, qty),
    driverNeeded: ranking.driverNeeded,
    driverNeededNote: ranking.driverNeededNote,
    requiredGateDriveV: ranking.requiredGateDriveV,
    switchWithDriver: decorate(ranking.switchWithDriver, all, qty),
    driver: decorate(ranking.driver, all, qty),
    diode: decorate(ranking.diode, all, qty),
    powerOn: selectedPowerOn(designCase, input, catalogue) ?? ranking.powerOn,
    supply: supplyReportForCase(designCase),
    cautions: ranking.cautions,
    excluded: catalogue.excluded,
  };
}

/** The switch list the design actually uses: direct-drive candidates, or driver-driven ones when a driver is needed. */
export function effectiveSwitchList(match: DesignMatch): DesignMatch['switch'] {
  return match.driverNeeded ? match.switchWithDriver : match.switch;
}

/** Default picks: the best passing part per role and up to three further passing parts as alternates. */
export function suggestSelections(match: DesignMatch): DesignInput['selections'] {
  const pick = (list: CandidateResult[]) => {
    const passing = list.filter((c) => c.verdict === 'pass' && c.partId != null).map((c) => c.partId as number);
    return { chosenPartId: passing[0] ?? null, alternatePartIds: passing.slice(1, 4) };
  };
  return {
    switch: pick(effectiveSwitchList(match)),
    driver: match.driverNeeded ? pick(match.driver) : { chosenPartId: null, alternatePartIds: [] },
    diode: pick(match.diode),
  };
}

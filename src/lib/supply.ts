/**
 * The supply against the motor [docs/engineering.md, supply]: can the source start the motor, and does a
 * controller sharing it survive the start? Pure; the shape is also the answer of POST /api/calc/supply.
 *
 * Source model: open-circuit voltage V behind an internal resistance R_int, with an optional continuous
 * rating and current limit. The motor's winding resistance R (at 20 °C) is corrected for the winding
 * temperature with copper's α20 [IEC 60028]; Kt = Ke from the linear model [docs/engineering.md §2].
 */
import { fmt, makeCheck, marginAbove, marginBelow, verdictOf, type Check, type Verdict } from './checks.ts';
import type { SharedLogicSupply } from './domain/design.ts';
import { motorModelFromDatasheet, windingResistanceOhm, type MotorModel } from './motor.ts';
import type { CalcSupplyRequest } from './schemas/calc.ts';

export interface SupplyReport {
  verdict: Verdict;
  /** supply-running-current, supply-start-current, logic-brownout, supply-motor-voltage: each only when its inputs are given. */
  checks: Check[];
  startCurrentA: number;
  startActualCurrentA: number;
  sourceVoltageAtStartV: number;
  startTorqueNm: number;
  runningCurrentA: number;
  bulkCapacitanceF: number | null;
  notes: string[];
}

/** A bulk capacitor this large (tenths of a farad and up) is not a practical ride-through part [practice]. */
export const IMPRACTICAL_BULK_CAPACITANCE_F = 0.1;

/** One operating case of the source and the motor at standstill. */
export interface SupplyCase {
  model: MotorModel;
  /** Open-circuit source voltage. */
  supplyV: number;
  /** Wiring, shunt, connector: in series with the motor, outside the source (R_int not included). */
  seriesResistanceOhm: number;
  internalResistanceOhm: number;
  currentLimitA: number | null;
  windingC: number;
}

export interface StartFigures {
  /** R_cold + R_series: the part of the loop outside the source. */
  outsideOhm: number;
  /** R_cold + R_series + R_int. */
  loopOhm: number;
  startCurrentA: number;
  startActualCurrentA: number;
  sourceVoltageAtStartV: number;
  startTorqueNm: number;
}

/** I_start = V/(R_cold + R_s + R_int); a limited source holds min(I_start, I_lim); its terminals see I·(R_cold + R_s). */
export function startFigures(k: SupplyCase): StartFigures {
  const outsideOhm = windingResistanceOhm(k.model.resistanceOhm, k.windingC) + k.seriesResistanceOhm;
  const loopOhm = outsideOhm + k.internalResistanceOhm;
  const startCurrentA = k.supplyV / loopOhm;
  const startActualCurrentA = k.currentLimitA == null ? startCurrentA : Math.min(startCurrentA, k.currentLimitA);
  return {
    outsideOhm,
    loopOhm,
    startCurrentA,
    startActualCurrentA,
    sourceVoltageAtStartV: startActualCurrentA * outsideOhm,
    startTorqueNm: k.model.ktNmPerA * (startActualCurrentA - k.model.noLoadCurrentA),
  };
}

/** Mechanical time constant of the start, τm = J·R_loop/(Kt·Ke) [linear model]. */
export function mechanicalTimeConstantS(model: MotorModel, rotorInertiaKgM2: number, loopOhm: number): number {
  return (rotorInertiaKgM2 * loopOhm) / (model.ktNmPerA * model.keVsPerRad);
}

/**
 * C ≥ max(0, I_start − I_avail)·τm/ΔV with I_avail = min(ΔV/R_int, I_lim), an absent bound being no bound
 * (R_int = 0 gives no bound from the dip) [docs/engineering.md, supply: first-order estimate].
 */
export function bulkCapacitanceF(
  startCurrentA: number,
  tauS: number,
  allowedDipV: number,
  internalResistanceOhm: number,
  currentLimitA: number | null,
): number {
  const fromDipA = internalResistanceOhm > 0 ? allowedDipV / internalResistanceOhm : Infinity;
  const availableA = Math.min(fromDipA, currentLimitA ?? Infinity);
  return (Math.max(0, startCurrentA - availableA) * tauS) / allowedDipV;
}

const mA = (a: number): string => `${fmt(a * 1000)} mA`;
const mNm = (t: number): string => `${fmt(t * 1000)} mN·m`;
const capacitanceText = (f: number): string => (f >= 1e-3 ? `${fmt(f * 1000)} mF` : `${fmt(f * 1e6)} µF`);

export function runningCurrentCheck(runningCurrentA: number, continuousCurrentA: number): Check {
  const ok = runningCurrentA <= continuousCurrentA;
  return makeCheck({
    id: 'supply-running-current',
    ok,
    value: runningCurrentA,
    limit: continuousCurrentA,
    unit: 'A',
    margin: marginBelow(runningCurrentA, continuousCurrentA),
    note: ok
      ? `Running current ${fmt(runningCurrentA)} A is within the source's ${fmt(continuousCurrentA)} A continuous rating.`
      : `Running current ${fmt(runningCurrentA)} A is above the source's ${fmt(continuousCurrentA)} A continuous ` +
        `rating: it will sag, heat or shut down. Use a source rated for at least ${fmt(runningCurrentA)} A.`,
  });
}

/** Current needed to break away against a load torque: I0 + T/Kt. */
export function breakAwayCurrentA(model: MotorModel, loadTorqueNm: number): number {
  return model.noLoadCurrentA + loadTorqueNm / model.ktNmPerA;
}

/** I_start ≤ I_lim; above it the start torque falls to Kt·(I_lim − I0): below the load = never starts (fail), else a slow start (marginal). */
export function startCurrentCheck(
  startCurrentA: number,
  currentLimitA: number,
  startTorqueNm: number,
  loadTorqueNm: number,
  model: MotorModel,
): Check {
  const ok = startCurrentA <= currentLimitA;
  const neverStarts = !ok && startTorqueNm < loadTorqueNm;
  const at = `The motor asks for ${fmt(startCurrentA)} A at standstill; the source limits at ${fmt(currentLimitA)} A`;
  let note: string;
  if (ok) note = `Start current ${fmt(startCurrentA)} A is within the source's ${fmt(currentLimitA)} A limit.`;
  else if (neverStarts) {
    note =
      `${at}, so the start torque falls to ${mNm(startTorqueNm)}, below the ${mNm(loadTorqueNm)} load: the motor never starts and sits stalled at the limit. ` +
      `Breaking away needs at least ${fmt(breakAwayCurrentA(model, loadTorqueNm))} A: give the motor a supply of its own that delivers that.`;
  } else {
    note =
      `${at}, so the start torque falls to ${mNm(startTorqueNm)} (load ${mNm(loadTorqueNm)}): it starts, slowly. ` +
      'A port or supply that trips instead of limiting cuts out; a supply of its own for the motor avoids both.';
  }
  return makeCheck(
    {
      id: 'supply-start-current',
      ok,
      value: startCurrentA,
      limit: currentLimitA,
      unit: 'A',
      margin: marginBelow(startCurrentA, currentLimitA),
      note,
    },
    neverStarts ? 'hard' : 'margin',
  );
}

/** The shared rail at start must stay at or above the controller's minimum plus any regulator dropout. */
export function brownoutCheck(sourceVoltageAtStartV: number, logic: SharedLogicSupply): Check {
  const limitV = logic.minSupplyV + logic.regulatorDropoutV;
  const ok = sourceVoltageAtStartV >= limitV;
  const need =
    logic.regulatorDropoutV > 0
      ? `${fmt(limitV)} V (controller minimum ${fmt(logic.minSupplyV)} V + regulator dropout ${fmt(logic.regulatorDropoutV)} V)`
      : `the controller's minimum of ${fmt(limitV)} V`;
  return makeCheck({
    id: 'logic-brownout',
    ok,
    value: sourceVoltageAtStartV,
    limit: limitV,
    unit: 'V',
    margin: marginAbove(sourceVoltageAtStartV, limitV),
    note: ok
      ? `At start the shared source stays at ${fmt(sourceVoltageAtStartV)} V, at or above ${need}.`
      : `At start the shared source sags to ${fmt(sourceVoltageAtStartV)} V, below ${need}: the controller browns out (resets) every time the motor starts.`,
  });
}

/** Current a soft start may draw and still hold the source at limitV: (V − limitV)/R_int, capped by the limit. */
function softStartCurrentA(supplyV: number, limitV: number, internalResistanceOhm: number, currentLimitA: number | null): number {
  const fromSagA = internalResistanceOhm > 0 ? (supplyV - limitV) / internalResistanceOhm : Infinity;
  return Math.min(fromSagA, currentLimitA ?? Infinity);
}

export interface SupplyNoteFacts {
  checks: Check[];
  supplyV: number;
  startCurrentA: number;
  internalResistanceOhm: number;
  currentLimitA: number | null;
  logic: SharedLogicSupply | null;
  bulk: { capacitanceF: number; tauS: number } | null;
  /** Why there is no capacitance figure (null when there is one or none was asked for). */
  noBulkReason: string | null;
}

/** The remedies: separate supply, soft start by a PWM ramp, bulk capacitance; then the standing caution. */
export function supplyNotes(f: SupplyNoteFacts): string[] {
  const notes: string[] = [];
  const failing = (id: string) => f.checks.some((c) => c.id === id && !c.ok);
  if (failing('logic-brownout') && f.logic) {
    const limitV = f.logic.minSupplyV + f.logic.regulatorDropoutV;
    notes.push(
      "Feed the controller from a supply of its own (or give the motor one), so the start cannot pull the controller's rail down.",
    );
    const softA = softStartCurrentA(f.supplyV, limitV, f.internalResistanceOhm, f.currentLimitA);
    if (softA > 0 && f.supplyV > limitV && Number.isFinite(softA)) {
      notes.push(
        `Or soft-start by a PWM ramp that keeps the motor current under ${mA(softA)} until it is turning, so the source stays above ${fmt(limitV)} V.`,
      );
    } else if (f.supplyV <= limitV) {
      notes.push(
        `The source itself (${fmt(f.supplyV)} V) is not above the ${fmt(limitV)} V the controller needs: no soft start or capacitor helps; the controller needs another supply.`,
      );
    }
  }
  if (failing('supply-start-current'))
    notes.push(
      'Raise the current limit, or give the motor a supply of its own; a soft start by PWM ramp keeps the peak down but cannot add start torque beyond the limit.',
    );
  if (f.bulk) {
    const c = f.bulk.capacitanceF;
    const tau = `τm = ${fmt(f.bulk.tauS * 1000)} ms`;
    if (c >= IMPRACTICAL_BULK_CAPACITANCE_F)
      notes.push(
        `Riding through the start on a capacitor needs C ≥ ${fmt(c)} F (${tau}): not practical. Use a separate supply for the motor or a soft start by PWM ramp instead.`,
      );
    else if (c > 0)
      notes.push(
        `A bulk capacitor of at least ${capacitanceText(c)} (low ESR, at the source terminals) rides through the start (${tau}; a first-order estimate, check on the bench).`,
      );
    else notes.push(`The source holds the allowed dip at start without bulk capacitance (${tau}).`);
  } else if (f.noBulkReason) notes.push(f.noBulkReason);
  notes.push(
    `⚠ Every start draws up to ${fmt(f.startCurrentA)} A for tens of milliseconds, and a jammed shaft draws it steadily: wiring, connectors ` +
      `and any fuse must carry it. Fuse cell packs close to the cells and keep within the cell maker's limits; follow local codes.`,
  );
  return notes;
}

const NO_INERTIA_NOTE =
  'No bulk-capacitance figure: the rotor inertia J is not given, and the ride-through time τm = J·R/(Kt·Ke) needs it.';

/** POST /api/calc/supply: one source, one motor, one winding temperature [api-contract.md]. R = ratedVoltageV/stallCurrentA at 20 °C. */
export function calcSupply(body: CalcSupplyRequest): SupplyReport {
  const m = body.motor;
  const model = motorModelFromDatasheet({
    ratedVoltageV: m.ratedVoltageV,
    noLoadSpeedRpm: m.noLoadSpeedRpm,
    noLoadCurrentA: m.noLoadCurrentA,
    stallCurrentA: m.stallCurrentA,
    stallTorqueNm: m.stallTorqueNm ?? 0,
  });
  const s = body.supply;
  const internalResistanceOhm = s.internalResistanceOhm ?? 0;
  const currentLimitA = s.currentLimitA ?? null;
  const loadTorqueNm = body.loadTorqueNm ?? 0;
  const logic =
    body.logic && body.logic.sharedWithMotor !== false && body.logic.minSupplyV != null
      ? { minSupplyV: body.logic.minSupplyV, regulatorDropoutV: body.logic.regulatorDropoutV ?? 0 }
      : null;
  const start = startFigures({
    model,
    supplyV: s.voltageV,
    seriesResistanceOhm: body.seriesResistanceOhm ?? 0,
    internalResistanceOhm,
    currentLimitA,
    windingC: body.windingC ?? 20,
  });
  const runningCurrentA = breakAwayCurrentA(model, loadTorqueNm);
  const checks: Check[] = [];
  if (s.continuousCurrentA != null) checks.push(runningCurrentCheck(runningCurrentA, s.continuousCurrentA));
  if (currentLimitA != null) checks.push(startCurrentCheck(start.startCurrentA, currentLimitA, start.startTorqueNm, loadTorqueNm, model));
  if (logic) checks.push(brownoutCheck(start.sourceVoltageAtStartV, logic));
  const J = m.rotorInertiaKgM2 ?? null;
  const dip = body.allowedDipV ?? null;
  const tauS = J == null ? null : mechanicalTimeConstantS(model, J, start.loopOhm);
  const capacitance =
    tauS == null || dip == null ? null : bulkCapacitanceF(start.startCurrentA, tauS, dip, internalResistanceOhm, currentLimitA);
  const notes = supplyNotes({
    checks,
    supplyV: s.voltageV,
    startCurrentA: start.startCurrentA,
    internalResistanceOhm,
    currentLimitA,
    logic,
    bulk: capacitance == null || tauS == null ? null : { capacitanceF: capacitance, tauS },
    noBulkReason: dip != null && J == null ? NO_INERTIA_NOTE : null,
  });
  if (start.startTorqueNm < loadTorqueNm && start.startActualCurrentA === start.startCurrentA) {
    notes.unshift(
      `The load (${mNm(loadTorqueNm)}) is above the motor's own stall torque at ${fmt(s.voltageV)} V (${mNm(start.startTorqueNm)}): it stalls whatever the source.`,
    );
  }
  return {
    verdict: verdictOf(checks),
    checks,
    startCurrentA: start.startCurrentA,
    startActualCurrentA: start.startActualCurrentA,
    sourceVoltageAtStartV: start.sourceVoltageAtStartV,
    startTorqueNm: start.startTorqueNm,
    runningCurrentA,
    bulkCapacitanceF: capacitance,
    notes,
  };
}

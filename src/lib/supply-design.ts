/**
 * The supply report of a whole design: the checks of src/lib/supply.ts at the design's worst cases, plus
 * the supply against the motor's rated voltage [docs/engineering.md §3]. Pure.
 *
 * Worst cases, and why:
 * - Start current against the limit: highest supply, coldest winding (ambientMinC): the most current.
 * - Start torque against the load (never starts?): lowest supply, warmest winding (ambientMaxC): the
 *   least current, so the least torque, whether or not the source limits.
 * - Brown-out of a shared controller: lowest supply, coldest winding. The terminals see
 *   min(I_start, I_lim)·(R_cold + R_s); I_start grows with V, so the lowest supply sags lowest; unlimited,
 *   that is V·(R_cold + R_s)/(R_cold + R_s + R_int) and limited I_lim·(R_cold + R_s), both lowest when
 *   the winding's resistance is smallest, i.e. coldest.
 * - Running current: the design's load full on (duty 1, conservative under PWM) at whichever supply end
 *   draws more, winding at 20 °C as in the rest of the ranking.
 * - Load torque: a torque load is that torque; a speed load is the torque at that speed at the nominal
 *   supply, taken as constant down to standstill (conservative for fans and pumps, whose torque falls
 *   with speed); a stall-only load gives no running point, so the start is judged against the motor's own
 *   friction only (load 0) and the running check uses the no-load current, the least the motor ever draws.
 * The switch is not in the loop here (none is chosen yet): leaving its RDS(on) out raises the start
 * current, which is the conservative side for the limit and the sag.
 */
import { fmt, makeCheck, verdictOf, type Check } from './checks.ts';
import type { DesignCase } from './design-case.ts';
import { motorModelOf } from './design-case.ts';
import { motorAtSupply, type MotorModel } from './motor.ts';
import { operatingPointAtSpeed, operatingPointAtTorque } from './motor-curve.ts';
import {
  brownoutCheck,
  bulkCapacitanceF,
  mechanicalTimeConstantS,
  runningCurrentCheck,
  startCurrentCheck,
  startFigures,
  supplyNotes,
  type SupplyCase,
  type SupplyReport,
} from './supply.ts';

/** Above this multiple of the motor's rated maximum the supply is a fail, not a caution [practice]. */
export const SUPPLY_OVER_MOTOR_FAIL_FACTOR = 1.5;

/** Load torque for the start check; 0 for a stall-only load (friction only). */
export function startLoadTorqueNm(c: DesignCase, model: MotorModel): number {
  if (c.load.kind === 'torque') return c.load.torqueNm;
  if (c.load.kind === 'stall-only') return 0;
  return operatingPointAtSpeed(motorAtSupply(model, c.supplyNomV, c.seriesResistanceOhm), c.load.speedRpm).torqueNm;
}

/** Full-on current of the design's load at the supply end that draws more (the no-load current for stall-only). */
export function designRunningCurrentA(c: DesignCase, model: MotorModel): number {
  if (c.load.kind === 'stall-only') return model.noLoadCurrentA;
  const load = c.load;
  const at = (supplyV: number): number => {
    const m = motorAtSupply(model, supplyV, c.seriesResistanceOhm);
    return (load.kind === 'torque' ? operatingPointAtTorque(m, load.torqueNm) : operatingPointAtSpeed(m, load.speedRpm)).currentA;
  };
  return Math.max(at(c.supplyMinV), at(c.supplyMaxV));
}

/** Supply maximum against the motor's rated maximum (voltageMaxV, else the rated voltage): marginal above, fail above 1.5× [docs/engineering.md §3]. */
export function supplyMotorVoltageCheck(supplyMaxV: number, motor: DesignCase['motor']): Check {
  const ratedMaxV = motor.voltageMaxV ?? motor.ratedVoltageV;
  const ok = supplyMaxV <= ratedMaxV;
  const failV = SUPPLY_OVER_MOTOR_FAIL_FACTOR * ratedMaxV;
  const over = supplyMaxV > failV;
  const rated = motor.voltageMaxV != null ? `rated maximum of ${fmt(ratedMaxV)} V` : `rated ${fmt(ratedMaxV)} V (no maximum stated)`;
  const note = ok
    ? `Supply maximum ${fmt(supplyMaxV)} V is within the motor's ${rated}.`
    : `⚠ Supply maximum ${fmt(supplyMaxV)} V is above the motor's ${rated}: it over-speeds and runs hot, brushes and bearings wear ` +
      `early${over ? `; above ${fmt(failV)} V (1.5×) this is a fail` : ''}. Lower the supply (or limit the duty) or choose a motor rated for it.`;
  return makeCheck(
    {
      id: 'supply-motor-voltage',
      ok,
      value: supplyMaxV,
      limit: ratedMaxV,
      unit: 'V',
      margin: ratedMaxV !== 0 ? (ratedMaxV - supplyMaxV) / ratedMaxV : null,
      note,
    },
    over ? 'hard' : 'margin',
  );
}

function caseAt(c: DesignCase, model: MotorModel, supplyV: number, windingC: number): SupplyCase {
  const internalResistanceOhm = c.source?.internalResistanceOhm ?? 0;
  return {
    model,
    supplyV,
    windingC,
    internalResistanceOhm,
    // DesignCase.seriesResistanceOhm already carries R_int; the source's share is taken back out here.
    seriesResistanceOhm: Math.max(0, c.seriesResistanceOhm - internalResistanceOhm),
    currentLimitA: c.source?.currentLimitA ?? null,
  };
}

/** Capacitance to hold a shared controller up through the start: the larger figure of the two supply ends. */
function designBulk(c: DesignCase, model: MotorModel): { bulk: { capacitanceF: number; tauS: number } | null; reason: string | null } {
  const logic = c.logicSupply;
  if (!logic) return { bulk: null, reason: null };
  const J = c.motor.rotorInertiaKgM2;
  if (J == null)
    return {
      bulk: null,
      reason: 'No bulk-capacitance figure: the motor record gives no rotor inertia J, and the ride-through time τm = J·R/(Kt·Ke) needs it.',
    };
  const limitV = logic.minSupplyV + logic.regulatorDropoutV;
  let best: { capacitanceF: number; tauS: number } | null = null;
  for (const supplyV of [c.supplyMinV, c.supplyMaxV]) {
    const dipV = supplyV - limitV;
    if (!(dipV > 0))
      return {
        bulk: null,
        reason: `No bulk-capacitance figure: at ${fmt(supplyV)} V the source is not above the ${fmt(limitV)} V the controller needs, so no dip is allowed.`,
      };
    const k = caseAt(c, model, supplyV, c.ambientMinC);
    const start = startFigures(k);
    const tauS = mechanicalTimeConstantS(model, J, start.loopOhm);
    const capacitanceF = bulkCapacitanceF(start.startCurrentA, tauS, dipV, k.internalResistanceOhm, k.currentLimitA);
    if (!best || capacitanceF > best.capacitanceF) best = { capacitanceF, tauS };
  }
  return { bulk: best, reason: null };
}

/** The design's supply report at its worst cases (see the file comment). */
export function supplyReportForCase(c: DesignCase, model: MotorModel = motorModelOf(c)): SupplyReport {
  const startMax = startFigures(caseAt(c, model, c.supplyMaxV, c.ambientMinC));
  const startWeak = startFigures(caseAt(c, model, c.supplyMinV, c.ambientMaxC));
  const sag = startFigures(caseAt(c, model, c.supplyMinV, c.ambientMinC));
  const loadTorqueNm = startLoadTorqueNm(c, model);
  const runningCurrentA = designRunningCurrentA(c, model);
  const limitA = c.source?.currentLimitA ?? null;
  const checks: Check[] = [supplyMotorVoltageCheck(c.supplyMaxV, c.motor)];
  if (c.source?.continuousCurrentA != null) checks.push(runningCurrentCheck(runningCurrentA, c.source.continuousCurrentA));
  if (limitA != null) checks.push(startCurrentCheck(startMax.startCurrentA, limitA, startWeak.startTorqueNm, loadTorqueNm, model));
  if (c.logicSupply) checks.push(brownoutCheck(sag.sourceVoltageAtStartV, c.logicSupply));
  const { bulk, reason } = designBulk(c, model);
  const notes = supplyNotes({
    checks,
    supplyV: c.supplyMinV,
    startCurrentA: startMax.startCurrentA,
    internalResistanceOhm: c.source?.internalResistanceOhm ?? 0,
    currentLimitA: limitA,
    logic: c.logicSupply ?? null,
    bulk,
    noBulkReason: reason,
  });
  if (startWeak.startTorqueNm < loadTorqueNm && startWeak.startActualCurrentA === startWeak.startCurrentA) {
    notes.unshift(
      `At the lowest supply (${fmt(c.supplyMinV)} V, winding at ${fmt(c.ambientMaxC)} °C) the motor's own start torque ` +
        `(${fmt(startWeak.startTorqueNm * 1000)} mN·m) is below the ${fmt(loadTorqueNm * 1000)} mN·m load: it stalls whatever the source.`,
    );
  }
  return {
    verdict: verdictOf(checks),
    checks,
    startCurrentA: startMax.startCurrentA,
    startActualCurrentA: startMax.startActualCurrentA,
    sourceVoltageAtStartV: sag.sourceVoltageAtStartV,
    startTorqueNm: startWeak.startTorqueNm,
    runningCurrentA,
    bulkCapacitanceF: bulk?.capacitanceF ?? null,
    notes,
  };
}

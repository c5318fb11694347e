/**
 * Individual low-side N-channel MOSFET checks [domain.md §4]. Each returns one Check with an actionable note.
 */
import { fmt, makeCheck, marginAbove, marginBelow, type Check } from './checks.ts';

/** Gate-drive rails people actually have on a small board, lowest first [practice]. */
export const COMMON_DRIVE_RAILS_V = [3.3, 5, 10, 12, 15] as const;

/** The smallest common rail that reaches requiredV without exceeding VGS(max); null when none does. */
export function suggestedDriveRailV(requiredV: number, vgsMaxV: number): number | null {
  return COMMON_DRIVE_RAILS_V.find((rail) => rail >= requiredV && rail <= vgsMaxV) ?? null;
}

/** Hard: V(BR)DSS ≥ V_supply,max + V_F; margin: V(BR)DSS·derating ≥ the same [domain.md §4, derating 0.8 practice]. */
export function checkDrainVoltage(vdsMaxV: number, supplyMaxV: number, diodeForwardV: number, derating: number): Check {
  const valueV = supplyMaxV + diodeForwardV;
  const deratedV = vdsMaxV * derating;
  const hardOk = valueV <= vdsMaxV;
  const ok = valueV <= deratedV;
  const note = ok
    ? `Drain sees up to ${fmt(valueV)} V (supply plus diode drop); the ${fmt(vdsMaxV)} V rating derated to ${fmt(deratedV)} V covers it.`
    : hardOk
      ? `Drain sees up to ${fmt(valueV)} V, inside the ${fmt(vdsMaxV)} V rating but above its ${fmt(deratedV)} V derated value: choose a part rated at least ${fmt(valueV / derating)} V.`
      : `Drain sees up to ${fmt(valueV)} V, above the ${fmt(vdsMaxV)} V rating: choose a part rated at least ${fmt(valueV / derating)} V.`;
  return makeCheck({ id: 'drain-voltage', ok, value: valueV, limit: vdsMaxV, unit: 'V', margin: marginBelow(valueV, vdsMaxV), note }, hardOk ? 'margin' : 'hard');
}

/** Hard: VGS(max) ≥ the highest level the gate can see. */
export function checkGateVoltageRating(gateDriveMaxV: number, vgsMaxV: number): Check {
  const ok = gateDriveMaxV <= vgsMaxV;
  const note = ok
    ? `Gate sees at most ${fmt(gateDriveMaxV)} V, within VGS(max) ${fmt(vgsMaxV)} V.`
    : `Gate can see ${fmt(gateDriveMaxV)} V, above VGS(max) ${fmt(vgsMaxV)} V: lower the drive voltage (or clamp the gate with a zener) or choose a part rated for it.`;
  return makeCheck({ id: 'gate-voltage-rating', ok, value: gateDriveMaxV, limit: vgsMaxV, unit: 'V', margin: marginBelow(gateDriveMaxV, vgsMaxV), note });
}

function gateDriveFailNote(driveV: number, lowestV: number, vgsThMaxV: number, vgsMaxV: number): string {
  const rail = suggestedDriveRailV(lowestV, vgsMaxV);
  const fix = rail != null
    ? `add a gate driver with an output of at least ${fmt(lowestV)} V (a ${fmt(rail)} V rail works, below VGS(max) ${fmt(vgsMaxV)} V)`
    : `add a gate driver whose output reaches ${fmt(lowestV)} V without exceeding VGS(max) ${fmt(vgsMaxV)} V`;
  const why = driveV < vgsThMaxV
    ? `a ${fmt(driveV)} V drive is below its VGS(th) max of ${fmt(vgsThMaxV)} V, so some parts will not turn on at all`
    : `a ${fmt(driveV)} V drive sits between VGS(th) max (${fmt(vgsThMaxV)} V) and that point, where the part may conduct only partly and overheat`;
  return `RDS(on) is only specified at ${fmt(lowestV)} V and up; ${why}: ${fix}, or choose a part specified at ${fmt(driveV)} V or lower.`;
}

/** Hard: the drive must reach the lowest VGS at which RDS(on) is specified, and VGS(th) max [domain.md §4]. */
export function checkGateDrive(driveV: number, lowestSpecV: number | null, vgsThMaxV: number, vgsMaxV: number, rdsOnAtDriveOhm: number | null): Check {
  if (lowestSpecV == null) {
    const note = 'No RDS(on) line is on record for this part: add the datasheet values before relying on it.';
    return makeCheck({ id: 'gate-drive', ok: false, value: driveV, limit: null, unit: 'V', margin: null, note });
  }
  const ok = driveV >= lowestSpecV && driveV >= vgsThMaxV;
  const note = ok
    ? `RDS(on) is specified from ${fmt(lowestSpecV)} V; the ${fmt(driveV)} V drive reaches it (about ${fmt((rdsOnAtDriveOhm ?? 0) * 1000)} mΩ at 25 °C).`
    : gateDriveFailNote(driveV, lowestSpecV, vgsThMaxV, vgsMaxV);
  return makeCheck({ id: 'gate-drive', ok, value: driveV, limit: Math.max(lowestSpecV, vgsThMaxV), unit: 'V', margin: marginAbove(driveV, lowestSpecV), note });
}

/** Hard: worst-case stall current (highest supply, coldest winding) ≤ IDM. */
export function checkStallCurrent(stallCurrentA: number, idPulsedA: number): Check {
  const ok = stallCurrentA <= idPulsedA;
  const note = ok
    ? `Worst-case stall current ${fmt(stallCurrentA)} A is within the ${fmt(idPulsedA)} A pulsed rating.`
    : `Worst-case stall current ${fmt(stallCurrentA)} A exceeds the ${fmt(idPulsedA)} A pulsed rating: choose a larger part or limit the current (series resistance, current sensing).`;
  return makeCheck({ id: 'stall-current', ok, value: stallCurrentA, limit: idPulsedA, unit: 'A', margin: marginBelow(stallCurrentA, idPulsedA), note });
}

/** Hard: running RMS current ≤ ID(TA) = √((Tj,max − TA)/(RθJA·RDS(on)(Tj,max))) [domain.md §4]. */
export function checkRunningCurrent(currentRmsA: number, maxCurrentA: number | null, ambientC: number): Check {
  if (maxCurrentA == null) {
    const note = 'Running current cannot be assessed: RDS(on) is not characterised at this gate drive.';
    return makeCheck({ id: 'running-current', ok: false, value: currentRmsA, limit: null, unit: 'A', margin: null, note });
  }
  const ok = currentRmsA <= maxCurrentA;
  const note = ok
    ? `Running current ${fmt(currentRmsA)} A (RMS) is within the ${fmt(maxCurrentA)} A this part carries at ${fmt(ambientC)} °C on its test board.`
    : `Running current ${fmt(currentRmsA)} A (RMS) exceeds the ${fmt(maxCurrentA)} A this part carries at ${fmt(ambientC)} °C: choose a part with lower RDS(on) or better cooling.`;
  return makeCheck({ id: 'running-current', ok, value: currentRmsA, limit: maxCurrentA, unit: 'A', margin: marginBelow(currentRmsA, maxCurrentA), note });
}

/** Hard: Tj ≤ Tj,max; margin: Tj ≤ Tj,max − thermal margin. Margin is the share of the rise TA→Tj,max left unused. */
export type NoJunctionReason = 'runaway' | 'not-characterised' | 'linear';

const NO_JUNCTION_NOTES: Record<NoJunctionReason, string> = {
  runaway: 'No steady junction temperature: the RDS(on) rise with heat runs away at this current; choose a part with lower RDS(on) or better cooling.',
  'not-characterised': 'Junction temperature cannot be assessed: RDS(on) is not characterised at this gate drive.',
  linear: 'Junction temperature cannot be assessed: the gate never passes the Miller plateau, so the part dissipates as a linear resistor.',
};

export function checkJunctionTemperature(junctionC: number | null, tjMaxC: number, thermalMarginC: number, ambientC: number, reason: NoJunctionReason = 'runaway'): Check {
  if (junctionC == null) {
    const note = NO_JUNCTION_NOTES[reason];
    return makeCheck({ id: 'junction-temperature', ok: false, value: null, limit: tjMaxC - thermalMarginC, unit: '°C', margin: null, note });
  }
  const targetC = tjMaxC - thermalMarginC;
  const hardOk = junctionC <= tjMaxC;
  const ok = junctionC <= targetC;
  // Limit and margin are against the target (Tj,max less the thermal margin), so ok ⇔ value ≤ limit;
  // margin is the share of the ambient-to-target rise still unused.
  const riseC = targetC - ambientC;
  const margin = riseC > 0 ? (targetC - junctionC) / riseC : null;
  const board = 'RθJA is the test-board figure; a real board differs.';
  const note = ok
    ? `Junction about ${fmt(junctionC)} °C, below the ${fmt(targetC)} °C target (Tj,max ${fmt(tjMaxC)} °C less ${fmt(thermalMarginC)} K). ${board}`
    : `Junction about ${fmt(junctionC)} °C, ${hardOk ? 'inside Tj,max but above' : 'above Tj,max and'} the ${fmt(targetC)} °C target: add copper, lower RDS(on) or switching loss. ${board}`;
  return makeCheck({ id: 'junction-temperature', ok, value: junctionC, limit: targetC, unit: '°C', margin, note }, hardOk ? 'margin' : 'hard');
}

/** Share of the PWM period spent in edges above which edges count as slow, and as unusable [practice, judgement]. */
export const EDGE_SHARE_MARGIN = 0.02;
export const EDGE_SHARE_HARD = 0.2;

/** Flags slow edges under PWM: (t_on + t_off)·f against 2 % (margin) and 20 % (hard) of the period. */
export function checkSwitchingEdges(turnOnS: number, turnOffS: number, pwmHz: number | null): Check {
  if (pwmHz == null || pwmHz <= 0) {
    const note = 'Plain on/off drive: edge speed matters little.';
    return makeCheck({ id: 'switching-edges', ok: true, value: null, limit: null, unit: 's', margin: null, note });
  }
  const edgesS = turnOnS + turnOffS;
  const periodS = 1 / pwmHz;
  if (!Number.isFinite(edgesS)) {
    const note = 'The gate drive never reaches the Miller plateau, so the part never finishes turning on: raise the drive voltage with a gate driver.';
    return makeCheck({ id: 'switching-edges', ok: false, value: null, limit: EDGE_SHARE_MARGIN * periodS, unit: 's', margin: null, note });
  }
  const limitS = EDGE_SHARE_MARGIN * periodS;
  const ok = edgesS <= limitS;
  const hardOk = edgesS <= EDGE_SHARE_HARD * periodS;
  const edgesText = `Edges take about ${fmt(turnOnS * 1e9)} ns on and ${fmt(turnOffS * 1e9)} ns off`;
  const note = ok
    ? `${edgesText}, under 2 % of the ${fmt(periodS * 1e6)} µs PWM period.`
    : `${edgesText}, ${fmt((edgesS / periodS) * 100)} % of the ${fmt(periodS * 1e6)} µs PWM period: drive the gate with more current (a gate driver) or lower the PWM frequency.`;
  return makeCheck({ id: 'switching-edges', ok, value: Number.isFinite(edgesS) ? edgesS : null, limit: limitS, unit: 's', margin: marginBelow(edgesS, limitS), note }, hardOk ? 'margin' : 'hard');
}

/** Low-side ranking takes N-channel parts only; a P-channel part belongs on the high side. */
export function checkChannel(channel: 'n' | 'p'): Check {
  const ok = channel === 'n';
  const note = ok
    ? 'N-channel part, suited to a low-side switch.'
    : 'P-channel part: it belongs on the high side with a gate pulled below the supply; this low-side design needs an N-channel MOSFET.';
  return makeCheck({ id: 'channel', ok, value: null, limit: null, unit: '', margin: null, note });
}

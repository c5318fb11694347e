/**
 * Individual low-side N-channel MOSFET checks [docs/engineering.md §5]. Each returns one Check with an actionable note.
 */
import { fmt, makeCheck, marginAbove, marginBelow, notesOn, type Check } from './checks.ts';

/** Gate-drive rails people actually have on a small board, lowest first [practice]. */
export const COMMON_DRIVE_RAILS_V = [3.3, 5, 10, 12, 15] as const;

/** The smallest common rail that reaches requiredV without exceeding VGS(max); null when none does. */
export function suggestedDriveRailV(requiredV: number, vgsMaxV: number): number | null {
  return COMMON_DRIVE_RAILS_V.find((rail) => rail >= requiredV && rail <= vgsMaxV) ?? null;
}

/**
 * Judged against the derated rating: V_supply,max + V_F ≤ V(BR)DSS·derating (limit = the derated value, so
 * ok ⇔ value ≤ limit); above the raw rating it is a hard fail [docs/engineering.md §5, derating 0.8 practice].
 */
export function checkDrainVoltage(vdsMaxV: number, supplyMaxV: number, diodeForwardV: number, derating: number): Check {
  const valueV = supplyMaxV + diodeForwardV;
  const deratedV = vdsMaxV * derating;
  const hardOk = valueV <= vdsMaxV;
  const ok = valueV <= deratedV;
  const note = !notesOn()
    ? ''
    : ok
      ? `Drain sees up to ${fmt(valueV)} V (supply plus diode drop); the ${fmt(vdsMaxV)} V rating derated to ${fmt(deratedV)} V covers it.`
      : hardOk
        ? `Drain sees up to ${fmt(valueV)} V, inside the ${fmt(vdsMaxV)} V rating but above its ${fmt(deratedV)} V derated value: choose a part rated at least ${fmt(valueV / derating)} V.`
        : `Drain sees up to ${fmt(valueV)} V, above the ${fmt(vdsMaxV)} V rating itself: choose a part rated at least ${fmt(valueV / derating)} V.`;
  return makeCheck(
    { id: 'drain-voltage', ok, value: valueV, limit: deratedV, unit: 'V', margin: marginBelow(valueV, deratedV), note },
    hardOk ? 'margin' : 'hard',
  );
}

/** Without a stated plateau, VGS(th) max plus this stands in for it [judgement: the plateau sits a little above threshold]. */
export const PLATEAU_MARGIN_OVER_VTH_V = 0.5;

/**
 * Hard, in on/off and PWM alike: the drive must exceed the Miller plateau (or VGS(th) max + 0.5 V when no plateau
 * is stated); below it the channel cannot carry the load current fully enhanced [docs/engineering.md §5].
 */
export function checkMillerPlateau(driveV: number, plateauV: number | null | undefined, vgsThMaxV: number): Check {
  const stated = plateauV != null;
  const requiredV = stated ? plateauV : vgsThMaxV + PLATEAU_MARGIN_OVER_VTH_V;
  const ok = driveV > requiredV;
  const basis = !notesOn()
    ? ''
    : stated
      ? `the ${fmt(requiredV)} V Miller plateau`
      : `VGS(th) max ${fmt(vgsThMaxV)} V plus ${fmt(PLATEAU_MARGIN_OVER_VTH_V)} V (no plateau on record)`;
  const note = !notesOn()
    ? ''
    : ok
      ? `The ${fmt(driveV)} V drive clears ${basis}, so the channel enhances fully.`
      : `The ${fmt(driveV)} V drive does not clear ${basis}: the part cannot carry the load current fully enhanced ` +
        `and heats in its linear region; raise the gate drive (a gate driver) or choose a part with a lower plateau.`;
  return makeCheck({ id: 'miller-plateau', ok, value: driveV, limit: requiredV, unit: 'V', margin: marginAbove(driveV, requiredV), note });
}

/** A drive this close to VGS(th) max, with a current this many times the line's test current, is at best marginal [judgement]. */
export const TEST_CURRENT_NEAR_THRESHOLD_V = 1.0;
export const TEST_CURRENT_FACTOR = 2;

/**
 * Margin: an RDS(on) line holds only up to about its test current at a low VGS; a worst-case current well above it
 * at a drive near VGS(th) max may pull the part out of full enhancement [docs/engineering.md §5].
 */
export function checkRdsOnTestCurrent(
  driveV: number,
  vgsThMaxV: number,
  line: { vgsV: number; testCurrentA?: number | null } | null,
  worstCurrentA: number,
): Check {
  const id = 'rdson-test-current';
  if (line == null) {
    return makeCheck({
      id,
      ok: true,
      value: worstCurrentA,
      limit: null,
      unit: 'A',
      margin: null,
      note: 'No RDS(on) line at or below this drive (see the gate-drive check).',
    });
  }
  if (line.testCurrentA == null) {
    return makeCheck({
      id,
      ok: true,
      value: worstCurrentA,
      limit: null,
      unit: 'A',
      margin: null,
      note: `The ${fmt(line.vgsV)} V RDS(on) line states no test current; confirm on the datasheet that it holds at ${fmt(worstCurrentA)} A.`,
    });
  }
  const near = driveV < vgsThMaxV + TEST_CURRENT_NEAR_THRESHOLD_V;
  const limitA = TEST_CURRENT_FACTOR * line.testCurrentA;
  const ok = !near || worstCurrentA <= limitA;
  const note = !notesOn()
    ? ''
    : ok
      ? near
        ? `Worst-case ${fmt(worstCurrentA)} A is within ${TEST_CURRENT_FACTOR}× the ${fmt(line.testCurrentA)} A the ${fmt(line.vgsV)} V line was measured at.`
        : `The ${fmt(driveV)} V drive is well above VGS(th) max ${fmt(vgsThMaxV)} V, so the line's ${fmt(line.testCurrentA)} A test current does not limit.`
      : `At ${fmt(driveV)} V, within ${fmt(TEST_CURRENT_NEAR_THRESHOLD_V)} V of VGS(th) max, the ${fmt(line.vgsV)} V line was measured at only ${fmt(line.testCurrentA)} ` +
        `A but the worst case is ${fmt(worstCurrentA)} A: the part may leave full enhancement; drive the gate harder or choose a part specified at this current.`;
  return makeCheck(
    {
      id,
      ok,
      value: worstCurrentA,
      limit: near ? limitA : null,
      unit: 'A',
      margin: near ? marginBelow(worstCurrentA, limitA) : null,
      note,
    },
    'margin',
  );
}

/** How a jammed shaft is judged for the switch (and what it is judged at). */
export interface StallThermalInput {
  protection: 'none' | 'current-limit' | 'cut-off';
  /** RMS current the switch carries while jammed. */
  currentRmsA: number;
  junctionC: number | null;
  tjMaxC: number;
  ambientC: number;
  /** Seconds until the cut-off, for the transient case. */
  afterS?: number;
  /** True when the transient case used datasheet Zth points; false falls back to steady state. */
  usedZth?: boolean;
  notCharacterised?: boolean;
}

/** Hard: a jam (a steady state unless cut off) must keep Tj ≤ Tj,max; the limit is Tj,max [docs/engineering.md §6]. */
export function checkStallThermal(s: StallThermalInput): Check {
  const id = 'stall-thermal';
  const how = !notesOn()
    ? ''
    : s.protection === 'none'
      ? `With no stall protection a jam is a steady state at ${fmt(s.currentRmsA)} A (RMS)`
      : s.protection === 'current-limit'
        ? `With the current limit a jam settles at ${fmt(s.currentRmsA)} A (RMS)`
        : s.usedZth
          ? `With the cut-off after ${fmt(s.afterS ?? 0)} s a jam heats the junction for that long at ${fmt(s.currentRmsA)} A (single-pulse Zth)`
          : `With the cut-off after ${fmt(s.afterS ?? 0)} s but no Zth curve on record, the jam is judged as a steady state at ${fmt(s.currentRmsA)} A`;
  if (s.notCharacterised) {
    return makeCheck({
      id,
      ok: false,
      value: null,
      limit: s.tjMaxC,
      unit: '°C',
      margin: null,
      note: notesOn() ? `${how}; RDS(on) is not characterised at this drive, so the jam cannot be assessed.` : '',
    });
  }
  if (s.junctionC == null) {
    const note = !notesOn()
      ? ''
      : `${how}: the RDS(on) rise with heat runs away (no steady junction temperature). Limit the stall ` +
        `current, cut the drive off after a short time, or choose a part with lower RDS(on) or RθJA.`;
    return makeCheck({ id, ok: false, value: null, limit: s.tjMaxC, unit: '°C', margin: null, note });
  }
  const ok = s.junctionC <= s.tjMaxC;
  const rise = s.tjMaxC - s.ambientC;
  const margin = rise > 0 ? (s.tjMaxC - s.junctionC) / rise : null;
  const note = !notesOn()
    ? ''
    : ok
      ? `${how}: the junction reaches about ${fmt(s.junctionC)} °C, within Tj,max ${fmt(s.tjMaxC)} °C.`
      : `${how}: the junction would reach about ${fmt(s.junctionC)} °C, above Tj,max ${fmt(s.tjMaxC)} °C. Add ` +
        `a stall protection (current limit or a timed cut-off), or choose a part with lower RDS(on) or RθJA.`;
  return makeCheck({ id, ok, value: s.junctionC, limit: s.tjMaxC, unit: '°C', margin, note });
}

/** Hard: VGS(max) ≥ the highest level the gate can see. */
export function checkGateVoltageRating(gateDriveMaxV: number, vgsMaxV: number): Check {
  const ok = gateDriveMaxV <= vgsMaxV;
  const note = !notesOn()
    ? ''
    : ok
      ? `Gate sees at most ${fmt(gateDriveMaxV)} V, within VGS(max) ${fmt(vgsMaxV)} V.`
      : `Gate can see ${fmt(gateDriveMaxV)} V, above VGS(max) ${fmt(vgsMaxV)} V: lower the drive voltage (or clamp the gate with a zener) or choose a part rated for it.`;
  return makeCheck({
    id: 'gate-voltage-rating',
    ok,
    value: gateDriveMaxV,
    limit: vgsMaxV,
    unit: 'V',
    margin: marginBelow(gateDriveMaxV, vgsMaxV),
    note,
  });
}

function gateDriveFailNote(driveV: number, lowestV: number, vgsThMaxV: number, vgsMaxV: number): string {
  const rail = suggestedDriveRailV(lowestV, vgsMaxV);
  const fix =
    rail != null
      ? `add a gate driver with an output of at least ${fmt(lowestV)} V (a ${fmt(rail)} V rail works, below VGS(max) ${fmt(vgsMaxV)} V)`
      : `add a gate driver whose output reaches ${fmt(lowestV)} V without exceeding VGS(max) ${fmt(vgsMaxV)} V`;
  const why =
    driveV < vgsThMaxV
      ? `a ${fmt(driveV)} V drive is below its VGS(th) max of ${fmt(vgsThMaxV)} V, so some parts will not turn on at all`
      : `a ${fmt(driveV)} V drive sits between VGS(th) max (${fmt(vgsThMaxV)} V) and that point, where the part may conduct only partly and overheat`;
  return `RDS(on) is only specified at ${fmt(lowestV)} V and up; ${why}: ${fix}, or choose a part specified at ${fmt(driveV)} V or lower.`;
}

/** Hard: the drive must reach the lowest VGS at which RDS(on) is specified, and VGS(th) max [docs/engineering.md §5]. */
export function checkGateDrive(
  driveV: number,
  lowestSpecV: number | null,
  vgsThMaxV: number,
  vgsMaxV: number,
  rdsOnAtDriveOhm: number | null,
): Check {
  if (lowestSpecV == null) {
    const note = 'No RDS(on) line is on record for this part: add the datasheet values before relying on it.';
    return makeCheck({ id: 'gate-drive', ok: false, value: driveV, limit: null, unit: 'V', margin: null, note });
  }
  const ok = driveV >= lowestSpecV && driveV >= vgsThMaxV;
  const note = !notesOn()
    ? ''
    : ok
      ? `RDS(on) is specified from ${fmt(lowestSpecV)} V; the ${fmt(driveV)} V drive reaches it (about ${fmt((rdsOnAtDriveOhm ?? 0) * 1000)} mΩ at 25 °C).`
      : gateDriveFailNote(driveV, lowestSpecV, vgsThMaxV, vgsMaxV);
  return makeCheck({
    id: 'gate-drive',
    ok,
    value: driveV,
    limit: Math.max(lowestSpecV, vgsThMaxV),
    unit: 'V',
    margin: marginAbove(driveV, lowestSpecV),
    note,
  });
}

/** Hard: worst-case stall current (highest supply, coldest winding) ≤ IDM. */
export function checkStallCurrent(stallCurrentA: number, idPulsedA: number): Check {
  const ok = stallCurrentA <= idPulsedA;
  const note = !notesOn()
    ? ''
    : ok
      ? `Worst-case stall current ${fmt(stallCurrentA)} A is within the ${fmt(idPulsedA)} A pulsed rating.`
      : `Worst-case stall current ${fmt(stallCurrentA)} A exceeds the ${fmt(idPulsedA)} A pulsed rating: choose a larger part or limit the current (series resistance, current sensing).`;
  return makeCheck({
    id: 'stall-current',
    ok,
    value: stallCurrentA,
    limit: idPulsedA,
    unit: 'A',
    margin: marginBelow(stallCurrentA, idPulsedA),
    note,
  });
}

/** Hard: running RMS current ≤ ID(TA) = √((Tj,max − TA)/(RθJA·RDS(on)(Tj,max))) [docs/engineering.md §5]. */
export function checkRunningCurrent(currentRmsA: number, maxCurrentA: number | null, ambientC: number): Check {
  if (maxCurrentA == null) {
    const note = 'Running current cannot be assessed: RDS(on) is not characterised at this gate drive.';
    return makeCheck({ id: 'running-current', ok: false, value: currentRmsA, limit: null, unit: 'A', margin: null, note });
  }
  const ok = currentRmsA <= maxCurrentA;
  const note = !notesOn()
    ? ''
    : ok
      ? `Running current ${fmt(currentRmsA)} A (RMS) is within the ${fmt(maxCurrentA)} A this part carries at ${fmt(ambientC)} °C on its test board.`
      : `Running current ${fmt(currentRmsA)} A (RMS) exceeds the ${fmt(maxCurrentA)} A this part carries at ${fmt(ambientC)} °C: choose a part with lower RDS(on) or better cooling.`;
  return makeCheck({
    id: 'running-current',
    ok,
    value: currentRmsA,
    limit: maxCurrentA,
    unit: 'A',
    margin: marginBelow(currentRmsA, maxCurrentA),
    note,
  });
}

/** Hard: Tj ≤ Tj,max; margin: Tj ≤ Tj,max − thermal margin. Margin is the share of the rise TA→Tj,max left unused. */
export type NoJunctionReason = 'runaway' | 'not-characterised' | 'linear';

const NO_JUNCTION_NOTES: Record<NoJunctionReason, string> = {
  runaway:
    'No steady junction temperature: the RDS(on) rise with heat runs away at this current; choose a part with lower RDS(on) or better cooling.',
  'not-characterised': 'Junction temperature cannot be assessed: RDS(on) is not characterised at this gate drive.',
  linear: 'Junction temperature cannot be assessed: the gate never passes the Miller plateau, so the part dissipates as a linear resistor.',
};

export function checkJunctionTemperature(
  junctionC: number | null,
  tjMaxC: number,
  thermalMarginC: number,
  ambientC: number,
  reason: NoJunctionReason = 'runaway',
): Check {
  if (junctionC == null) {
    const note = NO_JUNCTION_NOTES[reason];
    return makeCheck({
      id: 'junction-temperature',
      ok: false,
      value: null,
      limit: tjMaxC - thermalMarginC,
      unit: '°C',
      margin: null,
      note,
    });
  }
  const targetC = tjMaxC - thermalMarginC;
  const hardOk = junctionC <= tjMaxC;
  const ok = junctionC <= targetC;
  // Limit and margin are against the target (Tj,max less the thermal margin), so ok ⇔ value ≤ limit;
  // margin is the share of the ambient-to-target rise still unused.
  const riseC = targetC - ambientC;
  const margin = riseC > 0 ? (targetC - junctionC) / riseC : null;
  const board = 'RθJA is the test-board figure; a real board differs.';
  const note = !notesOn()
    ? ''
    : ok
      ? `Junction about ${fmt(junctionC)} °C, below the ${fmt(targetC)} °C target (Tj,max ${fmt(tjMaxC)} °C less ${fmt(thermalMarginC)} K). ${board}`
      : `Junction about ${fmt(junctionC)} °C, ${hardOk ? 'inside Tj,max but above' : 'above Tj,max and'} the ${fmt(targetC)} °C target: add copper, lower RDS(on) or switching loss. ${board}`;
  return makeCheck(
    { id: 'junction-temperature', ok, value: junctionC, limit: targetC, unit: '°C', margin, note },
    hardOk ? 'margin' : 'hard',
  );
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
    const note =
      'The gate drive never reaches the Miller plateau, so the part never finishes turning on: raise the drive voltage with a gate driver.';
    return makeCheck({ id: 'switching-edges', ok: false, value: null, limit: EDGE_SHARE_MARGIN * periodS, unit: 's', margin: null, note });
  }
  const limitS = EDGE_SHARE_MARGIN * periodS;
  const ok = edgesS <= limitS;
  const hardOk = edgesS <= EDGE_SHARE_HARD * periodS;
  const edgesText = !notesOn() ? '' : `Edges take about ${fmt(turnOnS * 1e9)} ns on and ${fmt(turnOffS * 1e9)} ns off`;
  const note = !notesOn()
    ? ''
    : ok
      ? `${edgesText}, under 2 % of the ${fmt(periodS * 1e6)} µs PWM period.`
      : `${edgesText}, ${fmt((edgesS / periodS) * 100)} % of the ${fmt(periodS * 1e6)} µs PWM period: drive the gate with more current (a gate driver) or lower the PWM frequency.`;
  return makeCheck(
    {
      id: 'switching-edges',
      ok,
      value: Number.isFinite(edgesS) ? edgesS : null,
      limit: limitS,
      unit: 's',
      margin: marginBelow(edgesS, limitS),
      note,
    },
    hardOk ? 'margin' : 'hard',
  );
}

/** Low-side ranking takes N-channel parts only; a P-channel part belongs on the high side. */
export function checkChannel(channel: 'n' | 'p'): Check {
  const ok = channel === 'n';
  const note = !notesOn()
    ? ''
    : ok
      ? 'N-channel part, suited to a low-side switch.'
      : 'P-channel part: it belongs on the high side with a gate pulled below the supply; this low-side design needs an N-channel MOSFET.';
  return makeCheck({ id: 'channel', ok, value: null, limit: null, unit: '', margin: null, note });
}

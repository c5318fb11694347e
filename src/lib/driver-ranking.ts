/**
 * Ranks gate drivers / level shifters for one switch (the chosen one, or the top candidate before a choice), each
 * paired with that switch's evaluation at the driver's own real output.
 */
import { fmt, makeCheck, verdictOf, withoutNotes, type Check, type Verdict } from './checks.ts';
import type { CandidatePart } from './domain/parts.ts';
import { checkDriver, driverOutputHighV, type SupplyRange } from './driver-checks.ts';
import { worstCaseOf, type DesignCase, type WorstCase } from './design-case.ts';
import { walkPowerOn, type PowerOnResult } from './power-on.ts';
import { lowestSpecVgsV, rdsOnPointsAt25C } from './rdson.ts';
import { evaluateSwitchPart, judgeAs, scoreOf, sortCandidates, type CandidateResult, type GateDrive, type Keep } from './ranking.ts';
import { switchingChargeNc } from './switching.ts';

export interface DriverPairing {
  switchPartId: number | null;
  switchMpn: string;
  /** Verdict of the switch when driven by this driver. */
  switchVerdict: Verdict;
  gateDriveV: number;
  inverting: boolean;
}

export interface DriverCandidateResult extends CandidateResult {
  pairing: DriverPairing;
  powerOn: PowerOnResult;
}

export function driverSupplyOf(c: DesignCase): SupplyRange {
  return c.driverSupply ?? { minV: c.supplyMinV, maxV: c.supplyMaxV };
}

/** The gate drive a real driver delivers: output high at its lowest supply, its rated source and sink currents. */
export function gateDriveOfDriver(c: DesignCase, driver: CandidatePart<'driver'>): GateDrive {
  const supply = driverSupplyOf(c);
  return {
    voltageV: driverOutputHighV(driver.params, supply.minV),
    maxVoltageV: supply.maxV,
    sourceCurrentA: driver.params.sourceCurrentA,
    sinkCurrentA: driver.params.sinkCurrentA,
    driverPartId: driver.id ?? null,
    driverMpn: driver.mpn,
  };
}

/** Checks of a driver that do not depend on the switch: supply range, input levels, duty error. */
const STANDALONE = new Set(['driver-supply', 'input-high', 'input-low', 'duty-error']);

/** A driver that holds on its own (no hard failure of the switch-independent checks). */
export function driverHoldsAlone(c: DesignCase, driver: CandidatePart<'driver'>, wc: WorstCase): boolean {
  // Only the verdicts are read: the checks' notes are not worked out.
  const checks = withoutNotes(checkDriver, {
    driver: driver.params,
    supply: driverSupplyOf(c),
    logic: c.logic,
    requiredGateV: null,
    vgsMaxV: Infinity,
    switchingChargeNc: 0,
    pwmHz: wc.pwmHz,
  });
  return !checks.some((x) => STANDALONE.has(x.id) && !x.ok && x.severity !== 'margin');
}

/**
 * Before a driver is chosen, switches are judged at a real catalogue driver: among those that hold on their own,
 * the one giving the highest output at the lowest driver supply (then the most source current).
 */
export function provisionalDriver(c: DesignCase, drivers: CandidatePart<'driver'>[], wc: WorstCase): CandidatePart<'driver'> | null {
  const viable = drivers.filter((d) => driverHoldsAlone(c, d, wc));
  const supply = driverSupplyOf(c);
  viable.sort(
    (a, b) =>
      driverOutputHighV(b.params, supply.minV) - driverOutputHighV(a.params, supply.minV) ||
      b.params.sourceCurrentA - a.params.sourceCurrentA ||
      a.mpn.localeCompare(b.mpn),
  );
  return viable[0] ?? null;
}

function pairedSwitchCheck(mpn: string, verdict: Verdict): Check {
  const note =
    verdict === 'pass'
      ? `With this driver, ${mpn} passes every check.`
      : `With this driver, ${mpn} is ${verdict}: see the switch's checks at this drive.`;
  return makeCheck(
    { id: 'paired-switch', ok: verdict === 'pass', value: null, limit: null, unit: '', margin: null, note },
    verdict === 'marginal' ? 'margin' : 'hard',
  );
}

/**
 * The motor must stay off at reset. A chain that starts it but is held off by the recommended pull (it goes on the
 * bill of materials) is marginal; one that no pull can fix fails unless the designer recorded the start as intended.
 */
function powerOnCheck(powerOn: PowerOnResult, startIntended: boolean): Check {
  if (!powerOn.motorCanStart)
    return makeCheck({ id: 'power-on', ok: true, value: null, limit: null, unit: '', margin: null, note: powerOn.note });
  const fixed = powerOn.recommendedPull?.ok === true && powerOn.withRecommendedPull?.motorState === 'off';
  if (startIntended)
    return makeCheck({
      id: 'power-on',
      ok: true,
      value: null,
      limit: null,
      unit: '',
      margin: null,
      note: `${powerOn.note} The designer recorded this start at reset as intended.`,
    });
  return makeCheck(
    { id: 'power-on', ok: false, value: null, limit: null, unit: '', margin: null, note: powerOn.note },
    fixed ? 'margin' : 'hard',
  );
}

export function powerOnForPair(c: DesignCase, driver: CandidatePart<'driver'> | null, sw: CandidatePart<'mosfet'>): PowerOnResult {
  return walkPowerOn({
    pin: {
      railV: c.logic.railV,
      resetDefault: c.logic.resetDefault,
      sourceCurrentA: c.logic.pinSourceCurrentA,
      sinkCurrentA: c.logic.pinSinkCurrentA,
    },
    driver: driver ? { params: driver.params, supply: driverSupplyOf(c) } : null,
    mosfet: { vgsThMinV: sw.params.vgsThMinV },
    series: c.resistorSeries,
  });
}

/** One driver for one switch: its checks, the switch judged at its output, and the power-on walk. */
export function evaluateDriverPart(
  c: DesignCase,
  driver: CandidatePart<'driver'>,
  forSwitch: CandidatePart<'mosfet'>,
  wc: WorstCase,
  startIntended: boolean,
): DriverCandidateResult {
  const supply = driverSupplyOf(c);
  const sw = forSwitch.params;
  const drive = gateDriveOfDriver(c, driver);
  const paired = evaluateSwitchPart(c, forSwitch, drive, wc);
  const powerOn = powerOnForPair(c, driver, forSwitch);
  const checks = [
    ...checkDriver({
      driver: driver.params,
      supply,
      logic: c.logic,
      requiredGateV: lowestSpecVgsV(rdsOnPointsAt25C(sw.rdsOn)),
      vgsMaxV: sw.vgsMaxV,
      switchingChargeNc: switchingChargeNc(sw.qgTotalNc, sw.qgdNc, sw.qgsNc),
      pwmHz: wc.pwmHz,
    }),
    powerOnCheck(powerOn, startIntended),
    pairedSwitchCheck(forSwitch.mpn, paired.verdict),
  ];
  const verdict = verdictOf(checks);
  return {
    partId: driver.id ?? null,
    mpn: driver.mpn,
    manufacturer: driver.manufacturer,
    verdict,
    score: scoreOf(checks, verdict),
    checks,
    pairing: {
      switchPartId: forSwitch.id ?? null,
      switchMpn: forSwitch.mpn,
      switchVerdict: paired.verdict,
      gateDriveV: drive.voltageV,
      inverting: driver.params.inverting,
    },
    powerOn,
  };
}

/** Drivers ranked for one switch, each paired with that switch's evaluation at the driver's output. */
export function rankDriverCandidates(
  c: DesignCase,
  drivers: CandidatePart<'driver'>[],
  forSwitch: CandidatePart<'mosfet'>,
  wc: WorstCase = worstCaseOf(c),
  startIntended = false,
  keep: Keep = 'full',
): DriverCandidateResult[] {
  return sortCandidates(drivers.map(judgeDriverFor(c, forSwitch, wc, startIntended, keep)));
}

/** evaluateDriverPart for many drivers and one switch, kept as `keep` says. */
export function judgeDriverFor(
  c: DesignCase,
  forSwitch: CandidatePart<'mosfet'>,
  wc: WorstCase,
  startIntended: boolean,
  keep: Keep,
): (driver: CandidatePart<'driver'>) => DriverCandidateResult {
  return judgeAs(keep, (d: CandidatePart<'driver'>) => evaluateDriverPart(c, d, forSwitch, wc, startIntended));
}

export function describeDriverNeed(logicHighV: number, mpn: string, requiredV: number, railV: number | null): string {
  const rail =
    railV != null ? `a gate driver with a ${fmt(railV)} V or higher output` : `a gate driver whose output reaches ${fmt(requiredV)} V`;
  return `No switch passes when driven straight from the ${fmt(logicHighV)} V logic high; ${mpn} needs at least ${fmt(requiredV)} V at its gate: use ${rail}.`;
}

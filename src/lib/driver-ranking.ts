/**
 * Ranks gate drivers / level shifters for one chosen switch, with pairing information.
 */
import { fmt, makeCheck, verdictOf, type Check, type Verdict } from './checks.ts';
import type { PartOf } from './domain/parts.ts';
import { checkDriver, driverOutputHighV, type SupplyRange } from './driver-checks.ts';
import { worstCaseOf, type DesignCase } from './design-case.ts';
import { walkPowerOn, type PowerOnResult } from './power-on.ts';
import { lowestSpecVgsV, rdsOnPointsAt25C } from './rdson.ts';
import { evaluateSwitchPart, minMarginScore, sortCandidates, type CandidateResult } from './ranking.ts';
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

const DRIVER_SCORED = ['driver-supply', 'input-high', 'input-low', 'output-high', 'gate-voltage-rating', 'switching-edges', 'duty-error'] as const;

export function driverSupplyOf(c: DesignCase): SupplyRange {
  return c.driverSupply ?? { minV: c.supplyMinV, maxV: c.supplyMaxV };
}

function pairedSwitchCheck(mpn: string, verdict: Verdict): Check {
  const note = verdict === 'pass'
    ? `With this driver, ${mpn} passes every check.`
    : `With this driver, ${mpn} is ${verdict}: see the switch's checks at this drive.`;
  return makeCheck({ id: 'paired-switch', ok: verdict === 'pass', value: null, limit: null, unit: '', margin: null, note }, verdict === 'marginal' ? 'margin' : 'hard');
}

function powerOnCheck(powerOn: PowerOnResult): Check {
  // A start-up at reset is fixable with one resistor, so it lowers the verdict to marginal rather than failing the part.
  return makeCheck({ id: 'power-on', ok: !powerOn.motorCanStart, value: null, limit: null, unit: '', margin: null, note: powerOn.note }, 'margin');
}

function evaluateDriverPart(c: DesignCase, driver: PartOf<'driver'>, forSwitch: PartOf<'mosfet'>): DriverCandidateResult {
  const supply = driverSupplyOf(c);
  const sw = forSwitch.params;
  const wc = worstCaseOf(c);
  const gateDriveV = driverOutputHighV(driver.params, supply.minV);
  const paired = evaluateSwitchPart(c, forSwitch, {
    voltageV: gateDriveV, maxVoltageV: supply.maxV,
    sourceCurrentA: driver.params.sourceCurrentA, sinkCurrentA: driver.params.sinkCurrentA,
  }, wc);
  const powerOn = walkPowerOn({
    pin: { railV: c.logic.railV, resetDefault: c.logic.resetDefault, sourceCurrentA: c.logic.pinSourceCurrentA, sinkCurrentA: c.logic.pinSinkCurrentA },
    driver: { params: driver.params, supply },
    mosfet: { vgsThMinV: sw.vgsThMinV },
    series: c.resistorSeries,
  });
  const checks = [
    ...checkDriver({
      driver: driver.params, supply, logic: c.logic,
      requiredGateV: lowestSpecVgsV(rdsOnPointsAt25C(sw.rdsOn)), vgsMaxV: sw.vgsMaxV,
      switchingChargeNc: switchingChargeNc(sw.qgTotalNc, sw.qgdNc, sw.qgsNc), pwmHz: wc.pwmHz,
    }),
    powerOnCheck(powerOn),
    pairedSwitchCheck(forSwitch.mpn, paired.verdict),
  ];
  return {
    partId: driver.id ?? null, mpn: driver.mpn, manufacturer: driver.manufacturer,
    verdict: verdictOf(checks), score: minMarginScore(checks, DRIVER_SCORED), checks,
    pairing: { switchPartId: forSwitch.id ?? null, switchMpn: forSwitch.mpn, switchVerdict: paired.verdict, gateDriveV, inverting: driver.params.inverting },
    powerOn,
  };
}

/** Drivers ranked for one switch, each paired with that switch's evaluation at the driver's output. */
export function rankDriverCandidates(c: DesignCase, drivers: PartOf<'driver'>[], forSwitch: PartOf<'mosfet'>): DriverCandidateResult[] {
  return sortCandidates(drivers.map((d) => evaluateDriverPart(c, d, forSwitch)));
}

export function describeDriverNeed(logicHighV: number, mpn: string, requiredV: number, railV: number | null): string {
  const rail = railV != null ? `a gate driver with a ${fmt(railV)} V or higher output` : `a gate driver whose output reaches ${fmt(requiredV)} V`;
  return `No switch passes when driven straight from the ${fmt(logicHighV)} V logic high; ${mpn} needs at least ${fmt(requiredV)} V at its gate: use ${rail}.`;
}

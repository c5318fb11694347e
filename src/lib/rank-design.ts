/**
 * The whole design: switch (direct drive first), driver when needed, diode, power-on walk and cautions.
 */
import { fmt } from './checks.ts';
import { avalancheEnergyJ, avalanchePowerW } from './diode-checks.ts';
import type { PartOf } from './domain/parts.ts';
import { describeDriverNeed, driverSupplyOf, rankDriverCandidates, type DriverCandidateResult } from './driver-ranking.ts';
import { motorConsistencyOf, worstCaseOf, type DesignCase, type WorstCase } from './design-case.ts';
import { suggestedDriveRailV } from './mosfet-checks.ts';
import { walkPowerOn, type PowerOnResult } from './power-on.ts';
import { evaluateSwitchPart, rankDiodeCandidates, sortCandidates, type CandidateResult, type SwitchCandidateResult } from './ranking.ts';
import { lowestSpecVgsV, rdsOnPointsAt25C } from './rdson.ts';
import { formatSi } from './units.ts';
import { CAUTIONS } from './safety-notes.ts';

export interface DesignRanking {
  worstCase: WorstCase;
  /** Switches driven straight from the logic pin. */
  switch: SwitchCandidateResult[];
  driverNeeded: boolean;
  driverNeededNote: string | null;
  /** Lowest RDS(on) spec VGS of the switch the design settles on. */
  requiredGateDriveV: number | null;
  /** Switches driven by an ideal driver at each part's smallest suitable common rail (filled when a driver is needed). */
  switchWithDriver: SwitchCandidateResult[];
  driver: DriverCandidateResult[];
  diode: CandidateResult[];
  powerOn: PowerOnResult | null;
  cautions: string[];
}

export interface DesignCatalogue {
  mosfets: PartOf<'mosfet'>[];
  drivers: PartOf<'driver'>[];
  diodes: PartOf<'diode'>[];
}

/** Safety cautions shown with every result (src/lib/safety-notes.ts, domain.md §9). */
export const STANDING_CAUTIONS: readonly string[] = CAUTIONS.map((c) => `${c.title}: ${c.text}`);

/** An ideal driver for a part: its smallest suitable common rail (or its lowest spec VGS), 1 A each way. */
function idealDriveFor(part: PartOf<'mosfet'>): { voltageV: number; sourceCurrentA: number; sinkCurrentA: number } | null {
  const lowestV = lowestSpecVgsV(rdsOnPointsAt25C(part.params.rdsOn));
  if (lowestV == null) return null;
  const voltageV = suggestedDriveRailV(lowestV, part.params.vgsMaxV) ?? lowestV;
  return { voltageV, sourceCurrentA: 1, sinkCurrentA: 1 };
}

function rankWithIdealDriver(c: DesignCase, mosfets: PartOf<'mosfet'>[], wc: WorstCase): SwitchCandidateResult[] {
  const results = mosfets.flatMap((m) => {
    const drive = idealDriveFor(m);
    return drive == null || m.params.channel !== 'n' ? [] : [evaluateSwitchPart(c, m, drive, wc)];
  });
  return sortCandidates(results);
}

function dynamicCautions(c: DesignCase, wc: WorstCase, diode: CandidateResult[]): string[] {
  const cautions: string[] = [];
  const consistency = motorConsistencyOf(c);
  if (consistency.warning) cautions.push(consistency.warning);
  cautions.push(`Worst-case start-up current is ${fmt(wc.stallCurrentMaxA)} A (stall at ${fmt(wc.supplyMaxV)} V with the winding at ${fmt(wc.windingColdC)} °C): fuse and wiring must carry it.`);
  cautions.push('Junction temperatures use the datasheet RθJA from its test board; your board may run hotter or cooler.');
  const diodeOk = diode.some((d) => d.verdict !== 'fail');
  if (!diodeOk && c.motor.inductanceH != null) {
    const energyJ = avalancheEnergyJ(c.motor.inductanceH, wc.stallCurrentMaxA);
    const perCycle = wc.pwmHz != null ? `, ${fmt(avalanchePowerW(c.motor.inductanceH, wc.stallCurrentMaxA, wc.pwmHz))} W at ${formatSi(wc.pwmHz, 'Hz', 3)}` : '';
    cautions.push(`No suitable freewheel diode: without one, ½·L·I² = ${fmt(energyJ * 1000)} mJ avalanches the switch at every turn-off${perCycle}.`);
  }
  return cautions;
}

function findPart<T extends { id?: number; mpn: string }>(parts: T[], result: CandidateResult | undefined): T | undefined {
  if (result == null) return undefined;
  return parts.find((p) => (p.id ?? null) === result.partId && p.mpn === result.mpn);
}

/** Power-on walk for a given switch and (optional) driver. */
export function powerOnFor(c: DesignCase, sw: PartOf<'mosfet'> | undefined, driver: PartOf<'driver'> | undefined): PowerOnResult | null {
  if (sw == null) return null;
  return walkPowerOn({
    pin: { railV: c.logic.railV, resetDefault: c.logic.resetDefault, sourceCurrentA: c.logic.pinSourceCurrentA, sinkCurrentA: c.logic.pinSinkCurrentA },
    driver: driver ? { params: driver.params, supply: driverSupplyOf(c) } : null,
    mosfet: { vgsThMinV: sw.params.vgsThMinV },
    series: c.resistorSeries,
  });
}

export function rankDesign(c: DesignCase, catalogue: DesignCatalogue): DesignRanking {
  const wc = worstCaseOf(c);
  const direct = sortCandidates(catalogue.mosfets.map((m) => evaluateSwitchPart(c, m, undefined, wc)));
  const diode = rankDiodeCandidates(c, catalogue.diodes);
  const driverNeeded = !direct.some((r) => r.verdict === 'pass');
  const withDriver = driverNeeded ? rankWithIdealDriver(c, catalogue.mosfets, wc) : [];
  const chosen = driverNeeded ? withDriver[0] : direct[0];
  const chosenPart = findPart(catalogue.mosfets, chosen);
  const requiredGateDriveV = chosenPart ? lowestSpecVgsV(rdsOnPointsAt25C(chosenPart.params.rdsOn)) : null;
  const driver = driverNeeded && chosenPart ? rankDriverCandidates(c, catalogue.drivers, chosenPart) : [];
  const bestDriver = driver.find((d) => d.verdict !== 'fail');
  const driverNeededNote = !driverNeeded
    ? null
    : chosenPart && requiredGateDriveV != null
      ? describeDriverNeed(c.logic.highV, chosenPart.mpn, requiredGateDriveV, suggestedDriveRailV(requiredGateDriveV, chosenPart.params.vgsMaxV))
      : 'No switch passes with direct drive and none in the catalogue has RDS(on) data to size a driver for.';
  const powerOn = powerOnFor(c, chosenPart, driverNeeded ? findPart(catalogue.drivers, bestDriver) : undefined);
  return {
    worstCase: wc,
    switch: direct,
    driverNeeded,
    driverNeededNote,
    requiredGateDriveV,
    switchWithDriver: withDriver,
    driver,
    diode,
    powerOn,
    cautions: [...(powerOn?.motorCanStart ? [powerOn.note] : []), ...dynamicCautions(c, wc, diode), ...STANDING_CAUTIONS],
  };
}

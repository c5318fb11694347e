/**
 * Invented, parametric parts and design cases for unit tests. No real brands or part numbers.
 */
import type { DesignCase } from '../../src/lib/design-case.ts';
import type { DiodeParams, DriverParams, MosfetParams, MotorParams, PartOf } from '../../src/lib/domain/parts.ts';

const base = {
  description: 'invented test part',
  package: 'SOT-23',
  lifecycle: 'active' as const,
  lifecycleEffectiveDate: null,
  reviewStatus: 'approved' as const,
  sources: [],
};

export function mosfetPart(id: number, mpn: string, params: Partial<MosfetParams> = {}): PartOf<'mosfet'> {
  return {
    ...base,
    id,
    mpn,
    manufacturer: 'Invented Semis',
    category: 'mosfet',
    params: {
      channel: 'n',
      vdsMaxV: 30,
      vgsMaxV: 20,
      vgsThMinV: 1.0,
      vgsThMaxV: 2.5,
      vgsThTestCurrentA: 250e-6,
      idContinuousA: 4,
      idPulsedA: 20,
      qgTotalNc: 6,
      qgTestVgsV: 4.5,
      qgsNc: 1.5,
      qgdNc: 2,
      vPlateauV: 2.6,
      rthJaCPerW: 250,
      tjMaxC: 150,
      bodyDiodeVfV: 0.8,
      zthPoints: [],
      rdsOn: [
        { vgsV: 2.5, tjC: 25, maxOhm: 0.08, typOhm: 0.06, idA: 1 },
        { vgsV: 4.5, tjC: 25, maxOhm: 0.05, typOhm: 0.04, idA: 2 },
      ],
      ...params,
    },
  };
}

export function driverPart(id: number, mpn: string, params: Partial<DriverParams> = {}): PartOf<'driver'> {
  return {
    ...base,
    id,
    mpn,
    manufacturer: 'Invented Drives',
    category: 'driver',
    params: {
      kind: 'gate-driver',
      channels: 1,
      inverting: false,
      supplyMinV: 4.5,
      supplyMaxV: 18,
      inputLogic: 'fixed',
      inputHighMin: 2.0,
      inputLowMax: 0.8,
      outputHighDropV: 0.1,
      outputLowMaxV: 0.1,
      sourceCurrentA: 1,
      sinkCurrentA: 1,
      propagationDelayNs: 50,
      inputPull: 'down',
      inputPullOhms: 100_000,
      ...params,
    },
  };
}

export function diodePart(id: number, mpn: string, params: Partial<DiodeParams> = {}): PartOf<'diode'> {
  return {
    ...base,
    id,
    mpn,
    manufacturer: 'Invented Rectifiers',
    category: 'diode',
    params: {
      kind: 'schottky',
      vrrmV: 40,
      ifAvA: 1,
      ifsmA: 25,
      vfV: 0.45,
      vfAtIfA: 1,
      trrNs: null,
      ifrmA: null,
      rthJaCPerW: 100,
      tjMaxC: 150,
      ...params,
    },
  };
}

/** docs/engineering.md §2 worked example M1 (invented, self-consistent), with the §3 inductance. */
export const MOTOR_M1: MotorParams = {
  ratedVoltageV: 3,
  voltageMinV: null,
  voltageMaxV: null,
  noLoadSpeedRpm: 12000,
  noLoadCurrentA: 0.2,
  stallTorqueNm: 0.0033953,
  stallCurrentA: 1.8,
  terminalResistanceOhm: null,
  inductanceH: 0.15e-3,
  rotorInertiaKgM2: null,
};

/** M1 on a 3.3 V controller pin with PWM at 20 kHz. */
export function caseM1(overrides: Partial<DesignCase> = {}): DesignCase {
  return {
    motor: MOTOR_M1,
    supplyMinV: 2.7,
    supplyNomV: 3,
    supplyMaxV: 3.3,
    seriesResistanceOhm: 0,
    logic: {
      // LVCMOS VOH min = VDD − 0.2 V [JEDEC JESD8C, from memory]
      highV: 3.1,
      lowV: 0.4,
      railV: 3.3,
      pinSourceCurrentA: 0.008,
      pinSinkCurrentA: 0.008,
      resetDefault: { pull: 'down', pullOhms: 40000, pullTolerance: 0.3 },
    },
    drive: { mode: 'pwm', frequencyHz: 20000, dutyMin: 0.2, dutyMax: 1 },
    ambientMinC: -10,
    ambientMaxC: 50,
    load: { kind: 'torque', torqueNm: 0.0012 },
    ...overrides,
  };
}

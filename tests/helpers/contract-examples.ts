/**
 * The request examples of ../shared/api-contract.md (an invented motor and MOSFET), in one place for the
 * unit and API tests. Treat them as read-only; tests that change one take a structuredClone first.
 */
export const MOTOR_M1 = { ratedVoltageV: 3, noLoadSpeedRpm: 12000, noLoadCurrentA: 0.2, stallCurrentA: 1.8, stallTorqueNm: 0.0033953 };

export const MOTOR_BODY = { motor: MOTOR_M1, supplyV: 3 };

export const PULL_BODY = {
  pin: { internalPull: 'up', internalPullOhms: 40000, railV: 3.3, maxCurrentA: 0.004 },
  external: { to: 'down', railV: 0 },
  node: { mustBe: 'low', limitV: 0.5 },
  series: 'E12',
};

export const SWITCH_BODY = {
  mosfet: {
    vdsMaxV: 30,
    vgsMaxV: 20,
    vgsThMaxV: 2.5,
    idPulsedA: 20,
    tjMaxC: 150,
    rthJaCPerW: 250,
    qgTotalNc: 6,
    qgdNc: 2,
    qgsNc: 1.5,
    vPlateauV: 2.6,
    rdsOn: [
      { vgsV: 4.5, ohms: 0.05 },
      { vgsV: 10, ohms: 0.035 },
    ],
    rdsOnTempCoeffPerC: 0.005,
  },
  operating: {
    supplyMaxV: 5,
    runningCurrentA: 0.8,
    stallCurrentA: 3,
    gateDriveV: 5,
    gateDriveCurrentA: 0.02,
    gateResistanceOhm: 0,
    pwmHz: 20000,
    duty: 0.6,
    ambientC: 40,
    diodeForwardV: 0.5,
  },
  margins: { voltageDerating: 0.8, thermalMarginC: 25 },
};

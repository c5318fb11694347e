/** Data the design pages need besides the design itself. */
import { db } from '../db.ts';
import { motorsForOptions } from '../repos/parts.ts';
import type { DesignInput, MotorOption } from '../../lib/domain/design.ts';
import { DEFAULT_DESIGN_MARGINS, LOGIC_PRESETS, SUPPLY_PRESETS, motorOptionOf } from '../../lib/domain/design.ts';
import { supplyFromPreset } from '../../lib/supply-input.ts';
import type { MotorHandoff } from '../../lib/motor-handoff.ts';

/** Motors offered before any search: the first few by part number, plus the ones asked for (the design's). */
export const MOTOR_OPTIONS_SHOWN = 20;

export async function motorOptions(includeIds: number[] = []): Promise<MotorOption[]> {
  return (await motorsForOptions(db(), MOTOR_OPTIONS_SHOWN, includeIds)).map(motorOptionOf);
}

/** A new design's starting point: 3.3 V logic on a 1S Li-ion pack, on/off, the first catalogue motor. */
export function newDesignInput(firstMotorId: number | null, fromCalculator: MotorHandoff | null = null): DesignInput {
  const supply = SUPPLY_PRESETS.find((p) => p.id === '1s-liion')!;
  const logic = LOGIC_PRESETS.find((p) => p.id === '3v3')!;
  const fromPreset = supplyFromPreset(supply);
  return {
    name: fromCalculator ? 'Drive for the motor from the calculator' : 'New drive design',
    motor: fromCalculator
      ? {
          source: 'manual',
          label: 'Motor from the calculator',
          params: {
            ratedVoltageV: fromCalculator.ratedVoltageV,
            voltageMinV: null,
            voltageMaxV: null,
            noLoadSpeedRpm: fromCalculator.noLoadSpeedRpm,
            noLoadCurrentA: fromCalculator.noLoadCurrentA,
            stallTorqueNm: fromCalculator.stallTorqueNm,
            stallCurrentA: fromCalculator.stallCurrentA,
            terminalResistanceOhm: null,
            inductanceH: null,
            rotorInertiaKgM2: null,
          },
        }
      : firstMotorId != null
        ? { source: 'catalogue', partId: firstMotorId }
        : {
            source: 'manual',
            label: 'Motor entered by hand',
            params: {
              ratedVoltageV: 3.7,
              voltageMinV: null,
              voltageMaxV: null,
              noLoadSpeedRpm: 14000,
              noLoadCurrentA: 0.22,
              stallTorqueNm: 0.0047,
              stallCurrentA: 2.4,
              terminalResistanceOhm: null,
              inductanceH: null,
              rotorInertiaKgM2: null,
            },
          },
    // The pack's own figures, R_int included (1S Li-ion: ~0.075 Ω, from memory): a new design judges its start from the first look.
    // From the calculator: its supply range, no preset and no internal resistance (the calculator had none; enter the source's own).
    supply: fromCalculator
      ? {
          ...fromPreset,
          preset: null,
          minV: fromCalculator.supplyMinV,
          maxV: fromCalculator.supplyMaxV,
          nomV: Math.min(Math.max(fromCalculator.ratedVoltageV, fromCalculator.supplyMinV), fromCalculator.supplyMaxV),
          internalResistanceOhm: 0,
          continuousCurrentA: null,
          currentLimitA: null,
        }
      : fromPreset,
    wiringResistanceOhm: 0.05,
    shuntResistanceOhm: 0,
    logic: {
      railV: logic.railV,
      highV: logic.highV,
      lowV: logic.lowV,
      pinSourceCurrentA: 0.004,
      pinSinkCurrentA: 0.004,
      resetPull: 'none',
      resetPullOhms: 0,
      resetPullTolerance: 0,
      sharedSupply: null,
    },
    drive: { mode: 'onoff' },
    ambientMinC: 0,
    ambientMaxC: 40,
    load: { kind: 'stall-only' },
    margins: { ...DEFAULT_DESIGN_MARGINS },
    driverSupplyV: null,
    boardQuantity: 100,
    stallProtection: { kind: 'none' },
    resetStartIntent: null,
    selections: {
      switch: { chosenPartId: null, alternatePartIds: [] },
      driver: { chosenPartId: null, alternatePartIds: [] },
      diode: { chosenPartId: null, alternatePartIds: [] },
    },
  };
}

/**
 * The workspace's supply and shared-logic inputs [docs/engineering.md §3.1]: a preset copied into the
 * design, a pack's internal resistance as per cell × cells, a starting point for a shared controller.
 * Pure, browser-safe.
 */
import { tidy } from './units.ts';
import type { DesignSupply, SharedLogicSupply, SupplyPreset } from './domain/design.ts';
import { SUPPLY_PRESETS } from './domain/design.ts';

/** Twelve significant digits: 0.075 × 3 is stored as 0.225, not 0.22499999999999998. */

export function findSupplyPreset(id: string | null): SupplyPreset | undefined {
  return id == null ? undefined : SUPPLY_PRESETS.find((p) => p.id === id);
}

/** Everything a preset carries: voltages, internal resistance, continuous rating and current limit. */
export function supplyFromPreset(p: SupplyPreset): DesignSupply {
  return {
    minV: p.minV,
    nomV: p.nomV,
    maxV: p.maxV,
    preset: p.id,
    internalResistanceOhm: p.internalResistanceOhm,
    continuousCurrentA: p.continuousCurrentA,
    currentLimitA: p.currentLimitA,
  };
}

/** Cells in series to start the per-cell entry from: the preset's own count, else 1 (the whole source). */
export function presetCells(presetId: string | null): number {
  return findSupplyPreset(presetId)?.cells ?? 1;
}

/** A pack's R_int: per cell × cells in series. */
export function packInternalResistanceOhm(perCellOhm: number, cells: number): number {
  return tidy(perCellOhm * cells);
}

export function perCellInternalResistanceOhm(totalOhm: number, cells: number): number {
  return cells > 0 ? tidy(totalOhm / cells) : totalOhm;
}

/** A whole number of cells from 1 to 48 (what a person types may be 0, 2.5 or 100). */
export function cellCount(typed: number): number {
  return Math.min(48, Math.max(1, Math.round(typed)));
}

/**
 * A first guess when the designer ticks "controller fed from the same source": fed directly, it keeps
 * running down to about 90 % of its rail and no regulator sits between [practice: a common brown-out
 * level]. The designer replaces both with the controller's and regulator's own figures.
 */
export function defaultSharedSupply(logicRailV: number): SharedLogicSupply {
  return { minSupplyV: tidy(Math.round(0.9 * logicRailV * 100) / 100), regulatorDropoutV: 0 };
}

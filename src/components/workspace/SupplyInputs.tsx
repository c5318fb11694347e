import { useState } from 'react';
import type { DesignLogic, DesignSupply } from '../../lib/domain/design.ts';
import { SUPPLY_PRESETS } from '../../lib/domain/design.ts';
import {
  cellCount,
  defaultSharedSupply,
  findSupplyPreset,
  packInternalResistanceOhm,
  perCellInternalResistanceOhm,
  presetCells,
  supplyFromPreset,
} from '../../lib/supply-input.ts';
import NumInput from './NumInput.tsx';

interface SupplyProps {
  supply: DesignSupply;
  onChange: (next: DesignSupply) => void;
  error: (path: string) => string | undefined;
}

/** The preset picker; a preset copies voltages, internal resistance, continuous rating and limit, and shows where each figure comes from. */
export function SupplyPresetField({ supply, onChange, onCells }: Omit<SupplyProps, 'error'> & { onCells: (cells: number) => void }) {
  const preset = findSupplyPreset(supply.preset);
  return (
    <div className="field col-span-2 md:col-span-4">
      <label className="field">
        Preset
        <select
          value={supply.preset ?? ''}
          data-testid="supply-preset"
          onChange={(ev) => {
            const p = findSupplyPreset(ev.target.value);
            if (p) onCells(p.cells ?? 1);
            onChange(p ? supplyFromPreset(p) : { ...supply, preset: null });
          }}
        >
          <option value="">custom</option>
          {SUPPLY_PRESETS.map((p) => (
            <option key={p.id} value={p.id}>
              {p.label} ({p.minV}–{p.maxV} V)
            </option>
          ))}
        </select>
      </label>
      {preset ? (
        <span className="text-xs text-ink-faint" data-testid="supply-preset-source">
          Voltage: {preset.source.voltage}. Internal resistance: {preset.source.internalResistance}. Limit: {preset.source.currentLimit}.
        </span>
      ) : null}
    </div>
  );
}

/** Internal resistance as per cell × cells (the product is stored), continuous rating, current limit (empty = none). */
export function SupplySourceFields({
  supply,
  onChange,
  error,
  cells,
  onCells,
}: SupplyProps & { cells: number; onCells: (cells: number) => void }) {
  const perCell = perCellInternalResistanceOhm(supply.internalResistanceOhm, cells);
  return (
    <>
      <NumInput
        label={cells > 1 ? 'R_int per cell' : 'Internal resistance'}
        unit="Ω"
        value={perCell}
        testId="supply-rint-cell"
        onValue={(v) => onChange({ ...supply, internalResistanceOhm: packInternalResistanceOhm(v, cells) })}
        error={error('supply.internalResistanceOhm')}
        hint={cells > 1 ? `pack: ${supply.internalResistanceOhm} Ω` : 'regulated: ~0'}
      />
      <NumInput
        label="Cells in series"
        value={cells}
        testId="supply-cells"
        onValue={(v) => {
          const n = cellCount(v);
          onCells(n);
          onChange({ ...supply, internalResistanceOhm: packInternalResistanceOhm(perCell, n) });
        }}
        hint="1 for a regulated supply"
      />
      <NumInput
        label="Continuous rating"
        unit="A"
        value={supply.continuousCurrentA}
        testId="supply-continuous"
        onValue={(v) => onChange({ ...supply, continuousCurrentA: v })}
        onEmpty={() => onChange({ ...supply, continuousCurrentA: null })}
        error={error('supply.continuousCurrentA')}
        hint="empty: not stated"
      />
      <NumInput
        label="Current limit"
        unit="A"
        value={supply.currentLimitA}
        testId="supply-limit"
        onValue={(v) => onChange({ ...supply, currentLimitA: v })}
        onEmpty={() => onChange({ ...supply, currentLimitA: null })}
        error={error('supply.currentLimitA')}
        hint="empty: does not limit"
      />
    </>
  );
}

/** Cells-in-series is entry state only: it starts from the preset and is not saved. */
export function useSupplyCells(presetId: string | null): [number, (cells: number) => void] {
  return useState(() => presetCells(presetId));
}

/** "Controller fed from the same source", with its minimum supply and the regulator's dropout. */
export function SharedLogicFields({
  logic,
  onChange,
  error,
}: {
  logic: DesignLogic;
  onChange: (next: DesignLogic) => void;
  error: (path: string) => string | undefined;
}) {
  const shared = logic.sharedSupply;
  return (
    <>
      <label className="col-span-2 md:col-span-4 text-sm flex items-center gap-2 self-end">
        <input
          type="checkbox"
          checked={shared != null}
          data-testid="logic-shared"
          onChange={(ev) => onChange({ ...logic, sharedSupply: ev.target.checked ? defaultSharedSupply(logic.railV) : null })}
        />
        Controller fed from the same source as the motor
      </label>
      {shared ? (
        <>
          <NumInput
            label="Controller minimum supply"
            unit="V"
            value={shared.minSupplyV}
            testId="logic-min-supply"
            onValue={(v) => onChange({ ...logic, sharedSupply: { ...shared, minSupplyV: v } })}
            error={error('logic.sharedSupply.minSupplyV')}
            hint="its brown-out level"
          />
          <NumInput
            label="Regulator dropout"
            unit="V"
            value={shared.regulatorDropoutV}
            testId="logic-dropout"
            onValue={(v) => onChange({ ...logic, sharedSupply: { ...shared, regulatorDropoutV: v } })}
            error={error('logic.sharedSupply.regulatorDropoutV')}
            hint="0 when fed directly"
          />
        </>
      ) : null}
    </>
  );
}

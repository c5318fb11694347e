/**
 * The pure helpers behind the supply step, the supply inputs and the supply calculator form. Expected
 * values are written out by hand beside their source, never read back from the code under test.
 */
import { describe, expect, it } from 'vitest';
import { bulkCapacitanceView, checkVerdict, limitRelation, quantityText, torqueText } from '../../src/lib/supply-view.ts';
import {
  cellCount,
  defaultSharedSupply,
  packInternalResistanceOhm,
  perCellInternalResistanceOhm,
  presetCells,
  supplyFromPreset,
} from '../../src/lib/supply-input.ts';
import { SUPPLY_PRESETS } from '../../src/lib/domain/design.ts';
import { designInputSchema } from '../../src/lib/schemas/design.ts';
import { DEFAULT_SUPPLY_FORM, formFromPreset, SUPPLY_PATH_TO_FIELD, toSupplyRequest } from '../../src/components/calc/supply-form.ts';
import { calcSupplyRequestSchema } from '../../src/lib/schemas/calc.ts';

describe('a check reads as a verdict (docs/engineering.md §3.3 severities)', () => {
  it.each([
    ['holds', { ok: true }, 'pass'],
    ['short on a margin only (slow start)', { ok: false, severity: 'margin' as const }, 'marginal'],
    ['a rating broken (never starts, brown-out)', { ok: false, severity: 'hard' as const }, 'fail'],
    ['failed without a severity counts as broken (verdictOf does the same)', { ok: false }, 'fail'],
  ])('%s', (_name, check, verdict) => {
    expect(checkVerdict(check)).toBe(verdict);
  });

  it('the brown-out limit is a floor, the currents are ceilings', () => {
    expect(limitRelation('logic-brownout')).toBe('≥');
    expect(limitRelation('supply-start-current')).toBe('≤');
    expect(limitRelation('supply-running-current')).toBe('≤');
  });
});

describe('values with their units (SI prefixes, SI Brochure)', () => {
  it.each([
    [0.5, 'A', '500 mA'],
    [1.5254, 'A', '1.53 A'],
    [1.7, 'A', '1.7 A'],
    [2.542, 'V', '2.54 V'],
    [3, 'V', '3 V'],
    [0.00206, 'N·m', '2.06 mN·m'],
    [null, 'A', '—'],
  ])('%s %s → %s', (value, unit, text) => {
    expect(quantityText(value, unit)).toBe(text);
  });
});

describe('torques read in mN·m, the unit of the motor figures', () => {
  it.each([
    [0.00063662, '0.637 mN·m'], // Kt·(0.5 − 0.2) of the §3.5 worked example
    [0.0033953, '3.4 mN·m'],
    [0.02, '20 mN·m'],
    [null, '—'],
  ])('%s N·m → %s', (nm, text) => {
    expect(torqueText(nm)).toBe(text);
  });
});

describe('bulk capacitance: from tenths of a farad up it is not practical (docs/engineering.md §3.4)', () => {
  it.each([
    [0.3359, '0.336 F', false], // the worked example of §3.5
    [0.1, '0.1 F', false], // the threshold itself
    [0.0022, '2.2 mF', true],
    [4.7e-4, '470 µF', true],
    [0, 'none needed', true],
  ])('%s F → %s', (f, text, practical) => {
    expect(bulkCapacitanceView(f)).toEqual({ text, practical });
  });

  it('no figure (no inertia, no dip): nothing to show', () => {
    expect(bulkCapacitanceView(null)).toBeNull();
  });
});

describe('supply inputs', () => {
  it('per cell × cells: 4 × NiMH 0.03 Ω = 0.12 Ω; 3 × 0.075 Ω = 0.225 Ω exactly (no float tail)', () => {
    expect(packInternalResistanceOhm(0.03, 4)).toBe(0.12);
    expect(packInternalResistanceOhm(0.075, 3)).toBe(0.225);
    expect(perCellInternalResistanceOhm(0.225, 3)).toBe(0.075);
    expect(perCellInternalResistanceOhm(0.4, 0)).toBe(0.4);
  });

  it('cells are a whole number from 1 to 48', () => {
    expect([0, 1, 2.4, 2.6, 100].map(cellCount)).toEqual([1, 1, 2, 3, 48]);
  });

  it('a pack preset starts the entry at its own cell count; a regulated supply or none at 1', () => {
    expect(presetCells('4xAA-nimh')).toBe(4);
    expect(presetCells('3s-liion')).toBe(3);
    expect(presetCells('usb2-port')).toBe(1);
    expect(presetCells(null)).toBe(1);
  });

  it('a preset copies R_int, continuous rating and limit: USB 2.0 port 0.5 A [std: USB 2.0 specification]', () => {
    const usb2 = SUPPLY_PRESETS.find((p) => p.id === 'usb2-port')!;
    expect(supplyFromPreset(usb2)).toEqual({
      minV: 4.75,
      nomV: 5,
      maxV: 5.25,
      preset: 'usb2-port',
      internalResistanceOhm: 0,
      continuousCurrentA: 0.5,
      currentLimitA: 0.5,
    });
    const nimh = SUPPLY_PRESETS.find((p) => p.id === '4xAA-nimh')!;
    // 4 × ~0.03 Ω per AA NiMH cell (from memory), no limit of its own.
    expect(supplyFromPreset(nimh)).toMatchObject({ internalResistanceOhm: 0.12, currentLimitA: null });
  });

  it('a shared controller starts at 90 % of its rail, fed directly (common practice, a first guess)', () => {
    expect(defaultSharedSupply(3.3)).toEqual({ minSupplyV: 2.97, regulatorDropoutV: 0 });
    expect(defaultSharedSupply(5)).toEqual({ minSupplyV: 4.5, regulatorDropoutV: 0 });
  });

  it('an old saved design without the source fields still parses, with no R_int, rating or limit', () => {
    const old = {
      name: 'Saved before the supply step',
      motor: { source: 'catalogue', partId: 1 },
      supply: { minV: 4, nomV: 4.8, maxV: 5.8 },
      logic: {
        railV: 3.3,
        highV: 2.9,
        lowV: 0.4,
        pinSourceCurrentA: 0.004,
        pinSinkCurrentA: 0.004,
        resetPull: 'none',
        resetPullOhms: 0,
        resetPullTolerance: 0,
      },
      drive: { mode: 'onoff' },
      ambientMinC: 0,
      ambientMaxC: 40,
      load: { kind: 'stall-only' },
      margins: {},
    };
    const parsed = designInputSchema.safeParse(old);
    expect(parsed.success).toBe(true);
    expect(parsed.data?.supply).toMatchObject({ internalResistanceOhm: 0, continuousCurrentA: null, currentLimitA: null, preset: null });
    expect(parsed.data?.logic.sharedSupply).toBeNull();
  });
});

describe('supply calculator form → POST /api/calc/supply body', () => {
  it('the default form is the contract example, in SI: 1.5 g·cm² = 1.5e-7 kg·m², 0.3 mN·m = 3e-4 N·m', () => {
    const built = toSupplyRequest(DEFAULT_SUPPLY_FORM);
    expect(built.ok).toBe(true);
    if (!built.ok) return;
    const b = built.body as {
      motor: Record<string, number>;
      supply: Record<string, number>;
      loadTorqueNm: number;
      logic: Record<string, unknown>;
      allowedDipV: number;
    };
    expect(b.motor).toMatchObject({ ratedVoltageV: 3, noLoadSpeedRpm: 12000, noLoadCurrentA: 0.2, stallCurrentA: 1.8 });
    expect(b.motor.rotorInertiaKgM2).toBeCloseTo(1.5e-7, 15);
    expect(b.supply).toEqual({ voltageV: 3, internalResistanceOhm: 0.3, continuousCurrentA: 1, currentLimitA: 0.5 });
    expect(b.loadTorqueNm).toBeCloseTo(3e-4, 12);
    expect(b.logic).toEqual({ sharedWithMotor: true, minSupplyV: 2.7, regulatorDropoutV: 0 });
    expect(b.allowedDipV).toBe(0.2);
    expect(calcSupplyRequestSchema.safeParse(b).success).toBe(true);
  });

  it('empty optional fields are left out (absent = not checked); no shared controller = no logic', () => {
    const built = toSupplyRequest({ ...DEFAULT_SUPPLY_FORM, limitA: '', continuousA: ' ', rotorInertiaGcm2: '', logicShared: false });
    expect(built.ok).toBe(true);
    if (!built.ok) return;
    expect(built.body.supply).toEqual({ voltageV: 3, internalResistanceOhm: 0.3 });
    expect((built.body.motor as Record<string, unknown>).rotorInertiaKgM2).toBeUndefined();
    expect(built.body.logic).toBeUndefined();
  });

  it('text that is not a number is named at its field; an empty required field too', () => {
    const built = toSupplyRequest({ ...DEFAULT_SUPPLY_FORM, supplyV: 'five', stallCurrentA: '' });
    expect(built).toEqual({ ok: false, errors: { supplyV: 'Enter a number.', stallCurrentA: 'Enter a number.' } });
  });

  it('a comma decimal is read as a point (0,5 A)', () => {
    const built = toSupplyRequest({ ...DEFAULT_SUPPLY_FORM, limitA: '0,5' });
    expect(built.ok && (built.body.supply as Record<string, number>).currentLimitA).toBe(0.5);
  });

  it('a preset fills the source: USB 3.x port 5 V, 0.9 A limit [std: USB 3.x specification]; a pack leaves the limit empty', () => {
    const usb3 = SUPPLY_PRESETS.find((p) => p.id === 'usb3-port')!;
    expect(formFromPreset(DEFAULT_SUPPLY_FORM, usb3)).toMatchObject({ supplyV: '5', internalOhm: '0', continuousA: '0.9', limitA: '0.9' });
    const pack = SUPPLY_PRESETS.find((p) => p.id === '2xAA-alkaline')!;
    expect(formFromPreset(DEFAULT_SUPPLY_FORM, pack)).toMatchObject({ supplyV: '3', internalOhm: '0.4', limitA: '', continuousA: '' });
  });

  it('every field the body sends has its way back from an API issue path', () => {
    const fields = new Set(Object.values(SUPPLY_PATH_TO_FIELD));
    for (const key of Object.keys(DEFAULT_SUPPLY_FORM)) if (key !== 'logicShared') expect(fields.has(key as never)).toBe(true);
  });
});

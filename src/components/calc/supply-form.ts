/**
 * Form state of the supply calculator and its conversion to the POST /api/calc/supply body (pure,
 * browser-safe). Only "is it a number" is judged here; every range is the API's, whose 400 issues map
 * back onto the fields.
 */
import type { SupplyPreset } from '../../lib/domain/design.ts';

export interface SupplyForm {
  ratedV: string;
  noLoadSpeedRpm: string;
  noLoadCurrentA: string;
  stallCurrentA: string;
  /** g·cm², as datasheets give it (1 g·cm² = 1e-7 kg·m²). */
  rotorInertiaGcm2: string;
  supplyV: string;
  internalOhm: string;
  continuousA: string;
  limitA: string;
  seriesOhm: string;
  windingC: string;
  /** mN·m. */
  loadTorqueMNm: string;
  logicShared: boolean;
  logicMinV: string;
  dropoutV: string;
  allowedDipV: string;
}

type TextField = Exclude<keyof SupplyForm, 'logicShared'>;
export type SupplyFieldErrors = Partial<Record<TextField, string>>;

/** The contract's example [docs/engineering.md §3.5]: the invented M1 on 3.0 V behind 0.3 Ω, a 0.5 A limit, a controller on the same source. */
export const DEFAULT_SUPPLY_FORM: SupplyForm = {
  ratedV: '3',
  noLoadSpeedRpm: '12000',
  noLoadCurrentA: '0.2',
  stallCurrentA: '1.8',
  rotorInertiaGcm2: '1.5',
  supplyV: '3.0',
  internalOhm: '0.3',
  continuousA: '1.0',
  limitA: '0.5',
  seriesOhm: '0',
  windingC: '20',
  loadTorqueMNm: '0.3',
  logicShared: true,
  logicMinV: '2.7',
  dropoutV: '0',
  allowedDipV: '0.2',
};

/** The labels the form shows, used to name refused fields (never the API's paths). */
export const SUPPLY_FIELD_LABELS: Record<TextField, string> = {
  ratedV: 'Motor rated voltage',
  noLoadSpeedRpm: 'Motor no-load speed',
  noLoadCurrentA: 'Motor no-load current',
  stallCurrentA: 'Motor stall current',
  rotorInertiaGcm2: 'Rotor inertia',
  loadTorqueMNm: 'Load torque',
  supplyV: 'Source voltage',
  internalOhm: 'Internal resistance',
  continuousA: 'Continuous rating',
  limitA: 'Current limit',
  seriesOhm: 'Series resistance',
  windingC: 'Winding temperature',
  logicMinV: 'Controller minimum',
  dropoutV: 'Regulator dropout',
  allowedDipV: 'Allowed dip',
};

/** Maps an API issue path back to the form field that caused it. */
export const SUPPLY_PATH_TO_FIELD: Record<string, TextField> = {
  'motor.ratedVoltageV': 'ratedV',
  'motor.noLoadSpeedRpm': 'noLoadSpeedRpm',
  'motor.noLoadCurrentA': 'noLoadCurrentA',
  'motor.stallCurrentA': 'stallCurrentA',
  'motor.rotorInertiaKgM2': 'rotorInertiaGcm2',
  'supply.voltageV': 'supplyV',
  'supply.internalResistanceOhm': 'internalOhm',
  'supply.continuousCurrentA': 'continuousA',
  'supply.currentLimitA': 'limitA',
  seriesResistanceOhm: 'seriesOhm',
  windingC: 'windingC',
  loadTorqueNm: 'loadTorqueMNm',
  'logic.minSupplyV': 'logicMinV',
  'logic.regulatorDropoutV': 'dropoutV',
  allowedDipV: 'allowedDipV',
};

const G_CM2_IN_KG_M2 = 1e-7; // 1 g·cm² = 1e-3 kg × 1e-4 m² [SI]

/** The figures a supply preset carries, as form text (an empty limit: the preset does not limit). */
export function formFromPreset(form: SupplyForm, p: SupplyPreset): SupplyForm {
  const text = (v: number | null) => (v == null ? '' : String(v));
  return {
    ...form,
    supplyV: String(p.nomV),
    internalOhm: String(p.internalResistanceOhm),
    continuousA: text(p.continuousCurrentA),
    limitA: text(p.currentLimitA),
  };
}

export function toSupplyRequest(f: SupplyForm): { ok: true; body: Record<string, unknown> } | { ok: false; errors: SupplyFieldErrors } {
  const errors: SupplyFieldErrors = {};
  /** A required number, or an optional one (empty → undefined, left out of the body). */
  const read = (key: TextField, required: boolean, scale = 1): number | undefined => {
    const s = f[key].trim();
    if (s === '') {
      if (required) errors[key] = 'Enter a number.';
      return undefined;
    }
    const v = Number(s.replace(',', '.'));
    if (!Number.isFinite(v)) errors[key] = 'Enter a number.';
    return v * scale;
  };
  const motor = {
    ratedVoltageV: read('ratedV', true),
    noLoadSpeedRpm: read('noLoadSpeedRpm', true),
    noLoadCurrentA: read('noLoadCurrentA', true),
    stallCurrentA: read('stallCurrentA', true),
    rotorInertiaKgM2: read('rotorInertiaGcm2', false, G_CM2_IN_KG_M2),
  };
  const supply = {
    voltageV: read('supplyV', true),
    internalResistanceOhm: read('internalOhm', false),
    continuousCurrentA: read('continuousA', false),
    currentLimitA: read('limitA', false),
  };
  const body: Record<string, unknown> = {
    motor,
    supply,
    seriesResistanceOhm: read('seriesOhm', false),
    windingC: read('windingC', false),
    loadTorqueNm: read('loadTorqueMNm', false, 1e-3),
    allowedDipV: read('allowedDipV', false),
  };
  if (f.logicShared)
    body.logic = { sharedWithMotor: true, minSupplyV: read('logicMinV', true), regulatorDropoutV: read('dropoutV', false) };
  if (Object.keys(errors).length) return { ok: false, errors };
  return { ok: true, body: JSON.parse(JSON.stringify(body)) as Record<string, unknown> };
}

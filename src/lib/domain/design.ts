/**
 * A drive design as the designer enters it (camelCase, units in names). Stored as one JSON document per
 * revision; src/lib/design-input.ts turns it into the engineering core's DesignCase.
 */
import { sig } from '../units.ts';
import type { z } from 'zod';
import type { designInputSchema } from '../schemas/design.ts';
import type { Part } from './parts.ts';

export const PART_ROLES = ['switch', 'driver', 'diode'] as const;
export type PartRole = (typeof PART_ROLES)[number];

/** The motor: a catalogue part, or datasheet points entered by hand. */
export type DesignMotor = DesignInput['motor'];

/**
 * The source: minimum / nominal / maximum voltage, the preset it came from (informative), its internal
 * resistance (per cell × cells for a pack), continuous rating and current limit (null: not stated / none).
 */
export type DesignSupply = DesignInput['supply'];

/** What happens to the drive when the shaft jams with the switch on. */
export type StallProtection = DesignInput['stallProtection'];

/** The controller fed from the motor's own source: its brown-out level and any regulator dropout. */
export type SharedLogicSupply = NonNullable<DesignInput['logic']['sharedSupply']>;

/**
 * The controller pin: rail, VOH min and VOL max at its rated current, source and sink current, its pull at
 * reset with value and fractional tolerance, and the shared supply (null when it has its own).
 */
export type DesignLogic = DesignInput['logic'];

export type DesignDrive = DesignInput['drive'];

export type DesignLoad = DesignInput['load'];

/** A role's chosen part and up to three alternates, in order of preference. */
export type RoleSelection = DesignInput['selections']['switch'];

/**
 * A design as entered: exactly the output of its zod schema (src/lib/schemas/design.ts), so the type and
 * the validation cannot drift apart. The part types above document each field; the schema is the truth.
 */
export type DesignInput = z.output<typeof designInputSchema>;

export type DesignStatus = 'draft' | 'ready';

export interface DesignSummary {
  id: number;
  name: string;
  ownerId: number;
  ownerName: string;
  status: DesignStatus;
  /** Why the status last changed when the system changed it (back to draft after a catalogue change); null otherwise. */
  statusReason: string | null;
  /** When the status last changed (ISO, UTC); null when it never changed since creation. */
  statusChangedAt: string | null;
  revision: number;
  updatedAt: string;
}

export interface Design extends DesignSummary {
  version: number;
  input: DesignInput;
  revisions: { revision: number; createdAt: string; createdByName: string | null }[];
}

/** Where a preset's figure comes from (tags as in the engineering notes: [std], [mem], [practice]). */
export interface SupplyPresetSources {
  voltage: string;
  internalResistance: string;
  currentLimit: string;
}

export interface SupplyPreset {
  id: string;
  label: string;
  minV: number;
  nomV: number;
  maxV: number;
  /** Whole source: per cell × cells for a pack. */
  internalResistanceOhm: number;
  /** Cells in series for a pack (the workspace enters R_int per cell × cells); null for a regulated supply. */
  cells: number | null;
  continuousCurrentA: number | null;
  currentLimitA: number | null;
  source: SupplyPresetSources;
}

/** Typical internal resistance per cell [mem: AA alkaline ~0.15–0.3 Ω, NiMH ~0.03 Ω, small Li-ion ~0.05–0.1 Ω]. */
export const CELL_INTERNAL_RESISTANCE_OHM = { alkaline: 0.2, nimh: 0.03, liion: 0.075 } as const;

const CELLS = 'nominal cell voltages [practice]';
const rCells = (kind: keyof typeof CELL_INTERNAL_RESISTANCE_OHM, cells: number): number =>
  Number(sig(CELL_INTERNAL_RESISTANCE_OHM[kind] * cells, 3));
const memCell = (kind: string, perCell: string, cells: number): string =>
  `[mem] ${kind} ~${perCell} Ω per cell × ${cells}; use the pack's own data when you have it`;
const NO_LIMIT = "no current limit; the cells' own limits apply";

/** Supply presets for common battery packs, USB ports and bench supplies, each figure with its source tag. */
export const SUPPLY_PRESETS: readonly SupplyPreset[] = [
  {
    id: '2xAA-alkaline',
    label: '2 × AA alkaline',
    minV: 2.0,
    nomV: 3.0,
    maxV: 3.2,
    internalResistanceOhm: rCells('alkaline', 2),
    cells: 2,
    continuousCurrentA: null,
    currentLimitA: null,
    source: { voltage: CELLS, internalResistance: memCell('AA alkaline', '0.15–0.3', 2), currentLimit: NO_LIMIT },
  },
  {
    id: '4xAA-alkaline',
    label: '4 × AA alkaline',
    minV: 4.0,
    nomV: 6.0,
    maxV: 6.4,
    internalResistanceOhm: rCells('alkaline', 4),
    cells: 4,
    continuousCurrentA: null,
    currentLimitA: null,
    source: { voltage: CELLS, internalResistance: memCell('AA alkaline', '0.15–0.3', 4), currentLimit: NO_LIMIT },
  },
  {
    id: '4xAA-nimh',
    label: '4 × AA NiMH',
    minV: 4.0,
    nomV: 4.8,
    maxV: 5.8,
    internalResistanceOhm: rCells('nimh', 4),
    cells: 4,
    continuousCurrentA: null,
    currentLimitA: null,
    source: { voltage: CELLS, internalResistance: memCell('AA NiMH', '0.03', 4), currentLimit: NO_LIMIT },
  },
  {
    id: '1s-liion',
    label: '1S Li-ion',
    minV: 3.0,
    nomV: 3.7,
    maxV: 4.2,
    internalResistanceOhm: rCells('liion', 1),
    cells: 1,
    continuousCurrentA: null,
    currentLimitA: null,
    source: {
      voltage: CELLS,
      internalResistance: memCell('small Li-ion', '0.05–0.1', 1),
      currentLimit: 'the protection circuit trips; no current limit assumed',
    },
  },
  {
    id: '2s-liion',
    label: '2S Li-ion',
    minV: 6.0,
    nomV: 7.4,
    maxV: 8.4,
    internalResistanceOhm: rCells('liion', 2),
    cells: 2,
    continuousCurrentA: null,
    currentLimitA: null,
    source: {
      voltage: CELLS,
      internalResistance: memCell('small Li-ion', '0.05–0.1', 2),
      currentLimit: 'the protection circuit trips; no current limit assumed',
    },
  },
  {
    id: '3s-liion',
    label: '3S Li-ion',
    minV: 9.0,
    nomV: 11.1,
    maxV: 12.6,
    internalResistanceOhm: rCells('liion', 3),
    cells: 3,
    continuousCurrentA: null,
    currentLimitA: null,
    source: {
      voltage: CELLS,
      internalResistance: memCell('small Li-ion', '0.05–0.1', 3),
      currentLimit: 'the protection circuit trips; no current limit assumed',
    },
  },
  {
    id: 'usb-5v',
    label: 'USB 5 V adapter',
    minV: 4.5,
    nomV: 5.0,
    maxV: 5.5,
    internalResistanceOhm: 0,
    cells: null,
    continuousCurrentA: null,
    currentLimitA: null,
    source: {
      voltage: 'USB 5 V ±10 % [practice]',
      internalResistance: 'regulated: ~0 Ω [practice]; enter the cable as wiring',
      currentLimit: "enter the adapter's rated current",
    },
  },
  {
    id: 'usb2-port',
    label: 'USB 2.0 port (bench prototype)',
    minV: 4.75,
    nomV: 5.0,
    maxV: 5.25,
    internalResistanceOhm: 0,
    cells: null,
    continuousCurrentA: 0.5,
    currentLimitA: 0.5,
    source: {
      voltage: '[std: USB 2.0 specification] 4.75–5.25 V at a port (from memory)',
      internalResistance: 'regulated: ~0 Ω [practice]; enter the cable as wiring',
      currentLimit: '[std: USB 2.0 specification] 500 mA per port',
    },
  },
  {
    id: 'usb3-port',
    label: 'USB 3.x port',
    minV: 4.45,
    nomV: 5.0,
    maxV: 5.25,
    internalResistanceOhm: 0,
    cells: null,
    continuousCurrentA: 0.9,
    currentLimitA: 0.9,
    source: {
      voltage: '[std: USB 3.x specification] 4.45–5.25 V at a port (from memory)',
      internalResistance: 'regulated: ~0 Ω [practice]; enter the cable as wiring',
      currentLimit: '[std: USB 3.x specification] 900 mA per port',
    },
  },
  {
    id: 'bench-12v',
    label: '12 V bench / adapter ±5 %',
    minV: 11.4,
    nomV: 12.0,
    maxV: 12.6,
    internalResistanceOhm: 0,
    cells: null,
    continuousCurrentA: null,
    currentLimitA: null,
    source: {
      voltage: '±5 % [practice]',
      internalResistance: 'regulated: ~0 Ω [practice]',
      currentLimit: "a bench supply's limit is settable: enter the value you set",
    },
  },
  {
    id: 'bench-24v',
    label: '24 V bench / adapter ±5 %',
    minV: 22.8,
    nomV: 24.0,
    maxV: 25.2,
    internalResistanceOhm: 0,
    cells: null,
    continuousCurrentA: null,
    currentLimitA: null,
    source: {
      voltage: '±5 % [practice]',
      internalResistance: 'regulated: ~0 Ω [practice]',
      currentLimit: "a bench supply's limit is settable: enter the value you set",
    },
  },
];

/** Logic rail presets: LVCMOS-style output levels at a few mA (JEDEC JESD8 family, from memory). */
export const LOGIC_PRESETS: readonly { id: string; label: string; railV: number; highV: number; lowV: number }[] = [
  { id: '1v8', label: '1.8 V logic', railV: 1.8, highV: 1.35, lowV: 0.45 },
  { id: '3v3', label: '3.3 V logic', railV: 3.3, highV: 2.9, lowV: 0.4 },
  { id: '5v', label: '5 V logic', railV: 5.0, highV: 4.4, lowV: 0.5 },
];

/** Defaults from the engineering notes: voltage derating 0.8, thermal margin 25 K (common practice). */
export const DEFAULT_DESIGN_MARGINS = { voltageDerating: 0.8, thermalMarginC: 25 } as const;

/** A catalogue motor as offered in the workspace's motor picker. */
export interface MotorOption {
  id: number;
  label: string;
}

/** How the motor picker names a catalogue motor. */
export function motorOptionOf(m: Part): MotorOption {
  const rating = m.category === 'motor' ? `${m.params.ratedVoltageV} V, ${m.params.stallCurrentA} A stall` : '';
  return {
    id: m.id as number,
    label: `${m.mpn} · ${m.manufacturer} · ${rating}${m.reviewStatus === 'pending' ? ' (pending review)' : ''}`,
  };
}

/** Bill of materials of a design: one line per role, chosen part plus alternates, with designator suggestions. */
import Papa from 'papaparse';
import type { DesignInput, PartRole } from './domain/design.ts';
import type { Part } from './domain/parts.ts';
import type { RecommendedPull } from './power-on.ts';
import { formatOhms } from './units.ts';

export interface BomLine {
  line: number;
  role: string;
  quantity: number;
  manufacturer: string;
  partNumber: string;
  description: string;
  alternates: string;
  referenceDesignators: string;
}

export const BOM_COLUMNS: readonly { key: keyof BomLine; header: string }[] = [
  { key: 'line', header: 'Line' },
  { key: 'role', header: 'Role' },
  { key: 'quantity', header: 'Quantity' },
  { key: 'manufacturer', header: 'Manufacturer' },
  { key: 'partNumber', header: 'Part number' },
  { key: 'description', header: 'Description' },
  { key: 'alternates', header: 'Alternates' },
  { key: 'referenceDesignators', header: 'Reference designators' },
];

const ROLE_LINES: { role: PartRole; label: string; refdes: string }[] = [
  { role: 'switch', label: 'Low-side switch', refdes: 'Q1' },
  { role: 'driver', label: 'Gate driver / level shifter', refdes: 'U1' },
  { role: 'diode', label: 'Freewheel diode', refdes: 'D1' },
];

export interface BomInput {
  input: DesignInput;
  motor: { manufacturer: string; mpn: string; description: string } | null;
  partsById: Map<number, Part>;
  pull: RecommendedPull | null;
}

export function buildBom({ input, motor, partsById, pull }: BomInput): BomLine[] {
  const boards = input.boardQuantity;
  const lines: Omit<BomLine, 'line'>[] = [];
  if (motor) {
    lines.push({ role: 'Motor', quantity: boards, manufacturer: motor.manufacturer, partNumber: motor.mpn, description: motor.description, alternates: '', referenceDesignators: 'M1' });
  }
  for (const { role, label, refdes } of ROLE_LINES) {
    const sel = input.selections[role];
    const chosen = sel.chosenPartId == null ? undefined : partsById.get(sel.chosenPartId);
    if (!chosen) continue;
    const alternates = sel.alternatePartIds
      .map((id) => partsById.get(id))
      .filter((p): p is Part => p !== undefined)
      .map((p) => `${p.mpn} (${p.manufacturer})`)
      .join('; ');
    lines.push({ role: label, quantity: boards, manufacturer: chosen.manufacturer, partNumber: chosen.mpn, description: chosen.description, alternates, referenceDesignators: refdes });
  }
  if (pull && pull.ok && pull.chosenOhms != null) {
    lines.push({
      role: `Pull-${pull.to} resistor (power-on state)`, quantity: boards, manufacturer: 'any', partNumber: `${formatOhms(pull.chosenOhms)} ±1 %, 0.1 W`,
      description: `Holds the control line ${pull.to === 'down' ? 'low' : 'high'} through reset (to ${pull.railV} V)`, alternates: '', referenceDesignators: 'R1',
    });
  }
  return lines.map((l, i) => ({ line: i + 1, ...l }));
}

export function bomToCsv(lines: BomLine[]): string {
  return Papa.unparse({
    fields: BOM_COLUMNS.map((c) => c.header),
    data: lines.map((l) => BOM_COLUMNS.map((c) => l[c.key])),
  });
}

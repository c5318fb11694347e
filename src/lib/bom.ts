/** Bill of materials of a design: one line per role, chosen part plus alternates, with designator suggestions. */
import type { DesignInput, PartRole } from './domain/design.ts';
import type { Part } from './domain/parts.ts';
import type { RecommendedPull } from './power-on.ts';
import { formatOhms } from './units.ts';
import { toCsv } from './csv.ts';
import { PART_ROLE_LABELS } from './labels.ts';

export interface BomLine {
  line: number;
  role: string;
  quantity: number;
  manufacturer: string;
  partNumber: string;
  description: string;
  alternates: string;
  referenceDesignators: string;
  /** For the switch: the gate drive it is judged at; for the driver: the switch it is paired with. */
  pairing: string;
  /** Verdict and review status of the line's pick and of each alternate at the current catalogue. */
  status: string;
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
  { key: 'pairing', header: 'Judged at / paired with' },
  { key: 'status', header: 'Status at current catalogue' },
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
  /** Each pick's verdict and review status at the current catalogue (src/lib/readiness.ts pickStatus). */
  statusOf?: (role: PartRole, partId: number) => string;
  /** The catalogue motor's review status and lifecycle, in words. */
  motorStatus?: string;
  /** Pairing notes per line (src/lib/design-words.ts bomPairingNotes); absent lines get none. */
  pairing?: Partial<Record<PartRole, string>>;
}

const NOT_CHECKED = 'not checked';

export function buildBom({ input, motor, partsById, pull, statusOf, motorStatus, pairing }: BomInput): BomLine[] {
  const boards = input.boardQuantity;
  const lines: Omit<BomLine, 'line'>[] = [];
  if (motor) {
    lines.push({
      role: 'Motor',
      quantity: boards,
      manufacturer: motor.manufacturer,
      partNumber: motor.mpn,
      description: motor.description,
      alternates: '',
      referenceDesignators: 'M1',
      pairing: '',
      status: motorStatus ?? NOT_CHECKED,
    });
  }
  for (const { role, label, refdes } of ROLE_LINES) {
    const sel = input.selections[role];
    const chosen = sel.chosenPartId == null ? undefined : partsById.get(sel.chosenPartId);
    if (!chosen) continue;
    const alternateParts = sel.alternatePartIds.map((id) => partsById.get(id)).filter((p): p is Part => p !== undefined);
    const alternates = alternateParts.map((p) => `${p.mpn} (${p.manufacturer})`).join('; ');
    const say = (p: Part): string => (statusOf ? statusOf(role, p.id as number) : NOT_CHECKED);
    const status = [say(chosen), ...alternateParts.map((p) => `alternate ${p.mpn}: ${say(p)}`)].join('; ');
    lines.push({
      role: label,
      quantity: boards,
      manufacturer: chosen.manufacturer,
      partNumber: chosen.mpn,
      description: chosen.description,
      alternates,
      referenceDesignators: refdes,
      pairing: pairing?.[role] ?? '',
      status,
    });
  }
  const pullLine = pullResistorLine(pull);
  if (pullLine) {
    lines.push({
      ...pullLine,
      quantity: boards,
      manufacturer: 'any',
      alternates: '',
      referenceDesignators: 'R1',
      pairing: '',
      status: 'sized by the power-on walk',
    });
  }
  return lines.map((l, i) => ({ line: i + 1, ...l }));
}

/** The generic pull resistor the power-on walk sized, as a BOM line (one per board); null when none is needed. */
export function pullResistorLine(pull: RecommendedPull | null): { role: string; partNumber: string; description: string } | null {
  if (!pull || !pull.ok || pull.chosenOhms == null) return null;
  return {
    role: `Pull-${pull.to} resistor (power-on state)`,
    partNumber: `${formatOhms(pull.chosenOhms)} ±1 %, 0.1 W`,
    description: `Holds the control line ${pull.to === 'down' ? 'low' : 'high'} through reset (to ${pull.railV} V)`,
  };
}

/** The mark every output of a design that is not ready carries (report pages, BOM). */
export const DRAFT_MARK = 'Draft — not verified';

export interface DraftNotice {
  /** One sentence: why the output is not for buying or building. */
  summary: string;
  /** Each failing pick or check, named for a reader ("Low-side switch, alternate 1: …"). */
  failing: string[];
}

/** Where a readiness issue sits, in words: "Freewheel diode", "Low-side switch, alternate 2", "Supply". */
export function issuePlace(path: string): string {
  const sel = /^selections\.(switch|driver|diode)\.(chosenPartId|alternatePartIds\.(\d+))/.exec(path);
  if (sel) {
    const role = PART_ROLE_LABELS[sel[1] as PartRole];
    return sel[3] === undefined ? role : `${role}, alternate ${Number(sel[3]) + 1}`;
  }
  if (path.startsWith('motor')) return 'Motor';
  if (path.startsWith('supply')) return 'Supply';
  if (path.startsWith('resetStartIntent')) return 'Power-on state';
  return 'Design';
}

/**
 * The draft notice of a design's outputs: null when the design is marked ready and holds at the current
 * catalogue; otherwise the summary and every failing pick (none listed when it only was never marked ready).
 */
export function draftNotice(status: 'draft' | 'ready', issues: readonly { path: string; message: string }[]): DraftNotice | null {
  if (status === 'ready' && issues.length === 0) return null;
  const failing = issues.map((i) => `${issuePlace(i.path)}: ${i.message}`);
  const summary =
    issues.length === 0
      ? 'Every pick holds at the current catalogue, but the designer has not marked the design ready: check it before buying.'
      : `${issues.length} check${issues.length === 1 ? '' : 's'} fail${issues.length === 1 ? 's' : ''} at the current catalogue: not for buying or building until each is resolved.`;
  return { summary, failing };
}

/** The BOM as CSV; a draft carries the draft notice as its first row (the header stays the first line). */
export function bomToCsv(lines: BomLine[], notice: DraftNotice | null = null): string {
  const row = (l: Partial<Record<keyof BomLine, string | number>>): (string | number)[] => BOM_COLUMNS.map((c) => l[c.key] ?? '');
  const noticeRows = notice
    ? [
        row({
          role: DRAFT_MARK,
          description: notice.summary,
          status: notice.failing.length ? `failing: ${notice.failing.join('; ')}` : 'not marked ready',
        }),
      ]
    : [];
  // Through the one writer (src/lib/csv.ts): hand-entered labels like "=HYPERLINK(…)" come out as text.
  return toCsv(
    BOM_COLUMNS.map((c) => c.header),
    [...noticeRows, ...lines.map((l) => row(l))],
  );
}

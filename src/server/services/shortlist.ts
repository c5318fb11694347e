/** The buyers' shortlist: every line and alternate of the designs marked ready, with supply facts. */
import { db } from '../db.ts';
import type { DesignInput, PartRole } from '../../lib/domain/design.ts';
import type { Part } from '../../lib/domain/parts.ts';
import { bestUnitPrice } from '../../lib/part-summary.ts';
import { partsByIds } from './designs.ts';
import { parseStoredInput } from '../repos/designs.ts';

export interface ShortlistPart {
  partId: number;
  mpn: string;
  manufacturer: string;
  lifecycle: Part['lifecycle'];
  position: number;
  unitPrice: number | null;
  currency: string | null;
  stockQty: number;
  minLeadTimeDays: number | null;
  minMoq: number | null;
}

export interface ShortlistDesign {
  id: number;
  name: string;
  revision: number;
  ownerName: string;
  readyAt: string | null;
  boardQuantity: number;
  lines: { role: PartRole | 'motor'; parts: ShortlistPart[] }[];
}

function supplyFacts(part: Part, position: number, qty: number): ShortlistPart {
  const price = bestUnitPrice(part, qty);
  return {
    partId: part.id as number, mpn: part.mpn, manufacturer: part.manufacturer, lifecycle: part.lifecycle, position,
    unitPrice: price?.price ?? null, currency: price?.currency ?? null,
    stockQty: part.sources.reduce((s, src) => s + src.stockQty, 0),
    minLeadTimeDays: part.sources.length ? Math.min(...part.sources.map((s) => s.leadTimeDays)) : null,
    minMoq: part.sources.length ? Math.min(...part.sources.map((s) => s.moq)) : null,
  };
}

export async function readyShortlist(): Promise<ShortlistDesign[]> {
  const rows: { id: number; name: string; current_revision: number; ready_at: Date | null; owner_name: string; input_json: string }[] = await db()('designs')
    .join('users', 'users.id', 'designs.owner_id')
    .join('design_revisions', (j) => j.on('design_revisions.design_id', 'designs.id').andOn('design_revisions.revision', 'designs.current_revision'))
    .where('designs.status', 'ready')
    .select('designs.id', 'designs.name', 'designs.current_revision', 'designs.ready_at', 'users.name as owner_name', 'design_revisions.input_json')
    .orderBy('designs.ready_at', 'desc');
  const inputs = rows.map((r) => parseStoredInput(r.input_json, r.id, r.current_revision));
  const ids = inputs.flatMap((i) => [
    ...(i.motor.source === 'catalogue' ? [i.motor.partId] : []),
    ...(['switch', 'driver', 'diode'] as const).flatMap((r) => [...(i.selections[r].chosenPartId != null ? [i.selections[r].chosenPartId as number] : []), ...i.selections[r].alternatePartIds]),
  ]);
  const parts = await partsByIds(ids);
  return rows.map((r, k) => {
    const input = inputs[k];
    const qty = input.boardQuantity;
    const lines: ShortlistDesign['lines'] = [];
    if (input.motor.source === 'catalogue' && parts.has(input.motor.partId)) lines.push({ role: 'motor', parts: [supplyFacts(parts.get(input.motor.partId)!, 0, qty)] });
    for (const role of ['switch', 'driver', 'diode'] as const) {
      const sel = input.selections[role];
      const ordered = [sel.chosenPartId, ...sel.alternatePartIds].filter((id): id is number => id != null && parts.has(id));
      if (ordered.length) lines.push({ role, parts: ordered.map((id, i) => supplyFacts(parts.get(id)!, i, qty)) });
    }
    return { id: r.id, name: r.name, revision: r.current_revision, ownerName: r.owner_name, readyAt: r.ready_at ? new Date(r.ready_at).toISOString() : null, boardQuantity: qty, lines };
  });
}

/**
 * The buyers' shortlist: every line and alternate of the designs marked ready, with supply facts. Opening
 * it re-verifies each ready design at the current catalogue; one that no longer holds goes back to draft
 * through the same service as a part change, and is listed apart with its reason, never as holding.
 */
import { db } from '../db.ts';
import type { PartRole } from '../../lib/domain/design.ts';
import type { Part } from '../../lib/domain/parts.ts';
import { bestUnitPrice } from '../../lib/part-summary.ts';
import { pickStatus, reviewWords } from '../../lib/readiness.ts';
import type { SessionUser } from '../auth/types.ts';
import { partsByIds } from './designs.ts';
import { parseStoredInput } from '../repos/designs.ts';
import { reverifyDesigns, type Verification } from './design-status.ts';

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
  /** Verdict and review status at the current catalogue, in words with the verdict mark. */
  status: string;
  holds: boolean;
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

export interface Shortlist {
  designs: ShortlistDesign[];
  /** Designs that were ready but no longer hold: sent back to draft as the shortlist opened. */
  withdrawn: { id: number; name: string; reason: string }[];
}

function supplyFacts(part: Part, position: number, qty: number, status: { text: string; holds: boolean }): ShortlistPart {
  const price = bestUnitPrice(part, qty);
  return {
    status: status.text,
    holds: status.holds,
    partId: part.id as number,
    mpn: part.mpn,
    manufacturer: part.manufacturer,
    lifecycle: part.lifecycle,
    position,
    unitPrice: price?.price ?? null,
    currency: price?.currency ?? null,
    stockQty: part.sources.reduce((s, src) => s + src.stockQty, 0),
    minLeadTimeDays: part.sources.length ? Math.min(...part.sources.map((s) => s.leadTimeDays)) : null,
    minMoq: part.sources.length ? Math.min(...part.sources.map((s) => s.moq)) : null,
  };
}

function motorStatus(part: Part): { text: string; holds: boolean } {
  const holds = part.lifecycle !== 'obsolete' && part.reviewStatus === 'approved';
  return { text: `${holds ? '✓' : '✕'} ${reviewWords(part.reviewStatus)} · ${part.lifecycle}`, holds };
}

function linesOf(v: Verification, parts: Map<number, Part>, input: ReturnType<typeof parseStoredInput>): ShortlistDesign['lines'] {
  const qty = input.boardQuantity;
  const lines: ShortlistDesign['lines'] = [];
  if (input.motor.source === 'catalogue' && parts.has(input.motor.partId)) {
    const motor = parts.get(input.motor.partId)!;
    lines.push({ role: 'motor', parts: [supplyFacts(motor, 0, qty, motorStatus(motor))] });
  }
  for (const role of ['switch', 'driver', 'diode'] as const) {
    const sel = input.selections[role];
    const ordered = [sel.chosenPartId, ...sel.alternatePartIds].filter((id): id is number => id != null && parts.has(id));
    if (ordered.length)
      lines.push({
        role,
        parts: ordered.map((id, i) => supplyFacts(parts.get(id)!, i, qty, pickStatus(v.match, role, id, v.parts.get(id)))),
      });
  }
  return lines;
}

export async function readyShortlist(actor: SessionUser | null): Promise<Shortlist> {
  const rows: { id: number; name: string; current_revision: number; ready_at: Date | null; owner_name: string; input_json: string }[] =
    await db()('designs')
      .join('users', 'users.id', 'designs.owner_id')
      .join('design_revisions', (j) =>
        j.on('design_revisions.design_id', 'designs.id').andOn('design_revisions.revision', 'designs.current_revision'),
      )
      .where('designs.status', 'ready')
      .select(
        'designs.id',
        'designs.name',
        'designs.current_revision',
        'designs.ready_at',
        'users.name as owner_name',
        'design_revisions.input_json',
      )
      .orderBy('designs.ready_at', 'desc');
  const outcomes = new Map(
    (
      await reverifyDesigns(
        rows.map((r) => r.id),
        actor,
        'Re-verified when the shortlist was opened',
      )
    ).map((o) => [o.designId, o]),
  );
  const withdrawn = [...outcomes.values()]
    .filter((o) => o.wasReady && !o.holds)
    .map((o) => ({ id: o.designId, name: o.name, reason: o.reason ?? '' }));
  const held = rows.filter((r) => {
    const o = outcomes.get(r.id);
    return o?.wasReady && o.holds && o.verification != null;
  });
  const inputs = held.map((r) => parseStoredInput(r.input_json, r.id, r.current_revision));
  const ids = inputs.flatMap((i) => [
    ...(i.motor.source === 'catalogue' ? [i.motor.partId] : []),
    ...(['switch', 'driver', 'diode'] as const).flatMap((r) => [
      ...(i.selections[r].chosenPartId != null ? [i.selections[r].chosenPartId as number] : []),
      ...i.selections[r].alternatePartIds,
    ]),
  ]);
  const parts = await partsByIds(ids);
  const designs = held.map((r, k) => {
    const input = inputs[k];
    const lines = linesOf(outcomes.get(r.id)!.verification!, parts, input);
    return {
      id: r.id,
      name: r.name,
      revision: r.current_revision,
      ownerName: r.owner_name,
      readyAt: r.ready_at ? new Date(r.ready_at).toISOString() : null,
      boardQuantity: input.boardQuantity,
      lines,
    };
  });
  return { designs, withdrawn };
}

/**
 * The buyers' shortlist: every line and alternate of the designs marked ready, with supply facts. Opening
 * it re-verifies each ready design at the current catalogue; one that no longer holds goes back to draft
 * through the same service as a part change, and is listed apart with its reason, never as holding.
 */
import { db } from '../db.ts';
import type { DesignInput, PartRole } from '../../lib/domain/design.ts';
import type { Part } from '../../lib/domain/parts.ts';
import { bestUnitPrice, totalStock } from '../../lib/part-summary.ts';
import { pickStatus, reviewWords } from '../../lib/readiness.ts';
import type { SessionUser } from '../auth/types.ts';
import { partsByIds } from '../repos/parts.ts';
import { listReadyDesigns } from '../repos/designs.ts';
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
    stockQty: totalStock(part),
    minLeadTimeDays: part.sources.length ? Math.min(...part.sources.map((s) => s.leadTimeDays)) : null,
    minMoq: part.sources.length ? Math.min(...part.sources.map((s) => s.moq)) : null,
  };
}

function motorStatus(part: Part): { text: string; holds: boolean } {
  const holds = part.lifecycle !== 'obsolete' && part.reviewStatus === 'approved';
  return { text: `${holds ? '✓' : '✕'} ${reviewWords(part.reviewStatus)} · ${part.lifecycle}`, holds };
}

function linesOf(v: Verification, parts: Map<number, Part>, input: DesignInput): ShortlistDesign['lines'] {
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
  const heads = await listReadyDesigns(db());
  const outcomes = new Map(
    (
      await reverifyDesigns(
        heads.map((h) => h.id),
        actor,
        'Re-verified when the shortlist was opened',
      )
    ).map((o) => [o.designId, o]),
  );
  const withdrawn = [...outcomes.values()]
    .filter((o) => o.wasReady && !o.holds)
    .map((o) => ({ id: o.designId, name: o.name, reason: o.reason ?? '' }));
  const held = heads.flatMap((h) => {
    const o = outcomes.get(h.id);
    return o?.wasReady && o.holds && o.verification ? [{ head: h, verification: o.verification }] : [];
  });
  const ids = held.flatMap(({ verification: { input: i } }) => [
    ...(i.motor.source === 'catalogue' ? [i.motor.partId] : []),
    ...(['switch', 'driver', 'diode'] as const).flatMap((r) => [
      ...(i.selections[r].chosenPartId != null ? [i.selections[r].chosenPartId as number] : []),
      ...i.selections[r].alternatePartIds,
    ]),
  ]);
  const parts = await partsByIds(db(), ids);
  const designs = held.map(({ head, verification }) => ({
    id: head.id,
    name: head.name,
    revision: head.revision,
    ownerName: head.ownerName,
    readyAt: head.readyAt,
    boardQuantity: verification.input.boardQuantity,
    lines: linesOf(verification, parts, verification.input),
  }));
  return { designs, withdrawn };
}

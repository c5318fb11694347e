/**
 * The buyers' shortlist: every BOM line and alternate of the designs marked ready, with the buying figures
 * at a build quantity (src/lib/shortlist-figures.ts). Opening
 * it re-verifies each ready design at the current catalogue; one that no longer holds goes back to draft
 * through the same service as a part change, and is listed apart with its reason, never as holding.
 * Buyers and librarians also get each option's cached distributor offers, read from the offers cache
 * only: a slow or failing distributor never holds the shortlist up.
 */
import { db } from '../db.ts';
import type { DesignInput, PartRole } from '../../lib/domain/design.ts';
import type { Part } from '../../lib/domain/parts.ts';
import { pullResistorLine } from '../../lib/bom.ts';
import {
  shortlistFigures,
  type LineFigures,
  type LineInput,
  type OptionInput,
  type OptionPreference,
  type ShortlistTotals,
} from '../../lib/shortlist-figures.ts';
import { listPreferences, type StoredPreference } from '../repos/shortlist-preferences.ts';
import { shortlistCsv } from '../../lib/shortlist-csv.ts';
import { appConfig } from '../config.ts';
import { listCurrencyRates } from '../repos/currency-rates.ts';
import { pickStatus, reviewWords } from '../../lib/readiness.ts';
import type { SessionUser } from '../auth/types.ts';
import { partsByIds } from '../repos/parts.ts';
import { listReadyDesigns } from '../repos/designs.ts';
import { expiredQuotedSourceIds } from '../repos/quotes.ts';
import { reverifyDesigns, type Verification } from './design-status.ts';
import { listOffersOfParts, type CachedOffer } from '../repos/distributor-offers.ts';
import type { CachedOfferInput } from '../../lib/cached-offer-figures.ts';
import { cachedOfferInput, offerStaleAfterMs } from './distributor-offers.ts';
import { canManageSupply } from './parts-access.ts';

export interface ShortlistDesign {
  id: number;
  name: string;
  revision: number;
  ownerName: string;
  readyAt: string | null;
  /** The design's own boards per build. */
  boardQuantity: number;
  /** The build quantity the figures are for (the buyer's, else the design's). */
  boards: number;
  attritionPct: number;
  lines: LineFigures[];
  totals: ShortlistTotals;
}

export interface Shortlist {
  designs: ShortlistDesign[];
  /** Designs that were ready but no longer hold: sent back to draft as the shortlist opened. */
  withdrawn: { id: number; name: string; reason: string }[];
}

const ROLE_LABEL: Record<PartRole | 'motor', string> = {
  motor: 'Motor',
  switch: 'Low-side switch',
  driver: 'Gate driver',
  diode: 'Freewheel diode',
};

function optionOf(
  part: Part,
  position: number,
  status: { text: string; holds: boolean },
  preference: OptionPreference | null,
  offers: readonly CachedOfferInput[],
): OptionInput {
  return {
    preference,
    offers,
    partId: part.id as number,
    mpn: part.mpn,
    manufacturer: part.manufacturer,
    lifecycle: part.lifecycle,
    position,
    status: status.text,
    holds: status.holds,
    sources: part.sources,
  };
}

function motorStatus(part: Part): { text: string; holds: boolean } {
  const holds = part.lifecycle !== 'obsolete' && part.reviewStatus === 'approved';
  return { text: `${holds ? '✓' : '✕'} ${reviewWords(part.reviewStatus)} · ${part.lifecycle}`, holds };
}

/** The BOM's lines (src/lib/bom.ts: one of each per board, the pull resistor when the power-on walk sized one). */
function lineInputs(
  designId: number,
  v: Verification,
  parts: Map<number, Part>,
  input: DesignInput,
  prefs: readonly StoredPreference[],
  offersOf: (partId: number) => readonly CachedOfferInput[],
): LineInput[] {
  const base = { perBoard: 1, generic: null };
  const pref = (line: string, partId: number): OptionPreference | null => {
    const p = prefs.find((x) => x.designId === designId && x.line === line && x.partId === partId);
    return p ? { source: p.source, note: p.note, setByName: p.setByName, updatedAt: p.updatedAt } : null;
  };
  const lines: LineInput[] = [];
  if (input.motor.source === 'catalogue' && parts.has(input.motor.partId)) {
    const motor = parts.get(input.motor.partId)!;
    lines.push({
      ...base,
      key: 'motor',
      label: ROLE_LABEL.motor,
      options: [optionOf(motor, 0, motorStatus(motor), pref('motor', motor.id as number), offersOf(motor.id as number))],
    });
  }
  for (const role of ['switch', 'driver', 'diode'] as const) {
    const sel = input.selections[role];
    const ordered = [sel.chosenPartId, ...sel.alternatePartIds].filter((id): id is number => id != null && parts.has(id));
    if (ordered.length)
      lines.push({
        ...base,
        key: role,
        label: ROLE_LABEL[role],
        options: ordered.map((id, i) =>
          optionOf(parts.get(id)!, i, pickStatus(v.match, role, id, v.parts.get(id)), pref(role, id), offersOf(id)),
        ),
      });
  }
  const pull = pullResistorLine(v.match.powerOn?.recommendedPull ?? null);
  if (pull) lines.push({ ...base, key: 'pull', label: pull.role, options: [], generic: `${pull.partNumber}: ${pull.description}` });
  return lines;
}

/**
 * Every ready design that still holds, with its figures at a build quantity: `boardsFor` gives the buyer's
 * quantity per design id (absent: the design's own boards per build).
 */
export async function readyShortlist(actor: SessionUser | null, boardsFor: ReadonlyMap<number, number> = new Map()): Promise<Shortlist> {
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
  const [loaded, expired, rates, prefs, cached] = await Promise.all([
    partsByIds(db(), ids),
    // A supplier's quoted price counts only while its offer holds (quote requests, valid until).
    expiredQuotedSourceIds(db(), ids, new Date().toISOString().slice(0, 10)),
    listCurrencyRates(db()),
    listPreferences(
      db(),
      held.map((h) => h.head.id),
    ),
    // Distributor figures from the offers cache only (never the distributor itself), for those who see them on the part page.
    canManageSupply(actor) ? listOffersOfParts(db(), ids) : Promise.resolve(new Map<number, CachedOffer[]>()),
  ]);
  const nowMs = Date.now();
  const staleAfterMs = offerStaleAfterMs();
  const offersOf = (partId: number): CachedOfferInput[] => (cached.get(partId) ?? []).map((o) => cachedOfferInput(o, nowMs, staleAfterMs));
  const parts = new Map(
    [...loaded].map(([id, part]) => [
      id,
      expired.size ? { ...part, sources: part.sources.filter((src) => !expired.has(src.id ?? 0)) } : part,
    ]),
  );
  const { orgCurrency, attritionPct } = appConfig().buying;
  const designs = held.map(({ head, verification }): ShortlistDesign => {
    const boards = boardsFor.get(head.id) ?? verification.input.boardQuantity;
    const figures = shortlistFigures(
      lineInputs(head.id, verification, parts, verification.input, prefs, offersOf),
      boards,
      attritionPct,
      orgCurrency,
      rates,
    );
    return {
      id: head.id,
      name: head.name,
      revision: head.revision,
      ownerName: head.ownerName,
      readyAt: head.readyAt,
      boardQuantity: verification.input.boardQuantity,
      boards,
      attritionPct,
      ...figures,
    };
  });
  return { designs, withdrawn };
}

/** The shortlist as a CSV download (src/lib/shortlist-csv.ts): the same designs and figures the page shows. */
export async function shortlistCsvFile(
  actor: SessionUser | null,
  boardsFor: ReadonlyMap<number, number> = new Map(),
): Promise<{ body: string; fileName: string; rows: number }> {
  const { designs } = await readyShortlist(actor, boardsFor);
  const { csv, rows } = shortlistCsv(designs);
  return { body: csv, rows, fileName: `shortlist-${new Date().toISOString().slice(0, 10)}.csv` };
}

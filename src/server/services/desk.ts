/**
 * The home page per role: designers their designs; librarians the review queue, recent imports and parts
 * without a datasheet; buyers the ready designs with stock shortfalls at their build quantity and the quote
 * requests awaiting an answer; admins the
 * same plus people. Open change alerts show above it (components/alerts). Every list is short and bounded.
 */
import { db } from '../db.ts';
import type { DesignSummary } from '../../lib/domain/design.ts';
import type { SessionUser } from '../auth/types.ts';
import { quantityNeeded } from '../../lib/buying.ts';
import { appConfig } from '../config.ts';
import { listDesignRows, listReadyDesigns, loadRevisionInput } from '../repos/designs.ts';
import {
  chosenPartStock,
  partsMissingDatasheets,
  peopleCounts,
  recentImports,
  reviewQueueHead,
  type DeskImport,
  type DeskPart,
} from '../repos/desk.ts';
import { countQuotesInState } from '../repos/quotes.ts';

const LIST = 5;

export interface Shortfall {
  mpn: string;
  role: string;
  needed: number;
  inStock: number;
}

export interface ReadyDesignDesk {
  id: number;
  name: string;
  ownerName: string;
  boards: number;
  shortfalls: Shortfall[];
}

export interface Desk {
  designs?: { items: DesignSummary[]; total: number };
  review?: { items: DeskPart[]; total: number };
  missingDatasheets?: { items: DeskPart[]; total: number };
  imports?: DeskImport[];
  shortlists?: { items: ReadyDesignDesk[]; total: number };
  /** Quote requests sent and not yet answered (buyers). */
  quotesAwaiting?: number;
  people?: { active: number; invited: number };
}

const has = (u: SessionUser, role: SessionUser['roles'][number]) => u.roles.includes(role) || u.roles.includes('admin');

/**
 * Chosen parts whose stock over all sources is below the need at the design's build quantity: the
 * shortlist's need (src/lib/buying.ts quantityNeeded), one per board × boards plus the configured
 * attrition, rounded up, so the home page and the shortlist flag the same lines.
 */
async function readyWithShortfalls(): Promise<{ items: ReadyDesignDesk[]; total: number }> {
  const heads = await listReadyDesigns(db());
  const shown = heads.slice(0, LIST);
  const [inputs, stock] = await Promise.all([
    Promise.all(shown.map((h) => loadRevisionInput(db(), h.id, h.revision).catch(() => null))),
    chosenPartStock(
      db(),
      shown.map((h) => h.id),
    ),
  ]);
  const { attritionPct } = appConfig().buying;
  const items = shown.map((h, i) => {
    const boards = inputs[i]?.boardQuantity ?? 0;
    const needed = quantityNeeded(1, boards, attritionPct);
    const shortfalls = stock
      .filter((s) => s.designId === h.id && s.inStock < needed)
      .map((s) => ({ mpn: s.mpn, role: s.role, needed, inStock: s.inStock }));
    return { id: h.id, name: h.name, ownerName: h.ownerName, boards, shortfalls };
  });
  return { items, total: heads.length };
}

export async function deskFor(user: SessionUser): Promise<Desk> {
  const desk: Desk = {};
  const work: Promise<void>[] = [];
  if (has(user, 'designer'))
    work.push(listDesignRows(db(), { ownerId: user.id, page: 1, pageSize: LIST }).then((d) => void (desk.designs = d)));
  if (has(user, 'librarian')) {
    work.push(reviewQueueHead(db(), LIST).then((r) => void (desk.review = r)));
    work.push(partsMissingDatasheets(db(), LIST).then((r) => void (desk.missingDatasheets = r)));
    work.push(recentImports(db(), LIST).then((r) => void (desk.imports = r)));
  }
  if (has(user, 'buyer')) {
    work.push(readyWithShortfalls().then((r) => void (desk.shortlists = r)));
    work.push(countQuotesInState(db(), 'sent').then((n) => void (desk.quotesAwaiting = n)));
  }
  if (user.roles.includes('admin')) work.push(peopleCounts(db()).then((r) => void (desk.people = r)));
  await Promise.all(work);
  return desk;
}

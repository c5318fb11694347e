/** Designs: create, revise (earlier revisions kept), match against the catalogue. Status flips: design-status.ts. */
import type { Knex } from 'knex';
import { db } from '../db.ts';
import type { Design, DesignInput, DesignSummary } from '../../lib/domain/design.ts';
import type { MatchRequest } from '../../lib/schemas/design.ts';
import type { MotorParams, Part } from '../../lib/domain/parts.ts';
import type { SessionUser } from '../auth/types.ts';
import {
  matchFromRanking,
  prepareCase,
  rankForMatch,
  rankForMatchLeanSteps,
  type DesignMatch,
  type MatchCatalogue,
  type PreparedCase,
} from '../../lib/design-match.ts';
import type { DesignRanking } from '../../lib/rank-design.ts';
import type { Steps } from '../../lib/slices.ts';
import {
  findDesignRow,
  insertDesignRow,
  insertRevision,
  listDesignRows,
  loadDesign,
  loadRevisionInput,
  replaceDesignParts,
  setCurrentRevision,
  type DesignListQuery,
} from '../repos/designs.ts';
import { partCategoriesByIds, partsByIds } from '../repos/parts.ts';
import { insertAuditEvent } from '../repos/audit.ts';
import { ServiceError, notFound } from './errors.ts';
import { loadCandidates, priceCandidates, type SwitchDrivePhase } from './design-candidates.ts';
import { idsNeedingPrice, leanMatchPageSteps, type DesignMatchPage } from '../../lib/match-page.ts';
import { withMatchSlot } from './match-gate.ts';
import { withLockedVersion } from '../repos/versioned.ts';
import { DESIGN_ENTITY, sameDesign } from './design-entity.ts';
import { nextTurn } from '../turns.ts';

export const canEditDesign = (user: SessionUser, ownerId: number): boolean => user.roles.includes('admin') || user.id === ownerId;

export async function listDesigns(
  query: DesignListQuery,
): Promise<{ items: DesignSummary[]; total: number; page: number; pageSize: number }> {
  const { items, total } = await listDesignRows(db(), query);
  return { items, total, page: query.page, pageSize: query.pageSize };
}

export async function getDesign(id: number, revision?: number): Promise<Design> {
  const design = await loadDesign(db(), id, revision);
  if (!design) throw notFound(revision ? `Revision ${revision} of design ${id}` : 'The design');
  return design;
}

async function assertReferencesExist(k: Knex | Knex.Transaction, input: DesignInput): Promise<void> {
  const wanted: { path: string; id: number; category: string }[] = [];
  if (input.motor.source === 'catalogue') wanted.push({ path: 'motor.partId', id: input.motor.partId, category: 'motor' });
  for (const role of ['switch', 'driver', 'diode'] as const) {
    const category = role === 'switch' ? 'mosfet' : role;
    const sel = input.selections[role];
    if (sel.chosenPartId != null) wanted.push({ path: `selections.${role}.chosenPartId`, id: sel.chosenPartId, category });
    sel.alternatePartIds.forEach((id, i) => wanted.push({ path: `selections.${role}.alternatePartIds.${i}`, id, category }));
  }
  if (!wanted.length) return;
  const found = await partCategoriesByIds(
    k,
    wanted.map((w) => w.id),
  );
  const issues = wanted
    .filter((w) => found.get(w.id) !== w.category)
    .map((w) => ({ path: w.path, message: found.has(w.id) ? `part ${w.id} is not a ${w.category}` : `part ${w.id} does not exist` }));
  if (issues.length) throw new ServiceError(400, 'The design refers to parts that are missing or of the wrong kind.', issues);
}

export async function createDesign(user: SessionUser, input: DesignInput): Promise<Design> {
  const id = await db().transaction(async (trx) => {
    await assertReferencesExist(trx, input);
    const designId = await insertDesignRow(trx, user.id, input.name);
    await insertRevision(trx, designId, 1, input, user.id);
    await replaceDesignParts(trx, designId, input);
    await insertAuditEvent(trx, {
      actorUserId: user.id,
      action: 'design.create',
      entityType: 'design',
      entityId: designId,
      before: null,
      after: { name: input.name, revision: 1 },
    });
    return designId;
  });
  return getDesign(id);
}

/** Saves a changed input as a new revision; an unchanged input leaves the revision as it is. */
export async function updateDesign(user: SessionUser, id: number, input: DesignInput, expectedVersion: number): Promise<Design> {
  await withLockedVersion(DESIGN_ENTITY, {
    id,
    expectedVersion,
    actorUserId: user.id,
    action: 'design.revise',
    precheck: (row) => {
      if (!canEditDesign(user, row.owner_id)) throw new ServiceError(403, 'Only the owner of a design (or an admin) can change it.');
    },
    apply: async (trx, row) => {
      const current = await loadRevisionInput(trx, id, row.current_revision).catch(() => null);
      if (current && JSON.stringify(current) === JSON.stringify(input)) return;
      await assertReferencesExist(trx, input);
      const revision = row.current_revision + 1;
      await insertRevision(trx, id, revision, input, user.id);
      await replaceDesignParts(trx, id, input);
      await setCurrentRevision(trx, id, input.name, revision, row.version + 1);
    },
    unchanged: sameDesign,
  });
  return getDesign(id);
}

/** The motor a design uses: the catalogue part's datasheet points, or the ones entered by hand. */
export async function resolveMotor(
  input: DesignInput,
  k: Knex | Knex.Transaction = db(),
): Promise<{ label: string; params: MotorParams; part: Part | null }> {
  if (input.motor.source === 'manual') return { label: input.motor.label, params: input.motor.params, part: null };
  const part = (await partsByIds(k, [input.motor.partId])).get(input.motor.partId);
  if (!part || part.category !== 'motor') {
    throw new ServiceError(400, 'The design refers to a motor that is not in the catalogue.', [
      { path: 'motor.partId', message: `no motor with id ${input.motor.partId}` },
    ]);
  }
  return { label: `${part.mpn} (${part.manufacturer})`, params: part.params, part };
}

export type ResolvedMotor = Awaited<ReturnType<typeof resolveMotor>>;

/**
 * Ranks the catalogue for a design; pass the motor when the caller has already resolved it, and a
 * transaction when the answer decides a status flip made in it.
 */
/**
 * With `page`, only the parts whose price can show on that page (idsNeedingPrice) are priced: the lists
 * keep their verdicts, counts and every entry pageMatch(…, page) returns, but entries of other tie groups
 * carry no price and their order among themselves is by lifecycle and MPN. Without it, every part is priced.
 */
export async function matchInput(
  input: DesignInput,
  includePending: boolean,
  resolved?: ResolvedMotor,
  k: Knex | Knex.Transaction = db(),
  page?: { offset: number; limit: number },
): Promise<DesignMatch> {
  return (await matchWithCatalogue(input, includePending, resolved, k, page)).match;
}

/**
 * The drive phases of a match: first the switches the logic pin can drive. When one of them passes and no
 * driver is chosen, the engine never looks at the others (they fail gate drive directly and no driver is
 * used), so the answer is the one the whole catalogue gives, less parts that could only fail. Otherwise the
 * candidates a driver could enhance are loaded and ranked.
 */
async function rankInPhases<R extends { ranking: DesignRanking }>(
  input: DesignInput,
  load: (phase: SwitchDrivePhase) => Promise<MatchCatalogue>,
  rank: (catalogue: MatchCatalogue, earlier?: { catalogue: MatchCatalogue; ranking: DesignRanking }) => Steps<R>,
  watch: MatchWatch = {},
): Promise<{ catalogue: MatchCatalogue; ranked: R }> {
  const step = (name: MatchStep) => checkpoint(watch, name);
  let earlier: { catalogue: MatchCatalogue; ranking: DesignRanking } | undefined;
  if (input.selections.driver.chosenPartId == null) {
    const direct = await load('direct');
    await step('loaded-direct');
    const ranked = await runSliced(rank(direct), watch);
    await step('ranked-direct');
    if (!ranked.ranking.driverNeeded && ranked.ranking.switch.some((e) => e.verdict === 'pass')) return { catalogue: direct, ranked };
    earlier = { catalogue: direct, ranking: ranked.ranking };
  }
  const catalogue = await load('driver');
  await step('loaded-driver');
  const ranked = await runSliced(rank(catalogue, earlier), watch);
  await step('ranked-driver');
  return { catalogue, ranked };
}

/** The points between the steps of a match where a client that has gone away stops it. */
export type MatchStep = 'loaded-direct' | 'ranked-direct' | 'loaded-driver' | 'ranked-driver' | 'priced';

/** What a match run listens to: the request's abort signal, and an observer of the steps it reaches (tests, tracing). */
export interface MatchWatch {
  signal?: AbortSignal;
  onStep?: (step: MatchStep) => void;
  /** Called at every pause inside a ranking (between slices of parts judged; see src/lib/slices.ts). */
  onSlice?: () => void;
}

/**
 * Runs a sliced ranking, letting pending I/O and other requests run between its slices (a health check
 * or a search is not held behind a whole ranking) and stopping it there when the client has gone. The
 * matches running at once take turns (src/server/turns.ts): one slice per turn of the event loop.
 */
async function runSliced<R>(steps: Steps<R>, watch: MatchWatch): Promise<R> {
  for (;;) {
    const r = steps.next();
    if (r.done) return r.value;
    watch.onSlice?.();
    await nextTurn();
    stopIfAborted(watch.signal);
  }
}

/**
 * Lets pending I/O run (a closed socket aborts the request's signal there), then stops the match if the
 * client has gone: the catalogue loads, rankings, pricing and page after this point never run.
 */
async function checkpoint(watch: MatchWatch, step: MatchStep): Promise<void> {
  watch.onStep?.(step);
  if (!watch.signal) return;
  await nextTurn();
  stopIfAborted(watch.signal);
}

const switchPicksOf = (input: DesignInput): number[] => {
  const sel = input.selections.switch;
  return [...(sel.chosenPartId != null ? [sel.chosenPartId] : []), ...sel.alternatePartIds];
};

/** The match with the catalogue it ranked and its prepared case (the comparison judges further parts at them). */
export async function matchWithCatalogue(
  input: DesignInput,
  includePending: boolean,
  resolved?: ResolvedMotor,
  k: Knex | Knex.Transaction = db(),
  page?: { offset: number; limit: number },
): Promise<{ match: DesignMatch; catalogue: MatchCatalogue; prepared: PreparedCase }> {
  const motor = resolved ?? (await resolveMotor(input, k));
  const prepared = prepareCase(input, motor.params);
  const { catalogue, ranked } = await rankInPhases(
    input,
    (phase) => loadCandidates(k, prepared, includePending, phase, switchPicksOf(input), input.boardQuantity, page == null),
    // eslint-disable-next-line require-yield -- the full ranking runs in one step (it is for the report and the ready check)
    function* (c) {
      return { ranking: rankForMatch(input, c, prepared) };
    },
  );
  if (page) await priceCandidates(k, catalogue, idsNeedingPrice(ranked.ranking, input, page), input.boardQuantity);
  return { match: matchFromRanking(input, motor.label, motor.params, catalogue, prepared, ranked.ranking), catalogue, prepared };
}

/**
 * One page of the match, worked out lean: every candidate judged for its verdict, score and failing
 * checks only; the entries the page carries judged again in full and priced (leanMatchPage). The same
 * answer as pageMatch(matchInput(…), …), for a fraction of the work and memory on a large catalogue.
 */
export async function matchPageOf(
  input: DesignInput,
  includePending: boolean,
  page: { offset: number; limit: number },
  k: Knex | Knex.Transaction = db(),
  resolved?: ResolvedMotor,
  watch: MatchWatch = {},
): Promise<DesignMatchPage> {
  const motor = resolved ?? (await resolveMotor(input, k));
  const prepared = prepareCase(input, motor.params);
  const { catalogue, ranked } = await rankInPhases(
    input,
    (phase) => loadCandidates(k, prepared, includePending, phase, switchPicksOf(input), input.boardQuantity, false),
    (c, earlier) => rankForMatchLeanSteps(input, c, prepared, earlier),
    watch,
  );
  await priceCandidates(k, catalogue, idsNeedingPrice(ranked.ranking, input, page), input.boardQuantity);
  await checkpoint(watch, 'priced');
  return runSliced(leanMatchPageSteps(input, motor.label, motor.params, catalogue, prepared, ranked, page), watch);
}

/**
 * A client that has gone away (request.signal aborted) gets no ranking: checked before a match slot is
 * taken, before the catalogue is loaded, between the match's steps (checkpoint) and between the slices of
 * a ranking (runSliced): the rest of the ranking and the steps after it do not run.
 */
function stopIfAborted(signal: AbortSignal | undefined): void {
  if (signal?.aborted) throw new ServiceError(503, 'The match was cancelled: the client closed the request.');
}

export async function designExists(id: number): Promise<boolean> {
  return (await findDesignRow(db(), id)) !== undefined;
}

/**
 * The one match pipeline behind both match routes. With a design id, the design must exist (404
 * otherwise, also when unsaved input is sent along); the input sent, or else its saved revision, is
 * ranked. Without an id, the input is required. The whole catalogue is ranked (counts, picks and
 * suggestions come from the full ranking); the answer carries `limit` entries per list from `offset`
 * plus the picks. At most MATCH_CONCURRENCY run at once (429 beyond).
 */
export async function matchRequest(designId: number | null, request: MatchRequest, signal?: AbortSignal): Promise<DesignMatchPage> {
  if (designId === null) {
    if (!request.input) throw new ServiceError(400, 'Send the design input to rank.', [{ path: 'input', message: 'required' }]);
    if (request.revision !== undefined)
      throw new ServiceError(400, 'A revision needs a saved design.', [{ path: 'revision', message: 'use /api/designs/:id/match' }]);
  } else if (request.input && request.revision !== undefined) {
    throw new ServiceError(400, 'Send either unsaved input or a revision, not both.', [{ path: 'revision', message: 'not with input' }]);
  }
  stopIfAborted(signal);
  return withMatchSlot(async () => {
    const input = designId === null ? request.input! : (request.input ?? (await getDesign(designId, request.revision)).input);
    if (designId !== null && request.input) await getDesign(designId);
    stopIfAborted(signal);
    const page = { limit: request.limit, offset: request.offset };
    return matchPageOf(input, request.includePending, page, db(), undefined, { signal });
  });
}

/**
 * Ready means verified, always. Marking ready re-runs the full match at the saved revision with approved
 * parts only; a catalogue change re-verifies every ready design using the part right after it commits,
 * and a design that no longer holds goes back to draft with the reason recorded (row, audit trail).
 * Each flip happens in a transaction that locks the design row, so two flips cannot interleave.
 */
import { db, type Db } from '../db.ts';
import type { Design, DesignInput, DesignStatus } from '../../lib/domain/design.ts';
import type { DesignMatch } from '../../lib/design-match.ts';
import { readinessIssues, type PartFacts, type ReadinessIssue } from '../../lib/readiness.ts';
import type { SessionUser } from '../auth/types.ts';
import { loadRevisionInput, lockDesignRow, readyDesignIdsUsingParts, writeDesignStatus, type DbDesignRow } from '../repos/designs.ts';
import { insertAuditEvent } from '../repos/audit.ts';
import { ServiceError, notFound } from './errors.ts';
import { canEditDesign, getDesign, matchPageOf, resolveMotor } from './designs.ts';
import { withLockedVersion } from '../repos/versioned.ts';
import { DESIGN_ENTITY, sameDesign } from './design-entity.ts';
import { partsByIds } from '../repos/parts.ts';
import { DEFAULT_MATCH_LIMIT } from '../../lib/schemas/design.ts';

/** designs.status_reason is VARCHAR(2000). */
const REASON_MAX_CHARS = 2000;
/** audit_events.note is VARCHAR(500); the full reasons go in the event's after_json. */
const AUDIT_NOTE_MAX_CHARS = 500;

export interface Verification {
  /** The input judged (the saved revision, validated). */
  input: DesignInput;
  match: DesignMatch;
  issues: ReadinessIssue[];
  /** Catalogue facts of every picked part (the motor included), by id. */
  parts: Map<number, PartFacts>;
}

const pickIds = (input: DesignInput): number[] =>
  (['switch', 'driver', 'diode'] as const).flatMap((r) => [
    ...(input.selections[r].chosenPartId != null ? [input.selections[r].chosenPartId as number] : []),
    ...input.selections[r].alternatePartIds,
  ]);

/**
 * The entries a verification keeps of each list: the first page (the best parts, which the alerts offer as
 * alternates and the report reads the paired driver from) besides every pick, which always travels with it.
 */
const VERIFY_PAGE = { offset: 0, limit: DEFAULT_MATCH_LIMIT };

/**
 * Runs the match for an input (the whole catalogue ranked; the first page and every pick judged in full,
 * as the match routes do) and applies the readiness rule to it.
 */
export async function verifyInput(input: DesignInput, includePending: boolean, k: Db = db()): Promise<Verification> {
  const motor = await resolveMotor(input, k);
  const [match, byId] = await Promise.all([matchPageOf(input, includePending, VERIFY_PAGE, k, motor), partsByIds(k, pickIds(input))]);
  const parts = new Map<number, PartFacts>(
    [...byId].map(([id, p]) => [id, { mpn: p.mpn, lifecycle: p.lifecycle, reviewStatus: p.reviewStatus }]),
  );
  const motorFacts = motor.part ? { mpn: motor.part.mpn, lifecycle: motor.part.lifecycle, reviewStatus: motor.part.reviewStatus } : null;
  return { input, match, issues: readinessIssues(input, match, { parts, motor: motorFacts }), parts };
}

/** Verification that cannot even run (a revision that no longer validates, a motor gone) counts as not holding. */
async function verifyAt(
  k: Db,
  designId: number,
  revision: number,
): Promise<{ issues: ReadinessIssue[]; verification: Verification | null }> {
  try {
    const input = await loadRevisionInput(k, designId, revision);
    if (!input) return { issues: [{ path: 'revision', message: `revision ${revision} is missing` }], verification: null };
    const verification = await verifyInput(input, false, k);
    return { issues: verification.issues, verification };
  } catch (err) {
    if (err instanceof ServiceError) return { issues: [{ path: 'design', message: err.message }], verification: null };
    throw err;
  }
}

const clip = (text: string, max = REASON_MAX_CHARS): string => (text.length <= max ? text : `${text.slice(0, max - 1)}…`);

async function lockDesign(k: Db, id: number): Promise<DbDesignRow> {
  const row = await lockDesignRow(k, id);
  if (!row) throw notFound('The design');
  return row;
}

export async function setDesignStatus(user: SessionUser, id: number, status: DesignStatus, expectedVersion: number): Promise<Design> {
  await withLockedVersion(DESIGN_ENTITY, {
    id,
    expectedVersion,
    actorUserId: user.id,
    action: `design.${status}`,
    precheck: (row) => {
      if (!canEditDesign(user, row.owner_id)) throw new ServiceError(403, 'Only the owner of a design (or an admin) can mark it ready.');
    },
    apply: async (trx, row) => {
      if (row.status === status) return;
      if (status === 'ready') {
        // Checked under the row lock: a part change committing meanwhile re-verifies after this commits.
        const { issues } = await verifyAt(trx, id, row.current_revision);
        if (issues.length)
          throw new ServiceError(
            409,
            'This design cannot go on the shortlist yet: some picks do not hold with its inputs at the current catalogue.',
            issues,
          );
      }
      await writeDesignStatus(trx, id, { status, reason: null, version: row.version + 1 });
    },
    unchanged: sameDesign,
  });
  return getDesign(id);
}

export interface ReverifyOutcome {
  designId: number;
  name: string;
  /** Ready when the re-verification began (a design already in draft is left as it is). */
  wasReady: boolean;
  /** True when the design still holds (or was not ready, so nothing was at stake). */
  holds: boolean;
  issues: ReadinessIssue[];
  /** The reason recorded when it went back to draft. */
  reason: string | null;
  /** The match it was judged on (null when not ready or when verification could not run). */
  verification: Verification | null;
}

/**
 * Re-verifies one design if it is ready; one that no longer holds goes back to draft with the reason.
 * `trigger` says what changed ("QX12 (part 17): lifecycle active → obsolete").
 */
export async function reverifyDesign(
  designId: number,
  actor: SessionUser | null,
  trigger: { partIds: number[]; reason: string },
): Promise<ReverifyOutcome> {
  return db().transaction(async (trx) => {
    const row = await lockDesign(trx, designId);
    const base = { designId, name: row.name, reason: null };
    if (row.status !== 'ready') return { ...base, wasReady: false, holds: true, issues: [], verification: null };
    const { issues, verification } = await verifyAt(trx, designId, row.current_revision);
    if (issues.length === 0) return { ...base, wasReady: true, holds: true, issues, verification };
    const reason = clip(`${trigger.reason}: ${issues.map((i) => i.message).join('; ')}`);
    await writeDesignStatus(trx, designId, { status: 'draft', reason, version: row.version + 1 });
    await insertAuditEvent(trx, {
      actorUserId: actor?.id ?? null,
      action: 'design.unready',
      entityType: 'design',
      entityId: designId,
      before: { status: 'ready', revision: row.current_revision },
      after: { status: 'draft', revision: row.current_revision, reasons: issues, trigger },
      note: clip(reason, AUDIT_NOTE_MAX_CHARS),
    });
    return { ...base, wasReady: true, holds: false, issues, reason, verification };
  });
}

/**
 * Called by the part services right after a change to a part commits (same request): every ready design
 * using one of the parts is re-verified, each in its own locked transaction. Draft designs have no status
 * at stake; they are judged afresh whenever they are opened or marked ready.
 */
export async function reverifyDesignsUsingParts(partIds: number[], actor: SessionUser | null, reason: string): Promise<ReverifyOutcome[]> {
  const ids = await readyDesignIdsUsingParts(db(), partIds);
  const outcomes: ReverifyOutcome[] = [];
  for (const id of ids) outcomes.push(await reverifyOrWithdraw(id, actor, { partIds, reason }));
  return outcomes;
}

/**
 * Re-verification that cannot leave a design marked ready unverified: when the check itself fails (a bug,
 * a record the engine cannot read), the design goes back to draft saying so, and the error is logged.
 */
async function reverifyOrWithdraw(
  designId: number,
  actor: SessionUser | null,
  trigger: { partIds: number[]; reason: string },
): Promise<ReverifyOutcome> {
  try {
    return await reverifyDesign(designId, actor, trigger);
  } catch (err) {
    console.error(`[stallpoint] re-verifying design ${designId} failed; withdrawing its ready status:`, err);
    const reason = clip(
      `${trigger.reason}: the design could not be re-verified (${(err as Error).message}); check it and mark it ready again`,
    );
    await writeDesignStatus(db(), designId, { status: 'draft', reason, onlyIfReady: true });
    return { designId, name: '', reason, wasReady: true, holds: false, issues: [], verification: null };
  }
}

/** Re-verifies the given designs (the shortlist opens with this), flipping any that no longer hold. */
export async function reverifyDesigns(designIds: number[], actor: SessionUser | null, reason: string): Promise<ReverifyOutcome[]> {
  const outcomes: ReverifyOutcome[] = [];
  for (const id of designIds) outcomes.push(await reverifyDesign(id, actor, { partIds: [], reason }));
  return outcomes;
}

/**
 * Change alerts. After a part change commits, every design using the part (chosen or alternate, any status)
 * gets one alert per change (insert-ignore on the unique key), and the alert mail goes to the design's owner
 * and the buyers once: each alert is mailed inside a transaction holding its row lock, and sent_at is set
 * there, so a second server processing the same alert waits for the lock and then finds it sent. Mail runs
 * in the background after the part change has answered; a failure leaves the alert unsent for the next run.
 */
import type { Knex } from 'knex';
import { db } from '../db.ts';
import type { SessionUser } from '../auth/types.ts';
import type { Lifecycle, Part } from '../../lib/domain/parts.ts';
import { LIFECYCLE_LABELS } from '../../lib/labels.ts';
import { effectiveSwitchList } from '../../lib/design-match.ts';
import { appConfig } from '../config.ts';
import { sendMail } from '../mail/send.ts';
import type { MailMessage } from '../mail/messages.ts';
import { insertAuditEvent } from '../repos/audit.ts';
import { findDesignRow, loadRevisionInput } from '../repos/designs.ts';
import {
  acknowledgeAlertRow,
  alertRecipients,
  designsUsingParts,
  findAlert,
  insertAlerts,
  listOpenAlerts,
  lockAlert,
  markAlertSent,
  unsentAlertIds,
  type NewAlert,
  type OpenAlert,
} from '../repos/design-alerts.ts';
import { reverifyDesignsUsingParts, verifyInput, type ReverifyOutcome } from './design-status.ts';
import { ServiceError, notFound } from './errors.ts';

/** Lifecycle states that raise an alert on every design using the part. */
export const ALERTING_LIFECYCLES: readonly Lifecycle[] = ['nrnd', 'last-buy', 'obsolete'];
const DETAIL_MAX = 2000;
const clip = (s: string): string => (s.length <= DETAIL_MAX ? s : `${s.slice(0, DETAIL_MAX - 1)}…`);
/** How many unsent alerts one processing run mails (the rest wait for the next run). */
const BATCH = 200;

/** A part moved lifecycle: alerts on every design using it when the new state is NRND, last-buy or obsolete. */
export async function raiseLifecycleAlerts(
  part: { id: number; mpn: string; version: number },
  from: Lifecycle,
  to: Lifecycle,
  k: Db = db(),
): Promise<void> {
  if (!ALERTING_LIFECYCLES.includes(to) || from === to) return;
  const uses = await designsUsingParts(k, [part.id]);
  const seen = new Set<number>();
  const alerts: NewAlert[] = [];
  for (const u of uses) {
    if (seen.has(u.designId)) continue;
    seen.add(u.designId);
    const pick = u.position === 0 ? `chosen ${u.role}` : `alternate ${u.role}`;
    alerts.push({
      designId: u.designId,
      partId: part.id,
      kind: 'lifecycle',
      changeKey: `v${part.version}:${to}`,
      detail: clip(`${part.mpn} (${pick}) moved from ${LIFECYCLE_LABELS[from].long} to ${LIFECYCLE_LABELS[to].long}.`),
    });
  }
  await insertAlerts(k, alerts);
}

type Db = Knex | Knex.Transaction;

/** Re-verification outcomes after a change to one part (every outcome is of a design using it): a ready design that no longer holds gets an alert. */
export async function raiseNoLongerHoldsAlerts(
  outcomes: ReverifyOutcome[],
  part: { id: number; mpn: string; version: number },
  k: Db = db(),
): Promise<void> {
  await insertAlerts(
    k,
    outcomes
      .filter((o) => o.wasReady && !o.holds)
      .map((o) => ({
        designId: o.designId,
        partId: part.id,
        kind: 'no-longer-holds' as const,
        changeKey: `v${part.version}`,
        detail: clip(`After a change to ${part.mpn} the design no longer holds and went back to draft: ${o.reason ?? 'see the design'}`),
      })),
  );
}

/**
 * What every part change does right after it commits (edit, review, lifecycle, supply data): ready designs
 * using the part are re-verified (back to draft when they no longer hold), then the change alerts are raised
 * and mailed in the background. `lifecycleFrom` is the state before a lifecycle move. Raising alerts never
 * throws: the part change has already been saved, and an alert that could not be raised is logged.
 */
export async function afterPartChange(actor: SessionUser, part: Part, reason: string, lifecycleFrom?: Lifecycle): Promise<void> {
  const outcomes = await reverifyDesignsUsingParts([part.id as number], actor, reason);
  const changed = { id: part.id as number, mpn: part.mpn, version: part.version as number };
  try {
    if (lifecycleFrom) await raiseLifecycleAlerts(changed, lifecycleFrom, part.lifecycle);
    await raiseNoLongerHoldsAlerts(outcomes, changed);
  } catch (err) {
    console.error(`[stallpoint] raising change alerts for part ${changed.id} failed:`, err);
    return;
  }
  void processPendingAlerts().catch((err: unknown) => console.error('[stallpoint] sending change alerts failed:', err));
}

/** The design's own alternates and the other candidates that pass the design now for the part's line. */
async function passingAlternates(k: Db, designId: number, partId: number): Promise<string[]> {
  const row = await findDesignRow(k, designId);
  if (!row) return [];
  const input = await loadRevisionInput(k, designId, row.current_revision);
  if (!input) return [];
  const roles = (['switch', 'driver', 'diode'] as const).filter(
    (r) => input.selections[r].chosenPartId === partId || input.selections[r].alternatePartIds.includes(partId),
  );
  if (roles.length === 0) return [];
  try {
    const { match } = await verifyInput(input, false, k);
    const lines: string[] = [];
    for (const role of roles) {
      const list = role === 'switch' ? effectiveSwitchList(match) : match[role];
      const passing = list.filter((c) => c.verdict === 'pass' && c.partId !== partId && c.lifecycle !== 'obsolete');
      const own = new Set(input.selections[role].alternatePartIds);
      const ordered = [...passing.filter((c) => own.has(c.partId ?? -1)), ...passing.filter((c) => !own.has(c.partId ?? -1))];
      const shown = ordered.slice(0, 5).map((c) => `${c.mpn}${own.has(c.partId ?? -1) ? ' (listed alternate)' : ''}`);
      lines.push(`${role}: ${shown.length ? shown.join(', ') : 'no catalogue part passes this design now'}`);
    }
    return lines;
  } catch (err) {
    if (err instanceof ServiceError) return [`the design could not be matched now (${err.message})`];
    throw err;
  }
}

function alertMessage(a: { designName: string; detail: string; alternates: string[]; link: string }): MailMessage {
  const lines = [
    `A part used by the design "${a.designName}" has changed.`,
    a.detail,
    a.alternates.length ? `Parts that pass this design now: ${a.alternates.join('; ')}.` : 'No passing alternates could be listed.',
    'The alert stays on the design, its shortlist and the home page until someone acknowledges it.',
  ];
  const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
  return {
    subject: `Stallpoint alert: ${a.designName}`,
    text: `${lines.join('\n\n')}\n\n${a.link}\n\nStallpoint\n`,
    html: `<!doctype html><html lang="en"><body style="font-family: sans-serif; color: #2a2c2e; background: #f7f2e8; padding: 16px">
<p style="font-weight: 600; font-size: 18px">Stallpoint</p>
${lines.map((l) => `<p>${esc(l)}</p>`).join('\n')}
<p><a href="${esc(a.link)}" style="color: #844420">Open the design</a></p></body></html>`,
  };
}

/**
 * Mails every unsent alert once. Safe to run on several servers at the same time: each alert is claimed
 * under its row lock, mailed, and marked sent in the same transaction; a mail failure rolls the claim back.
 * Returns how many alerts this run mailed.
 */
export async function processPendingAlerts(k: Knex = db()): Promise<number> {
  let sent = 0;
  for (const id of await unsentAlertIds(k, BATCH)) {
    const mailed = await k.transaction(async (trx) => {
      const alert = await lockAlert(trx, id);
      if (!alert || alert.sent_at) return false;
      const design = await findDesignRow(trx, alert.design_id);
      if (!design) return false;
      const alternates = await passingAlternates(trx, alert.design_id, alert.part_id);
      const base = appConfig().publicUrl ?? '';
      const message = alertMessage({ designName: design.name, detail: alert.detail, alternates, link: `${base}/designs/${design.id}` });
      for (const person of await alertRecipients(trx, design.owner_id)) await sendMail(person.email, message);
      await markAlertSent(trx, id, new Date());
      return true;
    });
    if (mailed) sent += 1;
  }
  return sent;
}

export async function openAlertsOfDesigns(designIds: number[], limit = 20): Promise<{ items: OpenAlert[]; total: number }> {
  return listOpenAlerts(db(), { designIds, limit });
}

/** Open alerts for the home page: a designer's own designs, or all (buyers, librarians, admins). */
export async function openAlertsFor(user: SessionUser, limit = 10): Promise<{ items: OpenAlert[]; total: number }> {
  const wide = user.roles.some((r) => r === 'buyer' || r === 'admin' || r === 'librarian');
  return listOpenAlerts(db(), { ownerId: wide ? undefined : user.id, limit });
}

/** Records who acknowledged the alert and when, in the row and the audit trail; 409 when already acknowledged. */
export async function acknowledgeAlert(user: SessionUser, id: number): Promise<{ id: number; acknowledgedAt: string }> {
  return db().transaction(async (trx) => {
    const alert = await findAlert(trx, id);
    if (!alert) throw notFound('The alert');
    const at = new Date();
    if (!(await acknowledgeAlertRow(trx, id, user.id, at)))
      throw new ServiceError(409, 'This alert has already been acknowledged.', [{ path: 'id', message: 'already acknowledged' }]);
    await insertAuditEvent(trx, {
      actorUserId: user.id,
      action: 'design.alert_acknowledged',
      entityType: 'design',
      entityId: alert.design_id,
      before: { alertId: id, acknowledgedAt: null },
      after: { alertId: id, kind: alert.kind, partId: alert.part_id, acknowledgedBy: user.id, acknowledgedAt: at.toISOString() },
      note: alert.detail.slice(0, 500),
    });
    return { id, acknowledgedAt: at.toISOString() };
  });
}

/**
 * Tells a proposer their part was rejected, and why.
 * PENDING: the mail module (src/server/mail, issue 4) has not landed yet; this is the one call site
 * to wire to it. Until then the notice is only written to the server log.
 */
import type { Part } from '../../lib/domain/parts.ts';
import type { PersonRef } from '../repos/audit.ts';
import type { SessionUser } from '../auth/types.ts';

export interface RejectionNotice {
  to: PersonRef;
  part: Part;
  reason: string;
  reviewer: SessionUser;
}

export function rejectionText(n: RejectionNotice): { subject: string; text: string } {
  return {
    subject: `Stallpoint: ${n.part.manufacturer} ${n.part.mpn} was not accepted`,
    text:
      `Hello ${n.to.name},\n\n${n.reviewer.name} reviewed the part you proposed, ${n.part.manufacturer} ${n.part.mpn}, ` +
      `and did not accept it:\n\n  ${n.reason}\n\nYou can revise the part and propose it again from its page (part ${n.part.id}).\n`,
  };
}

export async function sendRejectionNotice(n: RejectionNotice): Promise<void> {
  const { subject } = rejectionText(n);
  console.info(`[mail pending] would send "${subject}" to ${n.to.email}`);
}

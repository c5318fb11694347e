/** Tells a proposer their part was rejected, and why, through the app's mail module. */
import type { Part } from '../../lib/domain/parts.ts';
import type { PersonRef } from '../repos/audit.ts';
import type { SessionUser } from '../auth/types.ts';
import type { MailMessage } from '../mail/messages.ts';
import { sendMail } from '../mail/send.ts';

export interface RejectionNotice {
  to: PersonRef;
  part: Part;
  reason: string;
  reviewer: SessionUser;
  /** Absolute address of the part's page. */
  link: string;
}

const escapeHtml = (s: string): string => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

export function rejectionMessage(n: RejectionNotice): MailMessage {
  const name = `${n.part.manufacturer} ${n.part.mpn}`;
  const lines = [
    `Hello ${n.to.name},`,
    `${n.reviewer.name} reviewed the part you proposed, ${name}, and did not accept it. The reason given:`,
    n.reason,
    'You can revise the part and propose it again from its page:',
  ];
  return {
    subject: `Stallpoint: ${name} was not accepted`,
    text: `${lines.join('\n\n')}\n\n${n.link}\n\nStallpoint\n`,
    html: `<!doctype html><html lang="en"><body>${lines.map((l) => `<p>${escapeHtml(l)}</p>`).join('')}<p><a href="${escapeHtml(n.link)}">${escapeHtml(n.link)}</a></p></body></html>`,
  };
}

/** The decision is already committed; a mail failure is logged, never turned into a failed review. */
export async function sendRejectionNotice(n: RejectionNotice): Promise<void> {
  try {
    await sendMail(n.to.email, rejectionMessage(n));
  } catch (err) {
    console.error(
      `[stallpoint] could not send the rejection notice for part ${n.part.id}: ${err instanceof Error ? err.message : String(err)}`,
    );
  }
}

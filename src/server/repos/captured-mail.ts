/** The local SMTP sink's store (table captured_mail): written by scripts/stack/services.ts, read by /mail and tests. */
import type { Db } from '../db.ts';

export interface CapturedMailRow {
  id: number;
  received_at: Date;
  envelope_from: string;
  envelope_to: string;
  subject: string;
  text_body: string | null;
  html_body: string | null;
  /** JSON [{filename, contentType, text}]; null: no attachment. */
  attachments_json?: string | null;
  message_id: string | null;
  size_bytes: number;
}

export interface CapturedMail {
  id: number;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
  /** Attachments as the sink stored them: name, type and the content as UTF-8 text. */
  attachments: { filename: string; contentType: string; text: string }[];
}

export type NewCapturedMail = Omit<CapturedMailRow, 'id'>;

export async function insertCapturedMail(db: Db, mail: NewCapturedMail): Promise<number> {
  const [id] = await db('captured_mail').insert(mail);
  return Number(id);
}

function toCaptured(row: CapturedMailRow): CapturedMail {
  return {
    id: row.id,
    receivedAt: new Date(row.received_at).toISOString(),
    from: row.envelope_from,
    to: row.envelope_to.split(',').filter(Boolean),
    subject: row.subject,
    text: row.text_body ?? '',
    html: row.html_body ?? '',
    attachments: row.attachments_json ? JSON.parse(row.attachments_json) : [],
  };
}

export async function listCapturedMail(db: Db, limit = 100): Promise<CapturedMail[]> {
  const rows: CapturedMailRow[] = await db<CapturedMailRow>('captured_mail').orderBy('id', 'desc').limit(limit);
  return rows.map(toCaptured);
}

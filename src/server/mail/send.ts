/** Sends e-mail through nodemailer's SMTP transport, configured from the environment (or a given MailConfig). */
import nodemailer, { type Transporter } from 'nodemailer';
import { mailConfigFromEnv, type MailConfig } from './config.ts';
import type { MailMessage } from './messages.ts';

const transporters = new Map<string, Transporter>();

function transport(config: MailConfig): Transporter {
  const key = JSON.stringify(config);
  let t = transporters.get(key);
  if (!t) {
    t = nodemailer.createTransport({
      host: config.host,
      port: config.port,
      secure: config.secure,
      auth: config.user ? { user: config.user, pass: config.password ?? '' } : undefined,
      connectionTimeout: 10_000,
      greetingTimeout: 10_000,
      socketTimeout: 30_000,
    });
    transporters.set(key, t);
  }
  return t;
}

export interface SendOptions {
  /** SMTP settings; the process's configuration when left out. */
  config?: MailConfig;
  /** A stable Message-ID (outbox mail: the same on every retry, so a receiver can drop a repeat). */
  messageId?: string;
}

export async function sendMail(to: string, message: MailMessage, options: SendOptions = {}): Promise<void> {
  const config = options.config ?? mailConfigFromEnv();
  await transport(config).sendMail({
    from: config.from,
    to,
    subject: message.subject,
    text: message.text,
    html: message.html,
    ...(options.messageId ? { messageId: options.messageId } : {}),
    attachments: message.attachments?.map((a) => ({ filename: a.filename, contentType: a.contentType, content: a.content })),
  });
}

/** For messages whose sending must not change how long the request takes (password reset). */
export function sendMailInBackground(to: string, message: MailMessage): void {
  sendMail(to, message).catch((err: unknown) => {
    console.error(`[stallpoint] could not send "${message.subject}": ${err instanceof Error ? err.message : String(err)}`);
  });
}

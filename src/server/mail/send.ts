/** Sends e-mail through nodemailer's SMTP transport, configured from the environment. */
import nodemailer, { type Transporter } from 'nodemailer';
import { mailConfigFromEnv } from './config.ts';
import type { MailMessage } from './messages.ts';

let transporter: Transporter | null = null;
let transporterKey = '';

function transport(): Transporter {
  const config = mailConfigFromEnv();
  const key = JSON.stringify(config);
  if (!transporter || key !== transporterKey) {
    transporter = nodemailer.createTransport({
      host: config.host,
      port: config.port,
      secure: config.secure,
      auth: config.user ? { user: config.user, pass: config.password ?? '' } : undefined,
      connectionTimeout: 10_000,
      greetingTimeout: 10_000,
    });
    transporterKey = key;
  }
  return transporter;
}

export async function sendMail(to: string, message: MailMessage): Promise<void> {
  await transport().sendMail({
    from: mailConfigFromEnv().from,
    to,
    subject: message.subject,
    text: message.text,
    html: message.html,
    attachments: message.attachments?.map((a) => ({ filename: a.filename, contentType: a.contentType, content: a.content })),
  });
}

/** For messages whose sending must not change how long the request takes (password reset). */
export function sendMailInBackground(to: string, message: MailMessage): void {
  sendMail(to, message).catch((err: unknown) => {
    console.error(`[stallpoint] could not send "${message.subject}": ${err instanceof Error ? err.message : String(err)}`);
  });
}

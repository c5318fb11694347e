/**
 * The e-mail Stallpoint sends: plain text and simple HTML, the product name, the link written out in
 * full, no images, no tracking pixels, no link rewriting.
 */
export interface MailAttachment {
  filename: string;
  contentType: string;
  content: string;
}

export interface MailMessage {
  subject: string;
  text: string;
  html: string;
  attachments?: MailAttachment[];
}

function escapeHtml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

function html(paragraphs: string[], link: string, linkLabel: string): string {
  const body = paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n');
  return `<!doctype html>
<html lang="en"><body style="font-family: sans-serif; color: #2a2c2e; background: #f7f2e8; padding: 16px">
<p style="font-weight: 600; font-size: 18px">Stallpoint</p>
${body}
<p><a href="${escapeHtml(link)}" style="color: #844420">${escapeHtml(linkLabel)}</a></p>
<p style="font-size: 13px; color: #55595e">If the button does not work, copy this address into your browser:<br>${escapeHtml(link)}</p>
</body></html>`;
}

export function inviteMessage(input: { name: string; invitedBy: string; link: string; validHours: number }): MailMessage {
  const lines = [
    `Hello ${input.name},`,
    `${input.invitedBy} has invited you to Stallpoint, the team's tool for motor-drive parts and worst-case checks.`,
    `Choose your password with the link below. It works once and for ${input.validHours} hours.`,
  ];
  return {
    subject: 'Your invitation to Stallpoint',
    text: `${lines.join('\n\n')}\n\n${input.link}\n\nIf you did not expect this, you can ignore this message.\n\nStallpoint\n`,
    html: html([...lines, 'If you did not expect this, you can ignore this message.'], input.link, 'Choose your password'),
  };
}

export function resetMessage(input: { name: string; link: string; validMinutes: number }): MailMessage {
  const lines = [
    `Hello ${input.name},`,
    'Someone asked to reset the password of your Stallpoint account.',
    `Choose a new password with the link below. It works once and for ${input.validMinutes} minutes.`,
  ];
  return {
    subject: 'Reset your Stallpoint password',
    text: `${lines.join('\n\n')}\n\n${input.link}\n\nIf it was not you, ignore this message: your password stays as it is.\n\nStallpoint\n`,
    html: html([...lines, 'If it was not you, ignore this message: your password stays as it is.'], input.link, 'Choose a new password'),
  };
}

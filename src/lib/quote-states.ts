/** How a request for quotation's state is shown: words and an icon, never colour alone. */
export type QuoteStateName = 'sent' | 'answered' | 'closed';

export const QUOTE_STATE_LABELS: Record<QuoteStateName, { icon: string; words: string; tone: 'warn' | 'ok' | 'soft' }> = {
  sent: { icon: '✉', words: 'Sent, awaiting the answer', tone: 'warn' },
  answered: { icon: '✓', words: 'Answered: prices usable on the shortlist', tone: 'ok' },
  closed: { icon: '■', words: 'Closed', tone: 'soft' },
};

/** How the request's e-mail stands (the outbox): words and an icon, never colour alone. */
export const QUOTE_MAIL_LABELS: Record<'pending' | 'delivered' | 'failed', { icon: string; words: string }> = {
  pending: { icon: '⧖', words: 'Mail pending: recorded and queued, not yet taken by the mail server' },
  delivered: { icon: '✓', words: 'Mail delivered to the mail server' },
  failed: { icon: '✗', words: 'Mail not delivered: the mail server refused it on every try' },
};

/** How a request for quotation's state is shown: words and an icon, never colour alone. */
export type QuoteStateName = 'sent' | 'answered' | 'closed';

export const QUOTE_STATE_LABELS: Record<QuoteStateName, { icon: string; words: string; tone: 'warn' | 'ok' | 'soft' }> = {
  sent: { icon: '✉', words: 'Sent, awaiting the answer', tone: 'warn' },
  answered: { icon: '✓', words: 'Answered: prices usable on the shortlist', tone: 'ok' },
  closed: { icon: '■', words: 'Closed', tone: 'soft' },
};

/** Review and lifecycle states as words with icons (never colour alone). */
import type { Lifecycle, ReviewStatus } from '../../lib/domain/parts.ts';

const REVIEW: Record<ReviewStatus, { icon: string; text: string; cls: string }> = {
  approved: { icon: '✓', text: 'Approved', cls: 'border-ok text-ok' },
  pending: { icon: '…', text: 'Pending review', cls: 'border-copper text-copper-deep' },
  draft: { icon: '✎', text: 'Draft', cls: '' },
  rejected: { icon: '✕', text: 'Rejected', cls: 'border-bad text-bad' },
};
const LIFE: Record<Lifecycle, { icon: string; text: string }> = {
  active: { icon: '●', text: 'Active' },
  nrnd: { icon: '◒', text: 'NRND' },
  'last-buy': { icon: '◔', text: 'Last buy' },
  obsolete: { icon: '○', text: 'Obsolete' },
};

export function StatusBadges({ review, lifecycle }: { review?: ReviewStatus; lifecycle?: Lifecycle }) {
  return (
    <span className="inline-flex flex-wrap gap-1">
      {lifecycle && (
        <span className={`tag ${lifecycle === 'active' ? '' : 'border-warn text-warn'}`}>
          <span aria-hidden="true">{LIFE[lifecycle].icon}</span>
          {LIFE[lifecycle].text}
        </span>
      )}
      {review && (
        <span className={`tag ${REVIEW[review].cls}`} data-review={review}>
          <span aria-hidden="true">{REVIEW[review].icon}</span>
          {REVIEW[review].text}
        </span>
      )}
    </span>
  );
}

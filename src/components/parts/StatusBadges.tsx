/** Review and lifecycle states as words with icons (never colour alone). */
import type { Lifecycle, ReviewStatus } from '../../lib/domain/parts.ts';
import { LIFECYCLE_LABELS, REVIEW_LABELS } from '../../lib/labels.ts';

const REVIEW_CLASS: Record<ReviewStatus, string> = {
  approved: 'border-ok text-ok',
  pending: 'border-copper text-copper-deep',
  draft: '',
  rejected: 'border-bad text-bad',
};
const REVIEW = Object.fromEntries(
  Object.entries(REVIEW_LABELS).map(([k, l]) => [k, { icon: l.icon, text: l.short, cls: REVIEW_CLASS[k as ReviewStatus] }]),
) as Record<ReviewStatus, { icon: string; text: string; cls: string }>;
const LIFE = Object.fromEntries(Object.entries(LIFECYCLE_LABELS).map(([k, l]) => [k, { icon: l.icon, text: l.short }])) as Record<
  Lifecycle,
  { icon: string; text: string }
>;

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

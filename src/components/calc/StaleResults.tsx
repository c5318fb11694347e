import type { ReactNode } from 'react';

/**
 * Results of a calculator. While the current inputs are refused, the results of the last accepted inputs stay
 * in view greyed out, hidden from assistive technology, with a note that says whose results they are.
 */
export default function StaleResults({
  stale,
  testId,
  staleTestId,
  children,
}: {
  stale: boolean;
  testId: string;
  staleTestId: string;
  children: ReactNode;
}) {
  return (
    <>
      <div className={stale ? 'opacity-40' : undefined} aria-hidden={stale ? true : undefined} data-testid={testId}>
        {children}
      </div>
      {stale ? (
        <p className="text-sm text-warn mt-2" role="status" data-testid={staleTestId}>
          ! These results are for the last inputs that were accepted; correct the marked fields to update them.
        </p>
      ) : null}
    </>
  );
}

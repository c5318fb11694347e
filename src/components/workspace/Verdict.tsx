import type { Verdict as V } from '../../lib/checks.ts';

const LOOK: Record<V, { icon: string; word: string; cls: string }> = {
  pass: { icon: '✓', word: 'Pass', cls: 'text-ok bg-ok-wash border-ok' },
  marginal: { icon: '!', word: 'Marginal', cls: 'text-warn bg-warn-wash border-warn' },
  fail: { icon: '✕', word: 'Fail', cls: 'text-bad bg-bad-wash border-bad' },
};

/** A verdict as an icon and a word (never colour alone). */
export default function Verdict({ verdict }: { verdict: V }) {
  const l = LOOK[verdict];
  return (
    <span className={`inline-flex items-center gap-1 px-1.5 rounded border text-xs font-semibold ${l.cls}`} data-verdict={verdict}>
      <span aria-hidden="true">{l.icon}</span>
      {l.word}
    </span>
  );
}

export function CheckMark({ ok, severity }: { ok: boolean; severity?: 'hard' | 'margin' }) {
  if (ok)
    return (
      <span className="text-ok" title="holds">
        ✓<span className="sr-only"> holds</span>
      </span>
    );
  return severity === 'margin' ? (
    <span className="text-warn" title="inside the margin">
      !<span className="sr-only"> inside the margin</span>
    </span>
  ) : (
    <span className="text-bad" title="fails">
      ✕<span className="sr-only"> fails</span>
    </span>
  );
}

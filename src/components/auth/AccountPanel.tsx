/** The account page's actions: change the password, sign out on every device. */
import { useState, type FormEvent, type ReactNode } from 'react';
import { callJson, issueFor, type FieldIssue } from './json-call.ts';
import { Field, StatusLine, type Tone } from './FormParts.tsx';
import { useHydrated } from './use-hydrated.ts';

interface Props {
  minChars: number;
  maxChars: number;
}

function ChangePassword({ minChars, maxChars }: Props): ReactNode {
  const [current, setCurrent] = useState('');
  const [next, setNext] = useState('');
  const [status, setStatus] = useState<{ tone: Tone; text: string } | null>(null);
  const [issues, setIssues] = useState<FieldIssue[]>([]);
  const hydrated = useHydrated();

  async function submit(e: FormEvent): Promise<void> {
    e.preventDefault();
    const local: FieldIssue[] = [];
    if (!current) local.push({ path: 'currentPassword', message: 'Enter your current password.' });
    if ([...next].length < minChars) local.push({ path: 'newPassword', message: `Use at least ${minChars} characters.` });
    setIssues(local);
    if (local.length) return;
    setStatus({ tone: 'busy', text: 'Saving…' });
    const res = await callJson('POST', '/api/auth/password', { currentPassword: current, newPassword: next });
    if (res.ok) {
      setCurrent('');
      setNext('');
      setStatus({ tone: 'ok', text: 'Password changed. Every other session has ended; this browser stays signed in.' });
    } else {
      setIssues(res.issues);
      setStatus({ tone: 'bad', text: res.error });
    }
  }

  return (
    <form onSubmit={submit} noValidate method="post" className="card p-4 flex flex-col gap-3" aria-labelledby="h-password">
      <h2 id="h-password" className="text-lg">
        Change password
      </h2>
      <Field
        readOnly={!hydrated}
        id="currentPassword"
        label="Current password"
        type="password"
        value={current}
        onChange={setCurrent}
        autoComplete="current-password"
        error={issueFor(issues, 'currentPassword')}
      />
      <Field
        readOnly={!hydrated}
        id="newPassword"
        label="New password"
        type="password"
        value={next}
        onChange={setNext}
        autoComplete="new-password"
        hint={`${minChars} to ${maxChars} characters; very common passwords are refused.`}
        error={issueFor(issues, 'newPassword')}
      />
      {status && <StatusLine tone={status.tone}>{status.text}</StatusLine>}
      <div>
        <button type="submit" className="btn" disabled={status?.tone === 'busy' || !hydrated}>
          Change password
        </button>
      </div>
    </form>
  );
}

function SignOutEverywhere(): ReactNode {
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const hydrated = useHydrated();
  async function run(): Promise<void> {
    setBusy(true);
    const res = await callJson('POST', '/api/auth/signout-everywhere', {});
    if (res.ok) window.location.assign('/signin?signedOut=everywhere');
    else {
      setBusy(false);
      setError(res.error);
    }
  }
  return (
    <section className="card p-4 flex flex-col gap-3" aria-labelledby="h-everywhere">
      <h2 id="h-everywhere" className="text-lg">
        Sign out everywhere
      </h2>
      <p className="text-sm text-ink-soft">Ends every session of yours, on this and every other device. You will sign in again here.</p>
      {error && <StatusLine tone="bad">{error}</StatusLine>}
      <div>
        <button type="button" className="btn btn-quiet" onClick={run} disabled={busy || !hydrated}>
          {busy ? 'Signing out…' : 'Sign out everywhere'}
        </button>
      </div>
    </section>
  );
}

export default function AccountPanel(props: Props): ReactNode {
  return (
    <div className="grid gap-4 md:grid-cols-2">
      <ChangePassword {...props} />
      <SignOutEverywhere />
    </div>
  );
}

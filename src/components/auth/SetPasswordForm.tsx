/** Chooses a password from an e-mailed link: an invitation (then signed in) or a reset (then sign in). */
import { useState, type FormEvent, type ReactNode } from 'react';
import { callJson, issueFor, type FieldIssue } from './json-call.ts';
import { Field, StatusLine } from './FormParts.tsx';
import { useHydrated } from './use-hydrated.ts';

interface Props {
  mode: 'invite' | 'reset';
  token: string;
  email: string;
  minChars: number;
  maxChars: number;
}

export default function SetPasswordForm({ mode, token, email, minChars, maxChars }: Props): ReactNode {
  const [password, setPassword] = useState('');
  const [repeat, setRepeat] = useState('');
  const [busy, setBusy] = useState(false);
  const hydrated = useHydrated();
  const [done, setDone] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [issues, setIssues] = useState<FieldIssue[]>([]);

  function localIssues(): FieldIssue[] {
    const out: FieldIssue[] = [];
    const chars = [...password].length;
    if (chars < minChars) out.push({ path: 'password', message: `Use at least ${minChars} characters (this has ${chars}).` });
    if (chars > maxChars) out.push({ path: 'password', message: `Use at most ${maxChars} characters.` });
    if (repeat !== password) out.push({ path: 'repeat', message: 'The two passwords differ.' });
    return out;
  }

  async function submit(e: FormEvent): Promise<void> {
    e.preventDefault();
    setError(null);
    const local = localIssues();
    setIssues(local);
    if (local.length) return;
    setBusy(true);
    const res = await callJson('POST', mode === 'invite' ? '/api/auth/invite-accept' : '/api/auth/reset', { token, password });
    setBusy(false);
    if (!res.ok) {
      setIssues(res.issues);
      setError(res.error);
      return;
    }
    if (mode === 'invite') window.location.assign('/');
    else setDone(true);
  }

  if (done) {
    return (
      <StatusLine tone="ok">
        Your password is changed and every earlier session has ended. <a href="/signin">Sign in</a> with the new one.
      </StatusLine>
    );
  }
  return (
    <form onSubmit={submit} noValidate method="post" className="flex flex-col gap-3" aria-label="Choose a password">
      <input type="email" name="username" value={email} autoComplete="username" readOnly hidden />
      <Field
        readOnly={!hydrated}
        id="password"
        label="New password"
        type="password"
        value={password}
        onChange={setPassword}
        autoComplete="new-password"
        autoFocus
        hint={`${minChars} to ${maxChars} characters; a phrase of several words works well. Very common passwords are refused.`}
        error={issueFor(issues, 'password')}
      />
      <Field
        readOnly={!hydrated}
        id="repeat"
        label="The same password again"
        type="password"
        value={repeat}
        onChange={setRepeat}
        autoComplete="new-password"
        error={issueFor(issues, 'repeat')}
      />
      {error && <StatusLine tone="bad">{error}</StatusLine>}
      {busy && <StatusLine tone="busy">Saving…</StatusLine>}
      <div>
        <button type="submit" className="btn" disabled={busy || !hydrated}>
          {mode === 'invite' ? 'Set password and sign in' : 'Set new password'}
        </button>
      </div>
    </form>
  );
}

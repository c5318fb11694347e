/** Sign-in island: posts to /api/auth/signin, then goes where the person was heading. */
import { useState, type FormEvent, type ReactNode } from 'react';
import { callJson, issueFor, safeNext, type FieldIssue } from './auth/json-call.ts';
import { Field, StatusLine } from './auth/FormParts.tsx';
import { useHydrated } from './auth/use-hydrated.ts';

interface Props {
  next: string;
  notice?: string | null;
}

export default function SignInForm({ next, notice = null }: Props): ReactNode {
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [busy, setBusy] = useState(false);
  const hydrated = useHydrated();
  const [error, setError] = useState<string | null>(null);
  const [issues, setIssues] = useState<FieldIssue[]>([]);

  async function submit(e: FormEvent): Promise<void> {
    e.preventDefault();
    const local: FieldIssue[] = [];
    if (!email.trim()) local.push({ path: 'email', message: 'Enter your e-mail address.' });
    if (!password) local.push({ path: 'password', message: 'Enter your password.' });
    setIssues(local);
    setError(null);
    if (local.length) return;
    setBusy(true);
    const res = await callJson<{ user: { name: string } }>('POST', '/api/auth/signin', { email, password });
    if (res.ok) {
      window.location.assign(safeNext(next));
      return;
    }
    setBusy(false);
    setIssues(res.issues);
    setError(res.error);
  }

  return (
    <form onSubmit={submit} noValidate method="post" className="flex flex-col gap-3" aria-label="Sign in" data-testid="signin-form">
      {notice && !error && <StatusLine tone="ok">{notice}</StatusLine>}
      <Field
        readOnly={!hydrated}
        id="email"
        label="E-mail address"
        type="email"
        value={email}
        onChange={setEmail}
        autoComplete="username"
        autoFocus
        error={issueFor(issues, 'email')}
      />
      <Field
        readOnly={!hydrated}
        id="password"
        label="Password"
        type="password"
        value={password}
        onChange={setPassword}
        autoComplete="current-password"
        error={issueFor(issues, 'password')}
      />
      {error && <StatusLine tone="bad">{error}</StatusLine>}
      {busy && <StatusLine tone="busy">Signing in…</StatusLine>}
      <div className="flex items-center gap-4">
        <button type="submit" className="btn" disabled={busy || !hydrated}>
          Sign in
        </button>
        <a href="/reset" className="text-sm">
          Forgot your password?
        </a>
      </div>
    </form>
  );
}

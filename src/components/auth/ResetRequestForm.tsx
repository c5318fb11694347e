/** Asks for a reset link; the answer is the same whether or not the address has an account. */
import { useState, type FormEvent, type ReactNode } from 'react';
import { callJson, issueFor, type FieldIssue } from './json-call.ts';
import { Field, StatusLine } from './FormParts.tsx';
import { useHydrated } from './use-hydrated.ts';

export default function ResetRequestForm(): ReactNode {
  const [email, setEmail] = useState('');
  const [busy, setBusy] = useState(false);
  const hydrated = useHydrated();
  const [done, setDone] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [issues, setIssues] = useState<FieldIssue[]>([]);

  async function submit(e: FormEvent): Promise<void> {
    e.preventDefault();
    setError(null);
    if (!email.trim()) {
      setIssues([{ path: 'email', message: 'Enter your e-mail address.' }]);
      return;
    }
    setIssues([]);
    setBusy(true);
    const res = await callJson<{ message: string }>('POST', '/api/auth/reset-request', { email });
    setBusy(false);
    if (res.ok) setDone(res.data.message);
    else {
      setIssues(res.issues);
      setError(res.error);
    }
  }

  if (done) return <StatusLine tone="ok">{done}</StatusLine>;
  return (
    <form onSubmit={submit} noValidate method="post" className="flex flex-col gap-3" aria-label="Ask for a reset link">
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
      {error && <StatusLine tone="bad">{error}</StatusLine>}
      {busy && <StatusLine tone="busy">Sending…</StatusLine>}
      <div>
        <button type="submit" className="btn" disabled={busy || !hydrated}>
          Send me a reset link
        </button>
      </div>
    </form>
  );
}

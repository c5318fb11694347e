/** Invites a person by e-mail with their roles; the mail carries a single-use 72-hour link. */
import { useState, type FormEvent, type ReactNode } from 'react';
import { callJson, issueFor, type FieldIssue } from '../auth/json-call.ts';
import { Field, StatusLine, type Tone } from '../auth/FormParts.tsx';
import { useHydrated } from '../auth/use-hydrated.ts';
import { ROLE_NAMES, type PersonView, type RoleName } from './people-model.ts';

export default function InviteForm({ onInvited }: { onInvited(person: PersonView): void }): ReactNode {
  const [email, setEmail] = useState('');
  const [name, setName] = useState('');
  const [roles, setRoles] = useState<RoleName[]>(['designer']);
  const [issues, setIssues] = useState<FieldIssue[]>([]);
  const [status, setStatus] = useState<{ tone: Tone; text: string } | null>(null);
  const hydrated = useHydrated();

  function toggle(role: RoleName): void {
    setRoles((rs) => (rs.includes(role) ? rs.filter((r) => r !== role) : [...rs, role]));
  }

  async function submit(e: FormEvent): Promise<void> {
    e.preventDefault();
    const local: FieldIssue[] = [];
    if (!email.trim()) local.push({ path: 'email', message: 'Enter the e-mail address.' });
    if (!name.trim()) local.push({ path: 'name', message: 'Enter the name.' });
    if (!roles.length) local.push({ path: 'roles', message: 'Choose at least one role.' });
    setIssues(local);
    if (local.length) return;
    setStatus({ tone: 'busy', text: 'Sending the invitation…' });
    const res = await callJson<{ person: PersonView; mailSent: boolean }>('POST', '/api/people', { email, name, roles });
    if (!res.ok) {
      setIssues(res.issues);
      setStatus({ tone: 'bad', text: res.error });
      return;
    }
    onInvited(res.data.person);
    setEmail('');
    setName('');
    setStatus(
      res.data.mailSent
        ? { tone: 'ok', text: `Invitation sent to ${res.data.person.email}.` }
        : {
            tone: 'bad',
            text: `${res.data.person.email} is on the list, but the mail server refused the message. Use “Resend invite” later.`,
          },
    );
  }

  const rolesError = issueFor(issues, 'roles');
  return (
    <form
      onSubmit={submit}
      noValidate
      method="post"
      className="card p-4 flex flex-col gap-3"
      aria-labelledby="h-invite"
      data-testid="invite-form"
    >
      <h2 id="h-invite" className="text-lg">
        Invite someone
      </h2>
      <div className="grid gap-3 md:grid-cols-2">
        <Field
          readOnly={!hydrated}
          id="invite-email"
          label="E-mail address"
          type="email"
          value={email}
          onChange={setEmail}
          error={issueFor(issues, 'email')}
        />
        <Field readOnly={!hydrated} id="invite-name" label="Name" value={name} onChange={setName} error={issueFor(issues, 'name')} />
      </div>
      <fieldset className="flex flex-wrap gap-4 text-sm" aria-describedby={rolesError ? 'invite-roles-error' : undefined}>
        <legend className="text-ink-soft mb-1">Roles</legend>
        {ROLE_NAMES.map((role) => (
          <label key={role} className="inline-flex items-center gap-1">
            <input
              type="checkbox"
              checked={roles.includes(role)}
              onChange={() => toggle(role)}
              name={`invite-role-${role}`}
              disabled={!hydrated}
            />
            {role}
          </label>
        ))}
        {rolesError && (
          <span id="invite-roles-error" className="field-error w-full">
            <span aria-hidden="true">✕ </span>
            {rolesError}
          </span>
        )}
      </fieldset>
      {status && <StatusLine tone={status.tone}>{status.text}</StatusLine>}
      <div>
        <button type="submit" className="btn" disabled={status?.tone === 'busy' || !hydrated}>
          Send invitation
        </button>
      </div>
    </form>
  );
}

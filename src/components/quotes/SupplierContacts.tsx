/** Buyers add and correct the supplier contacts requests for quotation go to. */
import { useState } from 'react';
import { sendJson, type ApiIssue } from '../api-client.ts';

export interface ContactRow {
  id: number;
  name: string;
  company: string;
  email: string;
}

function ContactForm({ contact }: { contact: ContactRow | null }) {
  const [name, setName] = useState(contact?.name ?? '');
  const [company, setCompany] = useState(contact?.company ?? '');
  const [email, setEmail] = useState(contact?.email ?? '');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState('');
  const [issues, setIssues] = useState<ApiIssue[]>([]);

  async function submit(e: React.FormEvent): Promise<void> {
    e.preventDefault();
    setBusy(true);
    const res = contact
      ? await sendJson('PUT', `/api/suppliers/${contact.id}`, { name, company, email })
      : await sendJson('POST', '/api/suppliers', { name, company, email });
    if (res.ok) return window.location.reload();
    setBusy(false);
    setError(res.error);
    setIssues(res.issues);
  }
  const issue = (path: string): string | undefined => issues.find((i) => i.path === path)?.message;
  const field = (label: string, key: string, value: string, set: (v: string) => void, type = 'text') => (
    <label className="field">
      {label}
      <input type={type} value={value} onChange={(e) => set(e.target.value)} name={key} required aria-invalid={!!issue(key)} />
      {issue(key) && (
        <span className="field-error">
          <span aria-hidden="true">✕ </span>
          {issue(key)}
        </span>
      )}
    </label>
  );
  return (
    <form
      onSubmit={submit}
      className="grid gap-2 sm:grid-cols-[1fr_1fr_1fr_auto] items-end text-sm"
      data-testid={contact ? `contact-${contact.id}` : 'contact-new'}
    >
      {field('Name', 'name', name, setName)}
      {field('Company', 'company', company, setCompany)}
      {field('E-mail', 'email', email, setEmail, 'email')}
      <button type="submit" className="btn btn-quiet" disabled={busy}>
        {contact ? 'Save' : 'Add contact'}
      </button>
      {error && (
        <p role="alert" className="field-error sm:col-span-4">
          <span aria-hidden="true">✕ </span>
          {error}
        </p>
      )}
    </form>
  );
}

export default function SupplierContacts({ contacts }: { contacts: ContactRow[] }) {
  return (
    <div className="grid gap-3">
      {contacts.map((c) => (
        <ContactForm key={c.id} contact={c} />
      ))}
      <ContactForm contact={null} />
    </div>
  );
}

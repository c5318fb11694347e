/**
 * The supply data of one part in one form (buyers and librarians): sources with their SKU, currency, MOQ,
 * order multiple, stock, lead time and price breaks. Checked here with the same schema the endpoint uses
 * (PUT /api/parts/:id/sources), so a refusal shows at its field before and after the round trip.
 * Plain inputs and buttons only: everything is reachable with Tab, Enter and Space.
 */
import { useEffect, useRef, useState } from 'react';
import type { PartSource } from '../../lib/domain/parts.ts';
import { sourcesUpdateSchema } from '../../lib/schemas/parts.ts';
import { issuesOf } from '../../lib/schemas/issues.ts';
import { price, whole } from '../../lib/units.ts';
import { sendJson, type ApiIssue } from './api.ts';

interface BreakDraft {
  qty: string;
  unitPrice: string;
}
interface SourceDraft {
  distributor: string;
  sku: string;
  currency: string;
  moq: string;
  orderMultiple: string;
  stockQty: string;
  leadTimeDays: string;
  priceBreaks: BreakDraft[];
}

const draftOf = (s: PartSource): SourceDraft => ({
  distributor: s.distributor,
  sku: s.sku,
  currency: s.currency,
  moq: String(s.moq),
  orderMultiple: String(s.orderMultiple ?? 1),
  stockQty: String(s.stockQty),
  leadTimeDays: String(s.leadTimeDays),
  priceBreaks: s.priceBreaks.map((b) => ({ qty: String(b.qty), unitPrice: String(b.unitPrice) })),
});

/** A typed number, or the text itself when it is not one (the schema then names the field). */
const numberOf = (text: string): unknown => {
  const t = text.trim().replace(',', '.');
  if (t === '') return undefined;
  const n = Number(t);
  return Number.isFinite(n) ? n : t;
};

const bodyOf = (drafts: SourceDraft[], version: number) => ({
  version,
  sources: drafts.map((d) => ({
    distributor: d.distributor,
    sku: d.sku,
    currency: d.currency.trim().toUpperCase(),
    moq: numberOf(d.moq),
    orderMultiple: numberOf(d.orderMultiple),
    stockQty: numberOf(d.stockQty),
    leadTimeDays: numberOf(d.leadTimeDays),
    priceBreaks: d.priceBreaks.map((b) => ({ qty: numberOf(b.qty), unitPrice: numberOf(b.unitPrice) })),
  })),
});

const blankSource = (currency: string): SourceDraft => ({
  distributor: '',
  sku: '',
  currency,
  moq: '1',
  orderMultiple: '1',
  stockQty: '0',
  leadTimeDays: '0',
  priceBreaks: [{ qty: '1', unitPrice: '' }],
});

export interface SupplyEditorProps {
  partId: number;
  version: number;
  sources: PartSource[];
  /** Currencies offered first: the organisation's and those in the rates table; any ISO 4217 code is accepted. */
  currencies: string[];
}

export default function SupplyEditor({ partId, version, sources, currencies }: SupplyEditorProps) {
  const [drafts, setDrafts] = useState<SourceDraft[]>(() => sources.map(draftOf));
  const [issues, setIssues] = useState<ApiIssue[]>([]);
  const [error, setError] = useState('');
  const [busy, setBusy] = useState(false);
  const form = useRef<HTMLFormElement>(null);

  // Once a refusal is shown, each edit re-checks with the shared schema, so a fixed field loses its ✕ at once.
  const shown = issues.length > 0;
  useEffect(() => {
    if (!shown) return;
    const checked = sourcesUpdateSchema.safeParse(bodyOf(drafts, version));
    setIssues(checked.success ? [] : issuesOf(checked.error));
    if (checked.success) setError('');
    // eslint-disable-next-line react-hooks/exhaustive-deps -- only edits re-check; a server refusal stays until the next edit
  }, [drafts]);

  const issue = (path: string): string | undefined => issues.find((i) => i.path === path)?.message;
  /** Moves focus to a field once React has drawn it (after adding a source or a break). */
  const focusLater = (name: string): void => {
    requestAnimationFrame(() => form.current?.querySelector<HTMLInputElement>(`[name="${name}"]`)?.focus());
  };

  const change = (i: number, patch: Partial<SourceDraft>): void => setDrafts((ds) => ds.map((d, k) => (k === i ? { ...d, ...patch } : d)));
  const changeBreak = (i: number, j: number, patch: Partial<BreakDraft>): void =>
    setDrafts((ds) =>
      ds.map((d, k) => (k === i ? { ...d, priceBreaks: d.priceBreaks.map((b, m) => (m === j ? { ...b, ...patch } : b)) } : d)),
    );

  function addSource(): void {
    setDrafts((ds) => [...ds, blankSource(currencies[0] ?? 'EUR')]);
    focusLater(`sources.${drafts.length}.distributor`);
  }
  function removeSource(i: number): void {
    setDrafts((ds) => ds.filter((_, k) => k !== i));
    setIssues([]);
  }
  function addBreak(i: number): void {
    const list = drafts[i].priceBreaks;
    const lastQty = Number(list[list.length - 1]?.qty);
    const next = Number.isFinite(lastQty) && lastQty > 0 ? String(lastQty * 10) : '1';
    setDrafts((ds) => ds.map((d, k) => (k === i ? { ...d, priceBreaks: [...d.priceBreaks, { qty: next, unitPrice: '' }] } : d)));
    focusLater(`sources.${i}.priceBreaks.${list.length}.unitPrice`);
  }
  function removeBreak(i: number, j: number): void {
    setDrafts((ds) => ds.map((d, k) => (k === i ? { ...d, priceBreaks: d.priceBreaks.filter((_, m) => m !== j) } : d)));
    setIssues([]);
  }

  async function submit(e: React.FormEvent): Promise<void> {
    e.preventDefault();
    setError('');
    const body = bodyOf(drafts, version);
    const checked = sourcesUpdateSchema.safeParse(body);
    if (!checked.success) {
      const found = issuesOf(checked.error);
      setIssues(found);
      setError(`Not saved: ${found.length === 1 ? 'one field needs' : `${found.length} fields need`} a fix (marked ✕ below).`);
      focusLater(found[0].path);
      return;
    }
    setBusy(true);
    const res = await sendJson('PUT', `/api/parts/${partId}/sources`, body);
    setBusy(false);
    if (res.ok) return window.location.reload();
    setIssues(res.issues);
    setError(
      res.status === 409
        ? 'Someone saved this part after you opened it. Reload the page to see their change, then make yours again.'
        : res.error,
    );
  }

  const field = (
    name: string,
    label: string,
    value: string,
    onChange: (v: string) => void,
    opts: { wide?: boolean; list?: string; numeric?: boolean } = {},
  ) => (
    <label className={`field ${opts.wide ? 'sm:col-span-2' : ''}`}>
      {label}
      <input
        name={name}
        value={value}
        onChange={(e) => onChange(e.target.value)}
        inputMode={opts.numeric ? 'decimal' : undefined}
        list={opts.list}
        aria-invalid={!!issue(name)}
        aria-describedby={issue(name) ? `${name}-error` : undefined}
      />
      {issue(name) && (
        <span className="field-error" id={`${name}-error`}>
          <span aria-hidden="true">✕ </span>
          {issue(name)}
        </span>
      )}
    </label>
  );

  return (
    <form ref={form} onSubmit={submit} className="grid gap-3 text-sm px-3 pb-3" data-testid="supply-editor" noValidate>
      <datalist id={`currencies-${partId}`}>
        {currencies.map((c) => (
          <option key={c} value={c} />
        ))}
      </datalist>
      {drafts.length === 0 && <p className="text-ink-soft">No source yet. Add one with the button below.</p>}
      {drafts.map((d, i) => {
        const label = d.distributor || d.sku ? `${d.distributor} ${d.sku}`.trim() : `source ${i + 1}`;
        const cur = d.currency.trim().toUpperCase() || '—';
        return (
          <fieldset key={i} className="border border-rule rounded p-2 grid gap-2" data-testid={`supply-source-${i}`}>
            <legend className="px-1 font-semibold">{label}</legend>
            <div className="grid gap-2 sm:grid-cols-4">
              {field(`sources.${i}.distributor`, 'Distributor', d.distributor, (v) => change(i, { distributor: v }), { wide: true })}
              {field(`sources.${i}.sku`, 'SKU', d.sku, (v) => change(i, { sku: v }))}
              {field(`sources.${i}.currency`, 'Currency (ISO 4217)', d.currency, (v) => change(i, { currency: v }), {
                list: `currencies-${partId}`,
              })}
              {field(`sources.${i}.stockQty`, 'Stock (pieces)', d.stockQty, (v) => change(i, { stockQty: v }), { numeric: true })}
              {field(`sources.${i}.moq`, 'MOQ (pieces)', d.moq, (v) => change(i, { moq: v }), { numeric: true })}
              {field(`sources.${i}.orderMultiple`, 'Order multiple (pieces)', d.orderMultiple, (v) => change(i, { orderMultiple: v }), {
                numeric: true,
              })}
              {field(`sources.${i}.leadTimeDays`, 'Lead time (days)', d.leadTimeDays, (v) => change(i, { leadTimeDays: v }), {
                numeric: true,
              })}
            </div>
            <table className="data-table text-sm">
              <caption className="text-left text-ink-soft">Price breaks of {label}: from this quantity, this unit price</caption>
              <thead>
                <tr>
                  <th scope="col">From quantity (pieces)</th>
                  <th scope="col">Unit price ({cur})</th>
                  <th scope="col">Reads as</th>
                  <th scope="col">
                    <span className="sr-only">Remove</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {d.priceBreaks.map((b, j) => {
                  const qtyName = `sources.${i}.priceBreaks.${j}.qty`;
                  const priceName = `sources.${i}.priceBreaks.${j}.unitPrice`;
                  const q = Number(b.qty);
                  const p = Number(b.unitPrice.replace(',', '.'));
                  return (
                    <tr key={j} data-testid={`supply-break-${i}-${j}`}>
                      <td>{field(qtyName, `Break ${j + 1} quantity`, b.qty, (v) => changeBreak(i, j, { qty: v }), { numeric: true })}</td>
                      <td>
                        {field(priceName, `Break ${j + 1} unit price`, b.unitPrice, (v) => changeBreak(i, j, { unitPrice: v }), {
                          numeric: true,
                        })}
                      </td>
                      <td className="num whitespace-nowrap text-ink-soft">
                        {b.qty.trim() && b.unitPrice.trim() && Number.isFinite(q) && Number.isFinite(p)
                          ? `${whole(q)}+ at ${price(p, cur)}`
                          : '—'}
                      </td>
                      <td>
                        <button type="button" className="btn btn-quiet" onClick={() => removeBreak(i, j)}>
                          <span aria-hidden="true">✕ </span>Remove
                          <span className="sr-only">
                            {' '}
                            break {j + 1} of {label}
                          </span>
                        </button>
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
            {issue(`sources.${i}.priceBreaks`) && (
              <p className="field-error">
                <span aria-hidden="true">✕ </span>
                {issue(`sources.${i}.priceBreaks`)}
              </p>
            )}
            <div className="flex flex-wrap gap-2">
              <button type="button" className="btn btn-quiet" onClick={() => addBreak(i)}>
                <span aria-hidden="true">+ </span>Add price break<span className="sr-only"> to {label}</span>
              </button>
              <button type="button" className="btn btn-quiet ml-auto" onClick={() => removeSource(i)}>
                <span aria-hidden="true">✕ </span>Remove source<span className="sr-only"> {label}</span>
              </button>
            </div>
          </fieldset>
        );
      })}
      {issue('sources') && (
        <p className="field-error">
          <span aria-hidden="true">✕ </span>
          {issue('sources')}
        </p>
      )}
      <div className="flex flex-wrap gap-2 items-center">
        <button type="button" className="btn btn-quiet" onClick={addSource}>
          <span aria-hidden="true">+</span> Add source
        </button>
        <button type="submit" className="btn" disabled={busy} data-testid="supply-save">
          {busy ? 'Saving…' : 'Save supply data'}
        </button>
      </div>
      {error && (
        <p role="alert" className="field-error" data-testid="supply-error">
          <span aria-hidden="true">✕ </span>
          {error}
        </p>
      )}
    </form>
  );
}

/**
 * Create or edit a part. The same zod schema as the endpoint checks the form before it is sent, and the
 * server's issues land on the same fields. A stale edit (409) says so and offers a reload.
 */
import { LIFECYCLE_OPTIONS } from '../../lib/labels.ts';
import { useMemo, useState } from 'react';
import type { Part, PartCategory } from '../../lib/domain/parts.ts';
import { partInputSchema, partUpdateSchema } from '../../lib/schemas/parts.ts';
import { CATEGORY_LABELS } from '../../lib/part-summary.ts';
import { openInputSentence } from '../../lib/driver-input.ts';
import { PARAM_FIELDS, RDS_FIELDS, ZTH_PULSE_FIELDS, ZTH_VALUE_FIELD, parseTyped, showTyped, type FormField } from './form-fields.ts';
import { sendJson, type ApiIssue } from './api.ts';

interface Props {
  /** The part being edited (with its version), or null to create one. */
  part: Part | null;
  initialCategory: PartCategory;
  isCurator: boolean;
}

type Text = Record<string, string>;
interface SourceText {
  distributor: string;
  sku: string;
  moq: string;
  leadTimeDays: string;
  stockQty: string;
  currency: string;
  priceBreaks: string;
}

interface ZthText {
  pulse: string;
  unit: 'ms' | 's';
  zth: string;
}

const emptyRds = (): Text => ({ vgsV: '', tjC: '25', idA: '', maxOhm: '', typOhm: '' });
const emptyZth = (): ZthText => ({ pulse: '', unit: 'ms', zth: '' });
/** Pulses under a second are shown in ms, longer ones in s (as datasheet curves are labelled). */
const zthText = (z: { pulseS: number; zthCPerW: number }): ZthText => {
  const unit = z.pulseS < 1 ? 'ms' : 's';
  return { pulse: showTyped(ZTH_PULSE_FIELDS[unit], z.pulseS), unit, zth: showTyped(ZTH_VALUE_FIELD, z.zthCPerW) };
};
const emptySource = (): SourceText => ({
  distributor: '',
  sku: '',
  moq: '1',
  leadTimeDays: '0',
  stockQty: '0',
  currency: 'USD',
  priceBreaks: '',
});

function paramsText(part: Part | null, category: PartCategory): Text {
  const params = (part?.category === category ? part.params : {}) as Record<string, unknown>;
  return Object.fromEntries(
    PARAM_FIELDS[category].map((f) => [
      f.key,
      f.kind === 'boolean'
        ? String(params[f.key] ?? false)
        : showTyped(f, params[f.key] ?? (f.key === 'vgsThTestCurrentA' ? 0.00025 : f.key === 'channels' ? 1 : undefined)),
    ]),
  );
}

export default function PartForm({ part, initialCategory, isCurator }: Props) {
  const editing = part !== null;
  const [category, setCategory] = useState<PartCategory>(part?.category ?? initialCategory);
  const [head, setHead] = useState<Text>({
    manufacturer: part?.manufacturer ?? '',
    mpn: part?.mpn ?? '',
    description: part?.description ?? '',
    package: part?.package ?? '',
    lifecycle: part?.lifecycle ?? 'active',
    lifecycleEffectiveDate: part?.lifecycleEffectiveDate ?? '',
    reviewStatus: editing ? '' : isCurator ? 'approved' : 'pending',
  });
  const [params, setParams] = useState<Text>(() => paramsText(part, category));
  const [rds, setRds] = useState<Text[]>(() =>
    part?.category === 'mosfet'
      ? part.params.rdsOn.map((r) =>
          Object.fromEntries(RDS_FIELDS.map((f) => [f.key, showTyped(f, (r as unknown as Record<string, unknown>)[f.key])])),
        )
      : [emptyRds()],
  );
  const [zth, setZth] = useState<ZthText[]>(() => (part?.category === 'mosfet' ? part.params.zthPoints.map(zthText) : []));
  const [sources, setSources] = useState<SourceText[]>(() =>
    (part?.sources ?? []).map((s) => ({
      distributor: s.distributor,
      sku: s.sku,
      moq: String(s.moq),
      leadTimeDays: String(s.leadTimeDays),
      stockQty: String(s.stockQty),
      currency: s.currency,
      priceBreaks: s.priceBreaks.map((b) => `${b.qty}:${b.unitPrice}`).join('; '),
    })),
  );
  const [issues, setIssues] = useState<ApiIssue[]>([]);
  const [banner, setBanner] = useState<{ kind: 'error' | 'stale'; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  const fields = PARAM_FIELDS[category];
  const issueAt = useMemo(() => new Map(issues.map((i) => [i.path, i.message])), [issues]);

  function build(): Record<string, unknown> {
    const p: Record<string, unknown> = {};
    for (const f of fields) {
      const typed = params[f.key] ?? '';
      if (f.kind === 'select') p[f.key] = typed || undefined;
      else if (f.kind === 'boolean') p[f.key] = typed === 'true';
      else p[f.key] = parseTyped(f, typed);
    }
    if (category === 'mosfet') p.rdsOn = rds.map((r) => Object.fromEntries(RDS_FIELDS.map((f) => [f.key, parseTyped(f, r[f.key] ?? '')])));
    if (category === 'mosfet')
      p.zthPoints = zth.map((z) => ({
        pulseS: parseTyped(ZTH_PULSE_FIELDS[z.unit], z.pulse),
        zthCPerW: parseTyped(ZTH_VALUE_FIELD, z.zth),
      }));
    const body: Record<string, unknown> = {
      category,
      manufacturer: head.manufacturer,
      mpn: head.mpn,
      description: head.description,
      package: head.package,
      lifecycle: head.lifecycle,
      lifecycleEffectiveDate: head.lifecycleEffectiveDate || null,
      params: p,
      sources: sources.map((s) => ({
        distributor: s.distributor,
        sku: s.sku,
        moq: Number(s.moq),
        leadTimeDays: Number(s.leadTimeDays),
        stockQty: Number(s.stockQty),
        currency: s.currency.trim().toUpperCase(),
        priceBreaks: s.priceBreaks
          .split(';')
          .map((x) => x.trim())
          .filter(Boolean)
          .map((x) => {
            const [qty, price] = x.split(':').map((y) => Number(y.trim()));
            return { qty, unitPrice: price };
          }),
      })),
    };
    if (head.reviewStatus) body.reviewStatus = head.reviewStatus;
    if (editing) body.version = part.version;
    return body;
  }

  async function submit(e: React.FormEvent): Promise<void> {
    e.preventDefault();
    setBanner(null);
    const body = build();
    const check = (editing ? partUpdateSchema : partInputSchema).safeParse(body);
    if (!check.success) {
      setIssues(check.error.issues.map((i) => ({ path: i.path.map(String).join('.'), message: i.message })));
      setBanner({ kind: 'error', text: 'Some fields need attention; each one says what is wrong.' });
      return;
    }
    setBusy(true);
    const res = await sendJson<Part>(editing ? 'PUT' : 'POST', editing ? `/api/parts/${part.id}` : '/api/parts', body);
    setBusy(false);
    if (res.ok) {
      window.location.assign(`/parts/${res.data.id}`);
      return;
    }
    setIssues(res.issues);
    setBanner({ kind: res.status === 409 && res.issues.some((i) => i.path === 'version') ? 'stale' : 'error', text: res.error });
  }

  const err = (path: string) => issueAt.get(path);
  const input = (f: FormField, value: string, onChange: (v: string) => void, path: string) => {
    const id = `f-${path.replace(/\./g, '-')}`;
    const message = err(path);
    return (
      <label className="field" htmlFor={id} key={path}>
        <span>
          {f.label}
          {f.unit && <span className="text-ink-faint"> ({f.unit})</span>}
          {f.optional && <span className="text-ink-faint"> · optional</span>}
        </span>
        {f.kind === 'select' || f.kind === 'boolean' ? (
          <select id={id} name={path} value={value} onChange={(e) => onChange(e.target.value)} aria-invalid={!!message}>
            {f.kind === 'boolean' ? (
              <>
                <option value="false">No</option>
                <option value="true">Yes</option>
              </>
            ) : (
              <>
                <option value="">Choose…</option>
                {f.options!.map((o) => (
                  <option key={o.value} value={o.value}>
                    {o.label}
                  </option>
                ))}
              </>
            )}
          </select>
        ) : (
          <input
            id={id}
            name={path}
            inputMode="decimal"
            value={value}
            onChange={(e) => onChange(e.target.value)}
            aria-invalid={!!message}
            aria-describedby={message ? `${id}-err` : undefined}
          />
        )}
        {f.hint && <span className="text-xs text-ink-faint">{f.hint}</span>}
        {message && (
          <span id={`${id}-err`} className="field-error" data-field-error={path}>
            <span aria-hidden="true">✕ </span>
            {message}
          </span>
        )}
      </label>
    );
  };
  const headInput = (key: string, label: string, extra: { optional?: boolean; type?: string } = {}) => (
    <label className="field" htmlFor={`f-${key}`}>
      <span>
        {label}
        {extra.optional && <span className="text-ink-faint"> · optional</span>}
      </span>
      <input
        id={`f-${key}`}
        name={key}
        type={extra.type ?? 'text'}
        value={head[key]}
        onChange={(e) => setHead({ ...head, [key]: e.target.value })}
        aria-invalid={!!err(key)}
      />
      {err(key) && (
        <span className="field-error" data-field-error={key}>
          <span aria-hidden="true">✕ </span>
          {err(key)}
        </span>
      )}
    </label>
  );

  return (
    <form onSubmit={submit} className="grid gap-4" noValidate data-testid="part-form">
      {banner && (
        <div
          role="alert"
          className={`card p-3 ${banner.kind === 'stale' ? 'border-warn text-warn' : 'border-bad text-bad'}`}
          data-testid={banner.kind === 'stale' ? 'stale-warning' : 'form-error'}
        >
          <strong>
            <span aria-hidden="true">{banner.kind === 'stale' ? '⚠ ' : '✕ '}</span>
            {banner.text}
          </strong>
          {banner.kind === 'stale' && (
            <p className="text-sm text-ink">
              Your changes are still in this form. <a href={window.location.pathname}>Reload the current record</a> (your edits here will be
              lost) and apply them again.
            </p>
          )}
        </div>
      )}
      {!isCurator && !editing && (
        <p className="text-sm text-ink-soft">
          <span aria-hidden="true">… </span>You are proposing this part: it enters the catalogue as pending until a librarian reviews it.
        </p>
      )}

      <fieldset className="card p-3 grid gap-3 md:grid-cols-3">
        <legend className="px-1 font-semibold">Part</legend>
        <label className="field">
          Category
          <select
            value={category}
            disabled={editing}
            name="category"
            onChange={(e) => {
              const c = e.target.value as PartCategory;
              setCategory(c);
              setParams(paramsText(null, c));
              setIssues([]);
            }}
          >
            {(['mosfet', 'driver', 'diode', 'motor'] as const).map((c) => (
              <option key={c} value={c}>
                {CATEGORY_LABELS[c].one}
              </option>
            ))}
          </select>
        </label>
        {headInput('manufacturer', 'Maker')}
        {headInput('mpn', 'Part number')}
        {headInput('package', 'Package', { optional: true })}
        <div className="md:col-span-2">{headInput('description', 'Description', { optional: true })}</div>
        {!editing ? (
          <>
            <label className="field">
              Lifecycle
              <select name="lifecycle" value={head.lifecycle} onChange={(e) => setHead({ ...head, lifecycle: e.target.value })}>
                {LIFECYCLE_OPTIONS.map((o) => (
                  <option key={o.value} value={o.value}>
                    {o.label}
                  </option>
                ))}
              </select>
            </label>
            {headInput('lifecycleEffectiveDate', 'Lifecycle effective from', { optional: true, type: 'date' })}
          </>
        ) : (
          <p className="text-sm text-ink-soft self-end">
            Lifecycle: {head.lifecycle}. Change it from the part page (it records a date and a note).
          </p>
        )}
        {isCurator && (
          <label className="field">
            Review status
            <select name="reviewStatus" value={head.reviewStatus} onChange={(e) => setHead({ ...head, reviewStatus: e.target.value })}>
              {editing && <option value="">Keep as it is</option>}
              <option value="approved">Approved</option>
              <option value="draft">Draft (not ready)</option>
              <option value="pending">Pending review</option>
            </select>
          </label>
        )}
      </fieldset>

      <fieldset className="card p-3 grid gap-3 md:grid-cols-4" data-testid="param-fields">
        <legend className="px-1 font-semibold">{CATEGORY_LABELS[category].one} parameters</legend>
        {fields.map((f) => input(f, params[f.key] ?? '', (v) => setParams((p) => ({ ...p, [f.key]: v })), `params.${f.key}`))}
        {category === 'driver' && (params.inputPull === 'up' || params.inputPull === 'down' || params.inputPull === 'none') && (
          <p className="md:col-span-4 text-sm" data-testid="open-input-hint" aria-live="polite">
            <span aria-hidden="true">→ </span>
            {openInputSentence(params.inputPull, params.inverting === 'true')}
          </p>
        )}
      </fieldset>

      {category === 'mosfet' && (
        <fieldset className="card p-3 grid gap-2" data-testid="rds-fields">
          <legend className="px-1 font-semibold">RDS(on) lines, each with its test condition</legend>
          {err('params.rdsOn') && (
            <span className="field-error">
              <span aria-hidden="true">✕ </span>
              {err('params.rdsOn')}
            </span>
          )}
          {rds.map((r, i) => (
            <div key={i} className="grid gap-2 grid-cols-2 md:grid-cols-6 items-end">
              {RDS_FIELDS.map((f) =>
                input(
                  f,
                  r[f.key] ?? '',
                  (v) => setRds((list) => list.map((x, j) => (j === i ? { ...x, [f.key]: v } : x))),
                  `params.rdsOn.${i}.${f.key}`,
                ),
              )}
              <button
                type="button"
                className="btn btn-quiet text-sm"
                onClick={() => setRds((list) => list.filter((_, j) => j !== i))}
                disabled={rds.length === 1}
              >
                Remove line
              </button>
            </div>
          ))}
          <div>
            <button type="button" className="btn btn-quiet text-sm" onClick={() => setRds((list) => [...list, emptyRds()])}>
              + Add an RDS(on) line
            </button>
          </div>
        </fieldset>
      )}

      {category === 'mosfet' && (
        <fieldset className="card p-3 grid gap-2" data-testid="zth-fields">
          <legend className="px-1 font-semibold">Transient thermal impedance (single pulse)</legend>
          <p className="text-sm text-ink-soft">
            Optional. Points read off the datasheet's single-pulse Zth(j-a) curve, shortest pulse first; each Zth at most RθJA. Used to
            judge a timed stall cut-off.
          </p>
          {err('params.zthPoints') && (
            <span className="field-error">
              <span aria-hidden="true">✕ </span>
              {err('params.zthPoints')}
            </span>
          )}
          {zth.length === 0 && <p className="text-sm text-ink-soft">No Zth points: a stall is judged at steady state.</p>}
          {zth.map((z, i) => {
            const set = (change: Partial<ZthText>) => setZth((list) => list.map((x, j) => (j === i ? { ...x, ...change } : x)));
            return (
              <div key={i} className="grid gap-2 grid-cols-2 md:grid-cols-6 items-end">
                {input(ZTH_PULSE_FIELDS[z.unit], z.pulse, (v) => set({ pulse: v }), `params.zthPoints.${i}.pulseS`)}
                <label className="field">
                  Unit
                  <select name={`params.zthPoints.${i}.unit`} value={z.unit} onChange={(e) => set({ unit: e.target.value as 'ms' | 's' })}>
                    <option value="ms">ms</option>
                    <option value="s">s</option>
                  </select>
                </label>
                {input(ZTH_VALUE_FIELD, z.zth, (v) => set({ zth: v }), `params.zthPoints.${i}.zthCPerW`)}
                <button type="button" className="btn btn-quiet text-sm" onClick={() => setZth((list) => list.filter((_, j) => j !== i))}>
                  Remove point
                </button>
              </div>
            );
          })}
          <div>
            <button
              type="button"
              className="btn btn-quiet text-sm"
              onClick={() => setZth((list) => [...list, emptyZth()])}
              disabled={zth.length >= 12}
            >
              + Add a Zth point
            </button>
          </div>
        </fieldset>
      )}

      <fieldset className="card p-3 grid gap-2">
        <legend className="px-1 font-semibold">Sources</legend>
        {sources.length === 0 && <p className="text-sm text-ink-soft">No source yet.</p>}
        {sources.map((s, i) => (
          <div key={i} className="grid gap-2 grid-cols-2 md:grid-cols-8 items-end">
            {(['distributor', 'sku', 'moq', 'leadTimeDays', 'stockQty', 'currency'] as const).map((k) => (
              <label key={k} className="field">
                {
                  {
                    distributor: 'Distributor',
                    sku: 'SKU',
                    moq: 'MOQ',
                    leadTimeDays: 'Lead time (days)',
                    stockQty: 'Stock',
                    currency: 'Currency',
                  }[k]
                }
                <input
                  name={`sources.${i}.${k}`}
                  value={s[k]}
                  onChange={(e) => setSources((list) => list.map((x, j) => (j === i ? { ...x, [k]: e.target.value } : x)))}
                />
                {err(`sources.${i}.${k}`) && (
                  <span className="field-error">
                    <span aria-hidden="true">✕ </span>
                    {err(`sources.${i}.${k}`)}
                  </span>
                )}
              </label>
            ))}
            <label className="field md:col-span-2">
              Price breaks (qty:unit price; …)
              <input
                name={`sources.${i}.priceBreaks`}
                value={s.priceBreaks}
                placeholder="1:0.24; 100:0.11"
                onChange={(e) => setSources((list) => list.map((x, j) => (j === i ? { ...x, priceBreaks: e.target.value } : x)))}
              />
              {[...issueAt.entries()]
                .filter(([k]) => k.startsWith(`sources.${i}.priceBreaks`))
                .slice(0, 1)
                .map(([k, m]) => (
                  <span key={k} className="field-error">
                    <span aria-hidden="true">✕ </span>
                    {m}
                  </span>
                ))}
            </label>
            <button type="button" className="btn btn-quiet text-sm" onClick={() => setSources((list) => list.filter((_, j) => j !== i))}>
              Remove source
            </button>
          </div>
        ))}
        <div>
          <button type="button" className="btn btn-quiet text-sm" onClick={() => setSources((list) => [...list, emptySource()])}>
            + Add a source
          </button>
        </div>
      </fieldset>

      <div className="flex gap-3 items-center">
        <button type="submit" className="btn" disabled={busy}>
          {editing ? 'Save changes' : isCurator ? 'Add to catalogue' : 'Propose part'}
        </button>
        <a href={editing ? `/parts/${part.id}` : '/parts'}>Cancel</a>
        {busy && (
          <span className="text-sm text-ink-soft" aria-live="polite">
            Saving…
          </span>
        )}
      </div>
    </form>
  );
}

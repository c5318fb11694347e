import { useEffect, useMemo, useRef, useState } from 'react';
import type { DesignInput, DesignStatus, PartRole, RoleSelection } from '../../lib/domain/design.ts';
import { DEFAULT_MATCH_LIMIT } from '../../lib/schemas/design.ts';
import { sendJson } from '../api-client.ts';
import InputsPanel, { type MotorOption } from './InputsPanel.tsx';
import MotorPanel from './MotorPanel.tsx';
import CandidatesSection from './CandidatesSection.tsx';
import PowerOnPanel from './PowerOnPanel.tsx';
import SupplyPanel from './SupplyPanel.tsx';
import SelectionPanel from './SelectionPanel.tsx';
import { issuesByPath, useMatch } from './use-match.ts';

export interface WorkspaceProps {
  design: { id: number; version: number; revision: number; status: DesignStatus; ownerName: string } | null;
  initialInput: DesignInput;
  motors: MotorOption[];
  canEdit: boolean;
}

function Step({ n, title, children, testId }: { n: number; title: string; children: React.ReactNode; testId?: string }) {
  return (
    <section className="mb-5" aria-labelledby={`step-${n}`} data-testid={testId}>
      <h2 id={`step-${n}`} className="text-lg mb-2 flex items-baseline gap-2">
        <span className="text-copper font-bold">{n}</span>
        {title}
      </h2>
      {children}
    </section>
  );
}

/** CandidatesSection numbers its steps 3–5; with the supply step before it they read 4–6. */
/** The designer's workspace: inputs, then motor → supply and logic → switch → gate drive → diode → power-on → bill of materials. */
export default function DesignWorkspace({ design, initialInput, motors, canEdit }: WorkspaceProps) {
  const [input, setInput] = useState<DesignInput>(initialInput);
  const [meta, setMeta] = useState(design);
  const [saved, setSaved] = useState(JSON.stringify(initialInput));
  const [includePending, setIncludePending] = useState(false);
  const [saveMsg, setSaveMsg] = useState<{ tone: 'ok' | 'bad'; text: string } | null>(null);
  const [saveErrors, setSaveErrors] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);
  const [matchLimit, setMatchLimit] = useState(DEFAULT_MATCH_LIMIT);
  const { match, status, error, fieldErrors } = useMatch(meta?.id ?? null, input, includePending, matchLimit);
  const dirty = JSON.stringify(input) !== saved;
  const errors = useMemo(() => ({ ...fieldErrors, ...saveErrors }), [fieldErrors, saveErrors]);
  const readOnly = !canEdit;
  const statusRef = useRef<HTMLParagraphElement>(null);
  // Saving disables its own button and Mark ready swaps it for Back to draft: the keyboard focus would fall
  // back to the page, so it moves to the answer instead (Tab then carries on from the toolbar).
  useEffect(() => {
    const el = document.activeElement;
    if (saveMsg && (el == null || el === document.body || (el as HTMLButtonElement).disabled)) statusRef.current?.focus();
  }, [saveMsg]);

  const select = (role: PartRole) => (sel: RoleSelection) => setInput((i) => ({ ...i, selections: { ...i.selections, [role]: sel } }));

  async function save(): Promise<void> {
    setBusy(true);
    setSaveMsg(null);
    const res = meta
      ? await sendJson<{ id: number; version: number; revision: number; status: DesignStatus; ownerName: string }>(
          'PUT',
          `/api/designs/${meta.id}`,
          { version: meta.version, input },
        )
      : await sendJson<{ id: number; version: number; revision: number; status: DesignStatus; ownerName: string }>(
          'POST',
          '/api/designs',
          input,
        );
    setBusy(false);
    if (!res.ok) {
      setSaveErrors(issuesByPath(res.issues, 'input.'));
      setSaveMsg({
        tone: 'bad',
        text: res.status === 409 ? `${res.error} Your edits are still here; copy what you need before reloading.` : res.error,
      });
      return;
    }
    setSaveErrors({});
    if (!meta) {
      window.location.assign(`/designs/${res.data.id}`);
      return;
    }
    setMeta({
      id: res.data.id,
      version: res.data.version,
      revision: res.data.revision,
      status: res.data.status,
      ownerName: res.data.ownerName,
    });
    setSaved(JSON.stringify(input));
    setSaveMsg({ tone: 'ok', text: `Saved as revision ${res.data.revision}.` });
  }

  async function setStatus(next: DesignStatus): Promise<void> {
    if (!meta) return;
    const res = await sendJson<{ version: number; status: DesignStatus; revision: number }>('POST', `/api/designs/${meta.id}/status`, {
      status: next,
      version: meta.version,
    });
    if (res.ok) {
      setMeta({ ...meta, version: res.data.version, status: res.data.status });
      setSaveMsg({
        tone: 'ok',
        text: next === 'ready' ? 'Marked ready: its lines and alternates are on the buyers’ shortlist.' : 'Back to draft.',
      });
    } else setSaveMsg({ tone: 'bad', text: [res.error, ...res.issues.map((i) => `${i.message}.`)].join(' ') });
  }

  return (
    <div data-testid="workspace">
      <div
        className="card p-3 mb-4 flex flex-wrap items-end gap-3 lg:sticky lg:top-0 z-10 workspace-toolbar"
        data-testid="workspace-toolbar"
      >
        <label className="field grow min-w-64">
          Design name
          <input
            value={input.name}
            disabled={readOnly}
            onChange={(e) => setInput({ ...input, name: e.target.value })}
            aria-invalid={errors.name ? true : undefined}
            data-testid="design-name"
          />
          {errors.name ? <span className="field-error">⚠ {errors.name}</span> : null}
        </label>
        <div className="text-sm text-ink-soft">
          {meta ? (
            <>
              Rev {meta.revision} · {meta.status === 'ready' ? '✓ ready for buying' : 'draft'} · {meta.ownerName}
            </>
          ) : (
            'new, not saved yet'
          )}
          {dirty && meta ? <span className="text-warn"> · ! unsaved changes</span> : null}
        </div>
        <label className="text-sm flex items-center gap-1">
          <input type="checkbox" checked={includePending} onChange={(e) => setIncludePending(e.target.checked)} /> include parts pending
          review
        </label>
        <span className="text-sm text-ink-soft" aria-live="polite" data-testid="match-status">
          {status === 'loading' ? '… ranking' : status === 'error' ? `⚠ ${error}` : status === 'ready' ? '✓ ranked' : ''}
        </span>
        <div className="flex flex-wrap gap-2 ml-auto">
          {canEdit && match ? (
            <button type="button" className="btn btn-quiet" onClick={() => setInput({ ...input, selections: match.suggested })}>
              Suggest picks
            </button>
          ) : null}
          {canEdit ? (
            <button type="button" className="btn" disabled={busy || (!dirty && !!meta)} onClick={save} data-testid="save-design">
              {busy ? 'Saving…' : meta ? 'Save revision' : 'Create design'}
            </button>
          ) : null}
          {canEdit && meta ? (
            meta.status === 'ready' ? (
              <button type="button" className="btn btn-quiet" onClick={() => setStatus('draft')}>
                Back to draft
              </button>
            ) : (
              <button type="button" className="btn btn-quiet" disabled={dirty} onClick={() => setStatus('ready')}>
                Mark ready
              </button>
            )
          ) : null}
          {meta ? (
            <a className="btn btn-quiet no-underline" href={`/api/designs/${meta.id}/report.pdf`} data-testid="report-link">
              Report PDF
            </a>
          ) : null}
          {meta ? (
            <a className="btn btn-quiet no-underline" href={`/api/designs/${meta.id}/bom.csv`}>
              BOM CSV
            </a>
          ) : null}
        </div>
        {saveMsg ? (
          <p
            role="status"
            ref={statusRef}
            tabIndex={-1}
            className={`w-full text-sm ${saveMsg.tone === 'ok' ? 'text-ok' : 'text-bad'}`}
            data-testid="save-status"
          >
            {saveMsg.tone === 'ok' ? '✓' : '⚠'} {saveMsg.text}
          </p>
        ) : null}
        {dirty && meta ? (
          <p className="w-full text-xs text-ink-faint">
            Report and BOM show the saved revision {meta.revision}; save to include your changes.
          </p>
        ) : null}
      </div>

      <Step n={1} title="Motor, supply and logic">
        <InputsPanel input={input} motors={motors} errors={errors} onChange={setInput} readOnly={readOnly} />
      </Step>
      {!match ? (
        <p className="text-ink-soft" role="status">
          {status === 'error' ? `⚠ ${error}` : '… ranking the catalogue for this design'}
        </p>
      ) : (
        <>
          <Step n={2} title="Motor at the supply extremes" testId="step-motor">
            <MotorPanel motor={match.motor} worstCase={match.worstCase} />
          </Step>
          <Step n={3} title="Supply and logic at start" testId="step-supply">
            <SupplyPanel supply={match.supply} />
          </Step>
          <CandidatesSection
            match={match}
            input={input}
            onSelect={select}
            readOnly={readOnly}
            Step={Step}
            onShowMore={() => setMatchLimit((l) => l + DEFAULT_MATCH_LIMIT)}
            compare={meta ? { designId: meta.id, includePending, unsaved: dirty } : undefined}
          />
          <Step n={7} title="Power-on and reset state" testId="step-power-on">
            <PowerOnPanel powerOn={match.powerOn} resetStartIntent={input.resetStartIntent} />
          </Step>
          <Step n={8} title="Chosen parts and alternates" testId="step-selection">
            <SelectionPanel input={input} match={match} />
          </Step>
          <section className="card p-3 text-sm" aria-labelledby="ws-cautions">
            <h2 id="ws-cautions" className="font-semibold mb-1">
              ⚠ More cautions for this design
            </h2>
            <p className="text-xs text-ink-soft mb-1">The cautions for each step are shown with that step above.</p>
            <ul className="list-disc pl-5 grid gap-0.5" data-testid="other-cautions">
              {match.otherCautions.map((c) => (
                <li key={c}>{c}</li>
              ))}
            </ul>
          </section>
        </>
      )}
    </div>
  );
}

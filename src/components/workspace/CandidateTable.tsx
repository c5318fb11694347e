import type { Lifecycle } from '../../lib/domain/parts.ts';
import { Fragment, useState } from 'react';
import { LIFECYCLE_LABELS } from '../../lib/labels.ts';
import type { MatchEntry } from '../../lib/design-match.ts';
import type { CandidateResult } from '../../lib/ranking.ts';
import type { RoleSelection } from '../../lib/domain/design.ts';
import { checkFigure } from '../../lib/design-words.ts';
import CheckName from './CheckName.tsx';
import { fixed, percent, price } from '../../lib/units.ts';
import Verdict, { CheckMark } from './Verdict.tsx';
import { DEFAULT_MATCH_LIMIT } from '../../lib/schemas/design.ts';
import type { MatchListSummary, Ranked } from '../../lib/match-page.ts';
import { nearMissLine, type NearMiss } from '../../lib/compare.ts';

export interface ExtraColumn<T> {
  header: string;
  cell: (entry: T) => string;
}

interface Props<T extends MatchEntry> {
  role: 'switch' | 'driver' | 'diode';
  caption: string;
  /** The page of the ranking (best first) plus the picks that rank outside it (pinned). */
  entries: (T & Ranked)[];
  /** Counts and failure reasons over the whole ranking. */
  summary: MatchListSummary;
  onShowMore: () => void;
  extra: ExtraColumn<T>[];
  selection: RoleSelection;
  onSelect: (selection: RoleSelection) => void;
  readOnly: boolean;
  /** Where the comparison of the ticked rows opens (a saved design only); without it no Compare column. */
  compareHref?: (partIds: number[]) => string;
  /** Shown beside the Compare button (e.g. that the saved revision is compared). */
  compareNote?: string;
}

const MAX_COMPARE = 4;

const margin = (m: number | null): string => (m == null ? '' : percent(m));
const LIFE = (l: Lifecycle): string => LIFECYCLE_LABELS[l].short;

/** Marks a part in another package than the chosen one (words and icon). */
export function FootprintChange() {
  return (
    <span
      className="tag ml-1 text-warn border-warn"
      data-testid="footprint-change"
      title="Another package than the chosen part: the board needs a different footprint to take it."
    >
      ⇄ footprint change
    </span>
  );
}

function Reasons({ checks }: { checks: CandidateResult['checks'] }) {
  return (
    <table className="w-full text-xs my-1">
      <thead>
        <tr className="text-ink-soft">
          <th className="text-left font-semibold w-6"></th>
          <th className="text-left font-semibold">Check</th>
          <th className="text-right font-semibold">Value</th>
          <th className="text-right font-semibold">Limit</th>
          <th className="text-right font-semibold">Margin</th>
          <th className="text-left font-semibold pl-3">Why</th>
        </tr>
      </thead>
      <tbody>
        {checks.map((c) => (
          <tr key={c.id} data-check={c.id}>
            <td>
              <CheckMark ok={c.ok} severity={c.severity} />
            </td>
            <td className="pr-2 min-w-36">
              <CheckName id={c.id} />
            </td>
            <td className="text-right num whitespace-nowrap">{checkFigure(c.value, c.unit)}</td>
            <td className="text-right num whitespace-nowrap">{checkFigure(c.limit, c.unit)}</td>
            <td className="text-right num">{margin(c.margin)}</td>
            <td className="pl-3">{c.note}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/**
 * Columns whose cell is the same in every row shown are said once above the table instead of repeated in
 * each row (a column with nothing in any row is left out); with a single row every column stays.
 */
function splitColumns<T>(extra: ExtraColumn<T>[], rows: T[]): { varying: ExtraColumn<T>[]; same: { header: string; value: string }[] } {
  if (rows.length < 2) return { varying: extra, same: [] };
  const varying: ExtraColumn<T>[] = [];
  const same: { header: string; value: string }[] = [];
  for (const c of extra) {
    const values = new Set(rows.map((r) => c.cell(r)));
    if (values.size > 1) varying.push(c);
    else {
      const [value] = values;
      if (value !== '—') same.push({ header: c.header, value });
    }
  }
  return { varying, same };
}

/** When nothing in the full ranking passes: the closest candidates and what they miss. */
export function NearMissNote({ nearMisses, role }: { nearMisses: NearMiss[]; role: string }) {
  if (nearMisses.length === 0) return null;
  return (
    <div className="text-sm px-2 py-1 mb-1 rounded border border-warn bg-warn-wash" role="note" data-testid={`near-miss-${role}`}>
      <strong>! Nothing passes.</strong> The closest candidates and what they miss:
      <ul className="list-disc ml-5">
        {nearMisses.map((m) => (
          <li key={`${m.partId}-${m.mpn}`} data-mpn={m.mpn}>
            {nearMissLine(m)}
          </li>
        ))}
      </ul>
    </div>
  );
}

/** Ranked candidates for one line of the design, with expandable reasons and pick controls. */
export default function CandidateTable<T extends MatchEntry>({
  role,
  caption,
  entries,
  summary,
  onShowMore,
  extra,
  selection,
  onSelect,
  readOnly,
  compareHref,
  compareNote,
}: Props<T>) {
  const [open, setOpen] = useState<Set<string>>(new Set());
  const [compareIds, setCompareIds] = useState<number[]>([]);
  const toggleCompare = (id: number) =>
    setCompareIds((ids) => (ids.includes(id) ? ids.filter((x) => x !== id) : ids.length < MAX_COMPARE ? [...ids, id] : ids));
  const rows = entries;
  const shown = entries.filter((e) => !e.pinned).length;
  const remaining = summary.total - summary.offset - shown;
  const toggle = (key: string) =>
    setOpen((s) => {
      const n = new Set(s);
      if (n.has(key)) n.delete(key);
      else n.add(key);
      return n;
    });
  const choose = (id: number) => onSelect({ chosenPartId: id, alternatePartIds: selection.alternatePartIds.filter((a) => a !== id) });
  const toggleAlt = (id: number) => {
    const has = selection.alternatePartIds.includes(id);
    const next = has ? selection.alternatePartIds.filter((a) => a !== id) : [...selection.alternatePartIds, id].slice(0, 3);
    onSelect({ chosenPartId: selection.chosenPartId === id ? null : selection.chosenPartId, alternatePartIds: next });
  };
  if (entries.length === 0) return <p className="text-sm text-ink-soft p-3">No candidates in the catalogue for this line.</p>;
  const { varying, same } = splitColumns(extra, rows);
  return (
    <div className="overflow-x-auto">
      <p className="text-xs text-ink-soft px-1 pb-1" data-testid={`list-summary-${role}`}>
        Showing {shown.toLocaleString('en-US')} of {summary.total.toLocaleString('en-US')}: {summary.summary}
      </p>
      {same.length > 0 && (
        <p className="text-xs text-ink-soft px-1 pb-1" data-testid={`same-for-all-${role}`}>
          The same for every candidate shown: {same.map((s) => `${s.header} ${s.value}`).join(' · ')}.
        </p>
      )}
      <NearMissNote nearMisses={summary.nearMisses ?? []} role={role} />
      {compareHref ? (
        <p className="text-xs px-1 pb-1 flex flex-wrap items-center gap-2">
          {compareIds.length > 0 ? (
            <a className="btn btn-quiet no-underline text-xs" href={compareHref(compareIds)} data-testid={`compare-${role}`}>
              <span aria-hidden="true">⇆ </span>Compare {compareIds.length} side by side
            </a>
          ) : (
            <span className="text-ink-soft">Tick up to {MAX_COMPARE} rows under “Compare” to see every check side by side.</span>
          )}
          {compareIds.length > 0 && compareNote ? <span className="text-ink-soft">{compareNote}</span> : null}
        </p>
      ) : null}
      <table className="data-table w-full text-sm" data-testid={`candidates-${role}`}>
        <caption className="sr-only">{caption}</caption>
        <thead>
          <tr>
            <th>Verdict</th>
            <th>Part number</th>
            <th>Maker</th>
            <th>Package</th>
            {varying.map((c) => (
              <th key={c.header} className="num">
                {c.header}
              </th>
            ))}
            <th className="num">Score</th>
            <th className="num">Price</th>
            <th>Lifecycle</th>
            {!readOnly && <th>Use</th>}
            {!readOnly && <th>Alt.</th>}
            {compareHref ? <th>Compare</th> : null}
            <th></th>
          </tr>
        </thead>
        <tbody>
          {rows.map((e) => {
            const key = `${e.partId}-${e.mpn}`;
            const id = e.partId ?? -1;
            const isOpen = open.has(key);
            return (
              <Fragment key={key}>
                <tr data-mpn={e.mpn} data-verdict={e.verdict}>
                  <td>
                    <Verdict verdict={e.verdict} />
                  </td>
                  <td className="font-semibold whitespace-nowrap">
                    {e.mpn}
                    {e.reviewStatus === 'pending' ? <span className="tag ml-1">pending review</span> : null}
                    {e.footprintChange ? <FootprintChange /> : null}
                    {e.pinned ? (
                      <span className="tag ml-1" title="Your pick, shown although it ranks below this page">
                        ranked {e.rank.toLocaleString('en-US')}
                      </span>
                    ) : null}
                  </td>
                  <td className="whitespace-nowrap">{e.manufacturer}</td>
                  <td className="whitespace-nowrap">{e.package}</td>
                  {varying.map((c) => (
                    <td key={c.header} className="num whitespace-nowrap">
                      {c.cell(e)}
                    </td>
                  ))}
                  <td className="num">{fixed(e.score, 0)}</td>
                  <td className="num whitespace-nowrap">{e.priceAtQty ? price(e.priceAtQty.unitPrice, e.priceAtQty.currency) : '—'}</td>
                  <td>{LIFE(e.lifecycle)}</td>
                  {!readOnly && (
                    <td>
                      <input
                        type="radio"
                        name={`use-${role}`}
                        aria-label={`Use ${e.mpn}`}
                        checked={selection.chosenPartId === id}
                        disabled={e.verdict === 'fail' && selection.chosenPartId !== id}
                        title={e.verdict === 'fail' ? 'A failing part cannot be chosen' : undefined}
                        onChange={() => choose(id)}
                      />
                    </td>
                  )}
                  {!readOnly && (
                    <td>
                      <input
                        type="checkbox"
                        aria-label={`Alternate ${e.mpn}`}
                        checked={selection.alternatePartIds.includes(id)}
                        disabled={
                          !selection.alternatePartIds.includes(id) && (selection.alternatePartIds.length >= 3 || e.verdict !== 'pass')
                        }
                        title={e.verdict !== 'pass' ? 'Alternates must pass every check' : undefined}
                        onChange={() => toggleAlt(id)}
                      />
                    </td>
                  )}
                  {compareHref ? (
                    <td>
                      <input
                        type="checkbox"
                        aria-label={`Compare ${e.mpn}`}
                        checked={compareIds.includes(id)}
                        disabled={e.partId == null || (!compareIds.includes(id) && compareIds.length >= MAX_COMPARE)}
                        title={compareIds.length >= MAX_COMPARE && !compareIds.includes(id) ? `At most ${MAX_COMPARE} at once` : undefined}
                        onChange={() => toggleCompare(id)}
                      />
                    </td>
                  ) : null}
                  <td>
                    <button type="button" className="btn-quiet text-xs px-1.5 rounded" aria-expanded={isOpen} onClick={() => toggle(key)}>
                      {isOpen ? 'Hide reasons' : 'Reasons'}
                    </button>
                  </td>
                </tr>
                {isOpen && (
                  <tr className="bg-paper">
                    <td colSpan={99}>
                      <Reasons checks={e.checks} />
                    </td>
                  </tr>
                )}
              </Fragment>
            );
          })}
        </tbody>
      </table>
      {remaining > 0 && (
        <button type="button" className="btn-quiet text-sm px-2 py-1 rounded mt-1" onClick={onShowMore}>
          {remaining <= DEFAULT_MATCH_LIMIT
            ? `Show all ${summary.total.toLocaleString('en-US')}`
            : `Show ${DEFAULT_MATCH_LIMIT} more (of ${summary.total.toLocaleString('en-US')})`}
        </button>
      )}
    </div>
  );
}

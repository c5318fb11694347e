/**
 * The designer's daily view: category, parameter bounds in display units, fuzzy text, and a server-side
 * sorted and paged table (TanStack Table v8). The URL carries the whole filter, so a search can be shared.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import { flexRender, getCoreRowModel, useReactTable, type ColumnDef, type SortingState, type VisibilityState } from '@tanstack/react-table';
import type { Part, PartCategory } from '../../lib/domain/parts.ts';
import { CATEGORY_LABELS } from '../../lib/part-summary.ts';
import { CATEGORY_FIELDS, STATUS_FIELDS, activeFilterCount, toApi, toDisplay, type FilterField } from './search-fields.ts';
import { columnsFor, type SearchColumn } from './search-columns.tsx';
import { StatusBadges } from './StatusBadges.tsx';
import type { SearchNearMiss } from '../../lib/search-near-miss.ts';
import CompareBar from './CompareBar.tsx';
import { parseQueryUnits } from '../../lib/query-units.ts';
import { filterChips, type FilterChip } from '../../lib/filter-chips.ts';

interface Props {
  packages: Record<string, string[]>;
  canCreate: boolean;
  /** The page's query string as the server saw it, so server and browser render the same first frame. */
  initialQuery: string;
}

interface PageData {
  items: Part[];
  total: number;
  page: number;
  pageSize: number;
  /** When nothing meets every bound: the closest parts and what they miss. */
  nearMisses?: SearchNearMiss[];
}

const COMPARE_ROLE: Partial<Record<PartCategory, 'switch' | 'driver' | 'diode'>> = { mosfet: 'switch', driver: 'driver', diode: 'diode' };
const MAX_COMPARE = 4;

type Load =
  | { state: 'loading' }
  | { state: 'ready'; data: PageData }
  | { state: 'error'; message: string; issues: { path: string; message: string }[] };

const CATEGORIES: (PartCategory | '')[] = ['', 'mosfet', 'driver', 'diode', 'motor'];
const PAGE_SIZES = [25, 50, 100];

function defaultVisibility(category: PartCategory | null): VisibilityState {
  return Object.fromEntries(columnsFor(category).map((c) => [c.id, !!c.defaultVisible]));
}

/** The person's column choice for a category, kept in this browser. */
function savedVisibility(category: PartCategory | null): VisibilityState {
  try {
    const saved = window.localStorage.getItem(`stallpoint.columns.${category ?? 'all'}`);
    if (saved) return { ...defaultVisibility(category), ...(JSON.parse(saved) as VisibilityState) };
  } catch {
    /* no storage: defaults */
  }
  return defaultVisibility(category);
}

export default function PartSearch({ packages, canCreate, initialQuery }: Props) {
  const [params, setParams] = useState<URLSearchParams>(() => new URLSearchParams(initialQuery));
  const [text, setText] = useState(() => new URLSearchParams(initialQuery).get('q') ?? '');
  const [load, setLoad] = useState<Load>({ state: 'loading' });
  const [loading, setLoading] = useState(true);
  const category = (params.get('category') || null) as PartCategory | null;
  const [visibility, setVisibility] = useState<VisibilityState>(() => defaultVisibility(category));
  const [visibilityLoaded, setVisibilityLoaded] = useState(false);
  /** Whether the folded filters are open on a narrow screen (a wide one always shows them). */
  const [filtersOpen, setFiltersOpen] = useState(false);
  const queryString = params.toString();
  const seq = useRef(0);
  const [compareIds, setCompareIds] = useState<number[]>([]);
  const compareRole = category ? COMPARE_ROLE[category] : undefined;
  useEffect(() => setCompareIds([]), [category]);
  const toggleCompare = (id: number) =>
    setCompareIds((ids) => (ids.includes(id) ? ids.filter((x) => x !== id) : ids.length < MAX_COMPARE ? [...ids, id] : ids));
  const searchInput = useRef<HTMLInputElement>(null);
  /** Units in the typed text ("schottky 40 V") that Enter turns into filters; the rest stays text. */
  const parsed = useMemo(() => parseQueryUnits(text, { category: category ?? undefined }), [text, category]);
  const pendingFilters = Object.entries(parsed.filters).filter(([k, v]) => params.get(k) !== v);
  const chips = useMemo(() => filterChips(params), [params]);

  /** Applies changes to the latest filter (several fields may fire close together). */
  function update(changes: Record<string, string>, resetPage = true): void {
    setParams((prev) => {
      const next = new URLSearchParams(prev);
      for (const [k, v] of Object.entries(changes)) {
        if (v === '') next.delete(k);
        else next.set(k, v);
      }
      if (resetPage && !('page' in changes)) next.delete('page');
      return next.toString() === prev.toString() ? prev : next;
    });
  }

  function chooseCategory(c: PartCategory | ''): void {
    setParams((prev) => {
      const next = new URLSearchParams();
      if (c) next.set('category', c);
      for (const k of ['q', 'lifecycle', 'reviewStatus', 'pageSize']) if (prev.get(k)) next.set(k, prev.get(k)!);
      return next;
    });
    setVisibility(savedVisibility(c || null));
  }

  /** Enter in the search box: recognised units become filters (chips), the other words the text. */
  function applyText(): void {
    const { filters, rest } = parsed;
    if (pendingFilters.length === 0) return;
    const newCategory = filters.category && filters.category !== category ? (filters.category as PartCategory) : null;
    setParams((prev) => {
      const next = newCategory ? new URLSearchParams() : new URLSearchParams(prev);
      if (newCategory) for (const k of ['lifecycle', 'reviewStatus', 'pageSize']) if (prev.get(k)) next.set(k, prev.get(k)!);
      for (const [k, v] of Object.entries(filters)) next.set(k, v);
      if (rest.trim()) next.set('q', rest.trim());
      else next.delete('q');
      next.delete('page');
      return next;
    });
    setText(rest);
    if (newCategory) setVisibility(savedVisibility(newCategory));
  }

  /** A chip's × : its parameters go; the category chip clears that category's filters too, as the radio does. */
  function removeChip(chip: FilterChip): void {
    if (chip.keys.includes('category')) chooseCategory('');
    else update(Object.fromEntries(chip.keys.map((k) => [k, ''])));
    searchInput.current?.focus();
  }

  // The address bar follows the filter, so the search can be shared or bookmarked.
  useEffect(() => {
    if (window.location.search.replace(/^\?/, '') !== queryString) {
      window.history.replaceState(null, '', `${window.location.pathname}${queryString ? `?${queryString}` : ''}`);
    }
  }, [queryString]);

  useEffect(() => {
    setVisibility(savedVisibility(category));
    setVisibilityLoaded(true);
  }, []);

  useEffect(() => {
    // Text with new units waits for Enter (the hint below the box says what it becomes); other text searches
    // as typed, less any words already in force as filters ("schottky" with the Schottky chip on).
    if (pendingFilters.length > 0) return;
    const handle = setTimeout(() => update({ q: parsed.rest.trim() }), 250);
    return () => clearTimeout(handle);
  }, [text, pendingFilters.length, parsed.rest]);

  useEffect(() => {
    const mine = ++seq.current;
    setLoad((l) => (l.state === 'ready' ? l : { state: 'loading' }));
    setLoading(true);
    // The page reads units in its text itself (on Enter, as chips); the API is asked to leave them.
    fetch(`/api/parts?${queryString ? `${queryString}&` : ''}units=off`, { headers: { Accept: 'application/json' } })
      .then(async (res) => {
        const body = await res.json().catch(() => ({ error: `The server answered ${res.status}.`, issues: [] }));
        if (mine !== seq.current) return;
        if (!res.ok) setLoad({ state: 'error', message: body.error ?? `The server answered ${res.status}.`, issues: body.issues ?? [] });
        else setLoad({ state: 'ready', data: body as PageData });
      })
      .catch(
        () =>
          mine === seq.current &&
          setLoad({ state: 'error', message: 'The server could not be reached. Check the connection and try again.', issues: [] }),
      )
      .finally(() => mine === seq.current && setLoading(false));
  }, [queryString]);

  useEffect(() => {
    if (!visibilityLoaded) return;
    try {
      window.localStorage.setItem(`stallpoint.columns.${category ?? 'all'}`, JSON.stringify(visibility));
    } catch {
      /* ignore */
    }
  }, [visibility, visibilityLoaded]);

  const searchColumns = useMemo(() => columnsFor(category), [category]);
  const columns = useMemo<ColumnDef<Part>[]>(
    () => [
      {
        id: 'mpn',
        header: 'Part number',
        enableHiding: false,
        meta: { sortKey: 'mpn' },
        cell: ({ row }) => (
          <a href={`/parts/${row.original.id}`} className="font-semibold whitespace-nowrap" data-testid="part-link">
            {row.original.mpn}
          </a>
        ),
      },
      ...searchColumns.map<ColumnDef<Part>>((c: SearchColumn) => ({
        id: c.id,
        header: c.label,
        meta: { sortKey: c.sortKey, unit: c.unit, numeric: c.numeric },
        cell: ({ row }) => c.cell(row.original),
      })),
      { id: 'status', header: 'Review', enableHiding: false, cell: ({ row }) => <StatusBadges review={row.original.reviewStatus} /> },
    ],
    [searchColumns],
  );

  const sortParam = params.get('sort') ?? '';
  const sorting: SortingState = useMemo(() => {
    if (!sortParam) return [];
    const key = sortParam.replace(/^-/, '');
    const col = key === 'mpn' ? 'mpn' : searchColumns.find((c) => c.sortKey === key)?.id;
    return col ? [{ id: col, desc: sortParam.startsWith('-') }] : [];
  }, [sortParam, searchColumns]);

  const data = load.state === 'ready' ? load.data : null;
  const pageSize = Number(params.get('pageSize') ?? 25);
  const table = useReactTable({
    data: data?.items ?? [],
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    pageCount: data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1,
    state: { sorting, columnVisibility: visibility },
    onColumnVisibilityChange: setVisibility,
    getRowId: (p) => String(p.id),
  });

  function toggleSort(sortKey: string | undefined): void {
    if (!sortKey) return;
    const next = sortParam === sortKey ? `-${sortKey}` : sortParam === `-${sortKey}` ? '' : sortKey;
    update({ sort: next });
  }

  const fields: FilterField[] = category ? CATEGORY_FIELDS[category] : [];
  const fieldError = (key: string): string | undefined =>
    load.state === 'error' ? load.issues.find((i) => i.path === key)?.message : undefined;
  const page = data?.page ?? Number(params.get('page') ?? 1);
  const pages = data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1;

  const active = activeFilterCount(params);
  return (
    <div className="grid gap-4 lg:grid-cols-[17rem_1fr]">
      <aside className="card p-3 self-start" aria-label="Filters">
        {/* Below the lg breakpoint the filters fold away behind this button so the results come first; on a desktop they stay open. */}
        <button
          type="button"
          className="btn btn-quiet w-full flex items-center justify-between lg:hidden"
          aria-expanded={filtersOpen}
          aria-controls="search-filters"
          data-testid="filters-toggle"
          onClick={() => setFiltersOpen((o) => !o)}
        >
          <span>
            <span aria-hidden="true">{filtersOpen ? '▾' : '▸'}</span> Filters
          </span>
          <span className="text-ink-soft text-sm" data-testid="filters-active">
            {active === 0 ? 'none active' : `${active} active`}
          </span>
        </button>
        <div id="search-filters" className={filtersOpen ? 'mt-3 lg:mt-0' : 'hidden lg:block'} data-testid="filters-panel">
          <fieldset className="mb-3">
            <legend className="text-sm font-semibold text-ink mb-1">Category</legend>
            <div className="grid grid-cols-1 gap-0.5 text-sm" role="radiogroup">
              {CATEGORIES.map((c) => (
                <label key={c || 'all'} className="flex items-center gap-2 cursor-pointer">
                  <input type="radio" name="category" value={c} checked={(category ?? '') === c} onChange={() => chooseCategory(c)} />
                  {c ? CATEGORY_LABELS[c].many : 'All categories'}
                </label>
              ))}
            </div>
          </fieldset>
          {fields.length > 0 && (
            <fieldset className="grid gap-2 mb-3" data-testid="parameter-filters">
              <legend className="text-sm font-semibold text-ink mb-1">Parameters</legend>
              {fields.map((f) => (
                <FilterInput
                  key={`${category}-${f.key}`}
                  field={f}
                  value={params.get(f.key)}
                  error={fieldError(f.key)}
                  onChange={(v) => update({ [f.key]: v })}
                />
              ))}
              {category && (packages[category]?.length ?? 0) > 0 && (
                <label className="field">
                  Package
                  <select value={params.get('package') ?? ''} onChange={(e) => update({ package: e.target.value })}>
                    <option value="">Any</option>
                    {packages[category].map((p) => (
                      <option key={p} value={p}>
                        {p}
                      </option>
                    ))}
                  </select>
                </label>
              )}
            </fieldset>
          )}
          <fieldset className="grid gap-2">
            <legend className="text-sm font-semibold text-ink mb-1">Status</legend>
            {STATUS_FIELDS.map((f) => (
              <FilterInput
                key={f.key}
                field={f}
                value={params.get(f.key)}
                error={fieldError(f.key)}
                onChange={(v) => update({ [f.key]: v })}
              />
            ))}
          </fieldset>
          {queryString && (
            <button
              type="button"
              className="btn btn-quiet mt-3 text-sm"
              onClick={() => {
                setText('');
                setParams(new URLSearchParams());
              }}
            >
              Clear every filter
            </button>
          )}
        </div>
      </aside>

      <section aria-label="Results" className="min-w-0">
        <div className="flex flex-wrap items-end gap-3 mb-2">
          <form
            role="search"
            className="grow max-w-md"
            onSubmit={(e) => {
              e.preventDefault();
              applyText();
            }}
          >
            <label className="field">
              Maker, part number or description (typos are forgiven)
              <input
                ref={searchInput}
                type="search"
                value={text}
                onChange={(e) => setText(e.target.value)}
                placeholder="e.g. CWN30L01 or schottky 40 V"
                aria-describedby={pendingFilters.length > 0 ? 'search-units-hint' : undefined}
                data-testid="search-text"
              />
            </label>
            {pendingFilters.length > 0 && (
              <p id="search-units-hint" className="text-xs text-ink-soft mt-1" data-testid="units-hint">
                <span aria-hidden="true">↵ </span>Press Enter to search with{' '}
                {filterChips(new URLSearchParams(parsed.filters))
                  .map((c) => c.label)
                  .join(' · ')}
                {parsed.rest ? ` and the text “${parsed.rest}”` : ''}.
              </p>
            )}
          </form>
          <details className="relative text-sm">
            <summary className="btn btn-quiet cursor-pointer">Columns</summary>
            <div className="card absolute right-0 z-10 mt-1 p-2 grid gap-1 w-56 shadow" role="group" aria-label="Visible columns">
              {table
                .getAllLeafColumns()
                .filter((c) => c.getCanHide())
                .map((c) => (
                  <label key={c.id} className="flex items-center gap-2">
                    <input type="checkbox" checked={c.getIsVisible()} onChange={c.getToggleVisibilityHandler()} />
                    {String(c.columnDef.header)}
                  </label>
                ))}
            </div>
          </details>
          <a
            className="btn btn-quiet text-sm"
            href={`/api/parts.csv?${new URLSearchParams([...params].filter(([k]) => k !== 'page' && k !== 'pageSize'))}`}
            download
          >
            <span aria-hidden="true">⤓</span> Export CSV
          </a>
          {canCreate && (
            <a className="btn text-sm" href={category ? `/parts/new?category=${category}` : '/parts/new'}>
              <span aria-hidden="true">+</span> New part
            </a>
          )}
        </div>

        {chips.length > 0 && (
          <ul className="flex flex-wrap gap-1.5 mb-2" aria-label="Filters in force" data-testid="filter-chips">
            {chips.map((c) => (
              <li key={c.keys.join('+')}>
                <button
                  type="button"
                  className="chip"
                  aria-label={`Remove filter ${c.label}`}
                  title={c.keys.includes('category') ? 'Removes the category and its parameter filters' : 'Remove this filter'}
                  data-testid="filter-chip"
                  onClick={() => removeChip(c)}
                >
                  {c.label} <span aria-hidden="true">×</span>
                </button>
              </li>
            ))}
          </ul>
        )}

        <p className="text-sm text-ink-soft mb-1" aria-live="polite" data-testid="result-count">
          {loading && (
            <span>
              <span aria-hidden="true">⟳ </span>Searching…
            </span>
          )}
          {!loading && data && `${data.total} part${data.total === 1 ? '' : 's'} match${data.total === 1 ? 'es' : ''}`}
        </p>

        {load.state === 'error' && (
          <div role="alert" className="card p-3 border-bad text-bad mb-2" data-testid="search-error">
            <strong>
              <span aria-hidden="true">✕ </span>
              {load.message}
            </strong>
            {load.issues.length > 0 && (
              <ul className="list-disc ml-5 text-sm">
                {load.issues.map((i) => (
                  <li key={i.path}>
                    {i.path}: {i.message}
                  </li>
                ))}
              </ul>
            )}
          </div>
        )}

        {data && data.total === 0 && !loading && (
          <div className="card p-4 text-ink-soft" data-testid="search-empty">
            <p className="text-ink font-semibold">
              <span aria-hidden="true">∅ </span>No part meets every bound.
            </p>
            <p>Loosen a bound, clear the text, or pick another category. A part you expect may still be waiting in review.</p>
            {data.nearMisses && data.nearMisses.length > 0 && (
              <div className="mt-2 text-ink" role="note" data-testid="search-near-miss">
                <p className="font-semibold">
                  <span aria-hidden="true">! </span>Closest parts and what they miss:
                </p>
                <ul className="list-disc ml-5">
                  {data.nearMisses.map((m) => (
                    <li key={m.partId} data-mpn={m.mpn}>
                      closest: <a href={`/parts/${m.partId}`}>{m.mpn}</a> ({m.manufacturer}) — {m.misses.join('; ')}
                    </li>
                  ))}
                </ul>
              </div>
            )}
          </div>
        )}

        {data && data.total > 0 && compareRole && <CompareBar role={compareRole} ids={compareIds} max={MAX_COMPARE} />}
        {data && data.total > 0 && (
          <div className="card overflow-x-auto" aria-busy={loading}>
            <div className="table-scroll">
              <table className="data-table w-full text-sm" data-testid="results-table">
                <thead>
                  {table.getHeaderGroups().map((hg) => (
                    <tr key={hg.id}>
                      {hg.headers.map((h) => {
                        const meta = (h.column.columnDef.meta ?? {}) as { sortKey?: string; unit?: string; numeric?: boolean };
                        const dir = sortParam === meta.sortKey ? 'ascending' : sortParam === `-${meta.sortKey}` ? 'descending' : undefined;
                        const label = (
                          <>
                            {flexRender(h.column.columnDef.header, h.getContext())}
                            {meta.unit && <span className="normal-case font-normal"> ({meta.unit})</span>}
                          </>
                        );
                        return (
                          <th
                            key={h.id}
                            className={meta.numeric ? 'num' : undefined}
                            aria-sort={meta.sortKey ? (dir ?? 'none') : undefined}
                          >
                            {meta.sortKey ? (
                              <button
                                type="button"
                                className="uppercase tracking-wide font-semibold cursor-pointer"
                                onClick={() => toggleSort(meta.sortKey)}
                                title="Sort by this column"
                              >
                                {label}
                                <span aria-hidden="true">{dir === 'ascending' ? ' ▲' : dir === 'descending' ? ' ▼' : ' ⇅'}</span>
                              </button>
                            ) : (
                              label
                            )}
                          </th>
                        );
                      })}
                      {compareRole && <th>Compare</th>}
                    </tr>
                  ))}
                </thead>
                <tbody>
                  {table.getRowModel().rows.map((row) => (
                    <tr key={row.id} data-mpn={row.original.mpn}>
                      {row.getVisibleCells().map((cell) => {
                        const meta = (cell.column.columnDef.meta ?? {}) as { numeric?: boolean };
                        return (
                          <td key={cell.id} className={meta.numeric ? 'num whitespace-nowrap' : undefined}>
                            {flexRender(cell.column.columnDef.cell, cell.getContext())}
                          </td>
                        );
                      })}
                      {compareRole && (
                        <td>
                          <input
                            type="checkbox"
                            aria-label={`Compare ${row.original.mpn}`}
                            checked={compareIds.includes(row.original.id ?? -1)}
                            disabled={!compareIds.includes(row.original.id ?? -1) && compareIds.length >= MAX_COMPARE}
                            onChange={() => row.original.id != null && toggleCompare(row.original.id)}
                          />
                        </td>
                      )}
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          </div>
        )}

        {data && data.total > 0 && (
          <nav className="flex items-center gap-3 mt-2 text-sm" aria-label="Pages">
            <button type="button" className="btn btn-quiet" disabled={page <= 1} onClick={() => update({ page: String(page - 1) }, false)}>
              ‹ Previous
            </button>
            <span>
              Page {page} of {pages}
            </span>
            <button
              type="button"
              className="btn btn-quiet"
              disabled={page >= pages}
              onClick={() => update({ page: String(page + 1) }, false)}
            >
              Next ›
            </button>
            <label className="ml-auto flex items-center gap-1">
              Rows per page
              <select
                value={pageSize}
                onChange={(e) => update({ pageSize: e.target.value === '25' ? '' : e.target.value })}
                className="border border-rule rounded px-1"
              >
                {PAGE_SIZES.map((s) => (
                  <option key={s} value={s}>
                    {s}
                  </option>
                ))}
              </select>
            </label>
          </nav>
        )}
      </section>
    </div>
  );
}

function FilterInput({
  field,
  value,
  error,
  onChange,
}: {
  field: FilterField;
  value: string | null;
  error?: string;
  onChange: (v: string) => void;
}) {
  const id = `filter-${field.key}`;
  const [typed, setTyped] = useState(field.type === 'number' ? toDisplay(field, value) : (value ?? ''));
  // The value changed elsewhere (a chip removed, units typed in the search box): show it.
  useEffect(() => {
    if (field.type === 'number' && toApi(field, typed) !== (value ?? '')) setTyped(toDisplay(field, value));
  }, [value]);
  useEffect(() => {
    if (field.type !== 'number') return;
    const handle = setTimeout(() => {
      if (toApi(field, typed) !== (value ?? '')) onChange(toApi(field, typed));
    }, 300);
    return () => clearTimeout(handle);
  }, [typed]);
  if (field.type === 'choice') {
    return (
      <label className="field" htmlFor={id}>
        {field.label}
        <select id={id} name={field.key} value={value ?? ''} onChange={(e) => onChange(e.target.value)}>
          <option value="">Any</option>
          {field.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
        {error && (
          <span className="field-error" role="alert">
            <span aria-hidden="true">✕ </span>
            {error}
          </span>
        )}
      </label>
    );
  }
  return (
    <label className="field" htmlFor={id}>
      <span>
        {field.label} <span className="text-ink-faint">({field.unit})</span>
      </span>
      <span className="flex items-center gap-1">
        <input
          id={id}
          name={field.key}
          inputMode="decimal"
          className="w-full"
          value={typed}
          onChange={(e) => setTyped(e.target.value)}
          aria-invalid={!!error}
          aria-describedby={field.hint ? `${id}-hint` : undefined}
        />
        <span className="text-ink-soft w-10">{field.unit}</span>
      </span>
      {field.hint && (
        <span id={`${id}-hint`} className="text-xs text-ink-faint">
          {field.hint}
        </span>
      )}
      {error && (
        <span className="field-error" role="alert">
          <span aria-hidden="true">✕ </span>
          {error}
        </span>
      )}
    </label>
  );
}

/** The admins' people list (TanStack Table v8): roles, status, deactivate / reactivate, resend invite. */
import { useMemo, useState, type ReactNode } from 'react';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { callJson } from '../auth/json-call.ts';
import { StatusLine, type Tone } from '../auth/FormParts.tsx';
import InviteForm from './InviteForm.tsx';
import { counted } from '../../lib/units.ts';
import { ROLE_NAMES, STATUS_TEXT, type PersonView, type RoleName } from './people-model.ts';
import { RolesEditor } from './RolesEditor.tsx';

interface Props {
  people: PersonView[];
  selfId: number;
}

const column = createColumnHelper<PersonView>();

export default function PeopleTable({ people: initial, selfId }: Props): ReactNode {
  const [people, setPeople] = useState(initial);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'name', desc: false }]);
  const [status, setStatus] = useState<{ tone: Tone; text: string } | null>(null);

  const replace = (p: PersonView): void =>
    setPeople((ps) => (ps.some((x) => x.id === p.id) ? ps.map((x) => (x.id === p.id ? p : x)) : [...ps, p]));

  async function act(person: PersonView, path: string, done: string, body: unknown = {}, method = 'POST'): Promise<void> {
    setStatus({ tone: 'busy', text: `Working on ${person.name}…` });
    const res = await callJson<{ person: PersonView; mailSent?: boolean }>(method, `/api/people/${person.id}/${path}`, body);
    if (!res.ok) return setStatus({ tone: 'bad', text: res.error });
    replace(res.data.person);
    setStatus(
      res.data.mailSent === false
        ? { tone: 'bad', text: 'The mail server refused the message; try again later.' }
        : { tone: 'ok', text: done },
    );
  }

  const columns = useMemo(
    () => [
      column.accessor('name', { header: 'Name', cell: (c) => <span className="font-semibold">{c.getValue()}</span> }),
      column.accessor('email', { header: 'E-mail' }),
      column.accessor('roles', {
        header: 'Roles',
        enableSorting: false,
        cell: (c) => (
          <RolesEditor
            person={c.row.original}
            isSelf={c.row.original.id === selfId}
            onSave={(roles: RoleName[]) => act(c.row.original, 'roles', `Roles of ${c.row.original.name} saved.`, { roles }, 'PUT')}
          />
        ),
      }),
      column.accessor('status', {
        header: 'Status',
        cell: (c) => {
          const s = STATUS_TEXT[c.getValue()];
          return (
            <span className={`tag ${s.cls}`}>
              <span aria-hidden="true">{s.icon}</span>
              {s.text}
            </span>
          );
        },
      }),
      column.display({
        id: 'actions',
        header: 'Actions',
        cell: (c) => <Actions person={c.row.original} isSelf={c.row.original.id === selfId} act={act} />,
      }),
    ],
    [selfId],
  );

  const table = useReactTable({
    data: people,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getRowId: (p) => String(p.id),
  });

  return (
    <div className="flex flex-col gap-4">
      <p className="text-ink-soft text-sm" data-testid="people-count">
        {counted(people.length, 'person', 'people')} · invite, set roles, deactivate
      </p>
      <InviteForm onInvited={replace} />
      {status && <StatusLine tone={status.tone}>{status.text}</StatusLine>}
      <div className="card overflow-x-auto">
        <table className="data-table w-full text-sm" data-testid="people-table">
          <thead>
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => (
                  <th
                    key={h.id}
                    aria-sort={h.column.getIsSorted() ? (h.column.getIsSorted() === 'asc' ? 'ascending' : 'descending') : undefined}
                  >
                    {h.column.getCanSort() ? (
                      <button type="button" className="uppercase tracking-wide" onClick={h.column.getToggleSortingHandler()}>
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        <span aria-hidden="true">{{ asc: ' ▲', desc: ' ▼' }[h.column.getIsSorted() as string] ?? ''}</span>
                      </button>
                    ) : (
                      flexRender(h.column.columnDef.header, h.getContext())
                    )}
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} data-email={row.original.email}>
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id}>{flexRender(cell.column.columnDef.cell, cell.getContext())}</td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="text-xs text-ink-faint">
        Roles: {ROLE_NAMES.join(', ')}. Admins can do everything; deactivating someone ends their sessions at once.
      </p>
    </div>
  );
}

type Act = (person: PersonView, path: string, done: string) => Promise<void>;

function Actions({ person, isSelf, act }: { person: PersonView; isSelf: boolean; act: Act }): ReactNode {
  if (isSelf) return <span className="text-ink-faint text-xs">(you)</span>;
  return (
    <span className="flex flex-wrap gap-2">
      {person.status === 'invited' && (
        <button
          type="button"
          className="btn btn-quiet text-xs py-0.5"
          onClick={() => act(person, 'invite', `A new invitation went to ${person.email}.`)}
        >
          Resend invite
        </button>
      )}
      {person.status !== 'deactivated' ? (
        <button
          type="button"
          className="btn btn-quiet text-xs py-0.5"
          onClick={() => act(person, 'deactivate', `${person.name} is deactivated and signed out everywhere.`)}
        >
          Deactivate
        </button>
      ) : (
        <button
          type="button"
          className="btn btn-quiet text-xs py-0.5"
          onClick={() => act(person, 'reactivate', `${person.name} can sign in again.`)}
        >
          Reactivate
        </button>
      )}
    </span>
  );
}

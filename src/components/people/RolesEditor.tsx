/** Role checkboxes for one person, saved together. */
import { useState, type ReactNode } from 'react';
import { ROLE_NAMES, type PersonView, type RoleName } from './people-model.ts';
import { useHydrated } from '../auth/use-hydrated.ts';

interface Props {
  person: PersonView;
  isSelf: boolean;
  onSave(roles: RoleName[]): Promise<void>;
}

export function RolesEditor({ person, isSelf, onSave }: Props): ReactNode {
  const [roles, setRoles] = useState<RoleName[]>(person.roles);
  const hydrated = useHydrated();
  const changed = roles.slice().sort().join() !== person.roles.slice().sort().join();
  const toggle = (r: RoleName): void => setRoles((rs) => (rs.includes(r) ? rs.filter((x) => x !== r) : [...rs, r]));
  return (
    <span className="flex flex-wrap items-center gap-2" role="group" aria-label={`Roles of ${person.name}`}>
      {ROLE_NAMES.map((r) => (
        <label key={r} className="inline-flex items-center gap-1 whitespace-nowrap">
          <input
            type="checkbox"
            checked={roles.includes(r)}
            onChange={() => toggle(r)}
            disabled={!hydrated || (isSelf && r === 'admin')}
            aria-label={`${r} (${person.name})`}
          />
          {r}
        </label>
      ))}
      {changed && (
        <button type="button" className="btn text-xs py-0.5" disabled={!roles.length} onClick={() => void onSave(roles)}>
          Save roles
        </button>
      )}
      {changed && !roles.length && (
        <span className="field-error">
          <span aria-hidden="true">✕ </span>at least one role
        </span>
      )}
    </span>
  );
}

/** The shape the people islands receive from the page (plain data; islands never import src/server). */
import { ROLES, type Role } from '../../lib/domain/roles.ts';

export const ROLE_NAMES = ROLES;
export type RoleName = Role;

export interface PersonView {
  id: number;
  email: string;
  name: string;
  roles: RoleName[];
  status: 'active' | 'invited' | 'deactivated';
  createdAt: string;
}

export const STATUS_TEXT: Record<PersonView['status'], { icon: string; text: string; cls: string }> = {
  active: { icon: '●', text: 'Active', cls: 'border-ok text-ok' },
  invited: { icon: '✉', text: 'Invited', cls: 'border-copper text-copper-deep' },
  deactivated: { icon: '○', text: 'Deactivated', cls: 'border-bad text-bad' },
};

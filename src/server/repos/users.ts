/** Data access for people (users + user_roles). Row types stay here; callers get SessionUser / Person. */
import type { Db } from '../db.ts';
import { ROLES, type Person, type Role, type SessionUser } from '../auth/types.ts';

export interface UserRow {
  id: number;
  email: string;
  name: string;
  password_hash: string | null;
  active: number | boolean;
  created_at: Date;
  updated_at: Date;
}

export function normalizeEmail(email: string): string {
  return email.trim().toLowerCase();
}

export async function findUserByEmail(db: Db, email: string): Promise<UserRow | null> {
  return (
    (await db<UserRow>('users')
      .where({ email: normalizeEmail(email) })
      .first()) ?? null
  );
}

export async function findUserById(db: Db, id: number): Promise<UserRow | null> {
  return (await db<UserRow>('users').where({ id }).first()) ?? null;
}

export async function rolesOf(db: Db, userId: number): Promise<Role[]> {
  const rows: { role: Role }[] = await db('user_roles').select('role').where({ user_id: userId });
  return sortRoles(rows.map((r) => r.role));
}

export function sortRoles(roles: Iterable<Role>): Role[] {
  const set = new Set(roles);
  return ROLES.filter((r) => set.has(r));
}

export async function replaceRoles(db: Db, userId: number, roles: readonly Role[]): Promise<void> {
  await db('user_roles').where({ user_id: userId }).delete();
  if (roles.length) await db('user_roles').insert(sortRoles(roles).map((role) => ({ user_id: userId, role })));
}

export async function sessionUserOf(db: Db, row: UserRow): Promise<SessionUser> {
  return { id: row.id, email: row.email, name: row.name, roles: await rolesOf(db, row.id) };
}

export async function setPasswordHash(db: Db, userId: number, passwordHash: string, now: Date): Promise<void> {
  await db('users').where({ id: userId }).update({ password_hash: passwordHash, updated_at: now });
}

export async function setActive(db: Db, userId: number, active: boolean, now: Date): Promise<void> {
  await db('users').where({ id: userId }).update({ active, updated_at: now });
}

export async function insertUser(db: Db, person: { email: string; name: string }, now: Date): Promise<number> {
  const [id] = await db('users').insert({
    email: normalizeEmail(person.email),
    name: person.name.trim(),
    password_hash: null,
    active: true,
    created_at: now,
    updated_at: now,
  });
  return Number(id);
}

export async function listPeopleRows(db: Db): Promise<Person[]> {
  const rows: UserRow[] = await db<UserRow>('users').select('*').orderBy('name');
  const roleRows: { user_id: number; role: Role }[] = await db('user_roles').select('user_id', 'role');
  return rows.map((row) =>
    toPerson(
      row,
      roleRows.filter((r) => r.user_id === row.id).map((r) => r.role),
    ),
  );
}

export function toPerson(row: UserRow, roles: Role[]): Person {
  const status = !row.active ? 'deactivated' : row.password_hash === null ? 'invited' : 'active';
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    roles: sortRoles(roles),
    status,
    createdAt: new Date(row.created_at).toISOString(),
  };
}

/**
 * What admins do on the people page: list, invite (a single-use link valid 72 h), resend an invite,
 * change roles, deactivate (sessions and open links revoked) and reactivate.
 */
import type { Db } from '../db.ts';
import type { Knex } from 'knex';
import type { Person, Role, SessionUser } from '../auth/types.ts';
import { findUserByEmail, findUserById, insertUser, listPeopleRows, replaceRoles, rolesOf, setActive, toPerson } from '../repos/users.ts';
import { INVITE_VALID_HOURS, issueToken, withdrawTokens } from '../repos/account-tokens.ts';
import { invalidateUserSessions } from '../repos/sessions.ts';
import { inviteMessage } from '../mail/messages.ts';
import { sendMail } from '../mail/send.ts';
import { ServiceError } from './errors.ts';
import { auditPerson } from '../repos/people-audit.ts';

export async function listPeople(db: Db): Promise<Person[]> {
  return listPeopleRows(db);
}

async function personById(db: Db, id: number): Promise<Person> {
  const row = await findUserById(db, id);
  if (!row) throw new ServiceError(404, 'There is no such person.');
  return toPerson(row, await rolesOf(db, id));
}

export interface InviteInput {
  email: string;
  name: string;
  roles: Role[];
}

export interface InviteOutcome {
  person: Person;
  /** False when the invitation is stored but the mail server refused it: resend later. */
  mailSent: boolean;
}

async function mailInvite(person: Person, actor: SessionUser, token: string, baseUrl: string): Promise<boolean> {
  const link = `${baseUrl}/invite?token=${token}`;
  try {
    await sendMail(person.email, inviteMessage({ name: person.name, invitedBy: actor.name, link, validHours: INVITE_VALID_HOURS }));
    return true;
  } catch (err) {
    console.error(`[stallpoint] invitation mail failed: ${err instanceof Error ? err.message : String(err)}`);
    return false;
  }
}

export async function invitePerson(
  db: Knex,
  input: InviteInput,
  actor: SessionUser,
  baseUrl: string,
  now = new Date(),
): Promise<InviteOutcome> {
  if (await findUserByEmail(db, input.email)) {
    throw new ServiceError(409, 'Someone with this e-mail address is already on the list.', [{ path: 'email', message: 'already in use' }]);
  }
  const { id, token } = await db.transaction(async (trx) => {
    const userId = await insertUser(trx, input, now);
    await replaceRoles(trx, userId, input.roles);
    await auditPerson(trx, actor.id, 'person.invite', userId, { email: input.email, roles: input.roles }, now);
    return { id: userId, token: await issueToken(trx, { userId, purpose: 'invite', createdBy: actor.id }, now) };
  });
  const person = await personById(db, id);
  return { person, mailSent: await mailInvite(person, actor, token, baseUrl) };
}

export async function resendInvite(db: Knex, id: number, actor: SessionUser, baseUrl: string, now = new Date()): Promise<InviteOutcome> {
  const person = await personById(db, id);
  if (person.status !== 'invited') throw new ServiceError(409, 'Only people who have not yet set a password can be invited again.');
  const token = await issueToken(db, { userId: id, purpose: 'invite', createdBy: actor.id }, now);
  await auditPerson(db, actor.id, 'person.invite-resend', id, undefined, now);
  return { person, mailSent: await mailInvite(person, actor, token, baseUrl) };
}

export async function setRoles(db: Knex, id: number, roles: Role[], actor: SessionUser, now = new Date()): Promise<Person> {
  await personById(db, id);
  if (id === actor.id && !roles.includes('admin')) {
    throw new ServiceError(409, 'You cannot take the admin role from yourself; ask another admin.', [
      { path: 'roles', message: 'must keep admin' },
    ]);
  }
  await db.transaction(async (trx) => {
    await replaceRoles(trx, id, roles);
    await auditPerson(trx, actor.id, 'person.roles', id, { roles }, now);
  });
  return personById(db, id);
}

/** Deactivation ends every session and withdraws open links at once (ASVS 5.0 V7.4.2). */
export async function deactivatePerson(db: Knex, id: number, actor: SessionUser, now = new Date()): Promise<Person> {
  await personById(db, id);
  if (id === actor.id) throw new ServiceError(409, 'You cannot deactivate yourself; ask another admin.');
  await db.transaction(async (trx) => {
    await setActive(trx, id, false, now);
    await invalidateUserSessions(trx, id);
    await withdrawTokens(trx, id, null, now);
    await auditPerson(trx, actor.id, 'person.deactivate', id, undefined, now);
  });
  return personById(db, id);
}

export async function reactivatePerson(db: Knex, id: number, actor: SessionUser, now = new Date()): Promise<Person> {
  await personById(db, id);
  await setActive(db, id, true, now);
  await auditPerson(db, actor.id, 'person.reactivate', id, undefined, now);
  return personById(db, id);
}

/**
 * What a person does for their own account: accept an invitation, reset a forgotten password by e-mail,
 * change the password. Setting a password (any way) ends every existing session.
 * A link's token is checked (rate limited per client address and per token, counted in MariaDB) before the
 * new password is looked at or hashed, so unauthenticated requests cannot buy CPU time with bad tokens.
 * OWASP ASVS 5.0 V6.4.1 (single-use, expiring links), V6.4.3 (forgotten-password process), V6.2.3 (change needs the
 * current password), V7.4.3 (sessions end on password change), V2.4.1 (anti-automation).
 */
import type { Knex } from 'knex';
import type { SessionInfo, SessionUser } from '../auth/types.ts';
import { hashPassword, verifyPassword } from '../auth/password.ts';
import { passwordProblem } from '../auth/password-rules.ts';
import { consumeToken, issueToken, peekToken, RESET_VALID_MINUTES, tokenBucketId, type TokenPurpose } from '../repos/account-tokens.ts';
import { createSession, invalidateUserSessions } from '../repos/sessions.ts';
import { findUserByEmail, findUserById, sessionUserOf, setPasswordHash } from '../repos/users.ts';
import { consume, reset, type RateLimit } from '../repos/rate-limit.ts';
import { accountBucket, SIGNIN_ACCOUNT_LIMIT } from '../auth/signin.ts';
import { resetMessage } from '../mail/messages.ts';
import { sendMailInBackground } from '../mail/send.ts';
import { ServiceError } from './errors.ts';
import { auditPerson } from '../repos/people-audit.ts';

/** Reset mails per address per hour, so the form cannot be used to flood someone's inbox. */
export const RESET_REQUEST_LIMIT: RateLimit = { limit: 5, windowSeconds: 60 * 60 };

/** Link uses (invite acceptance, reset) per client address in 15 minutes, whatever the token. */
export const TOKEN_ADDRESS_LIMIT: RateLimit = { limit: 20, windowSeconds: 15 * 60 };
/** Uses of one token in 15 minutes (a person retrying a refused password has room; guessing has none). */
export const TOKEN_USE_LIMIT: RateLimit = { limit: 8, windowSeconds: 15 * 60 };

export const tokenAddressBucket = (address: string): string => `token:address:${address}`;
export const tokenUseBucket = (token: string): string => `token:use:${tokenBucketId(token)}`;

export interface NewSession {
  token: string;
  session: SessionInfo;
  user: SessionUser;
}

function checkNewPassword(password: string, path: string): void {
  const problem = passwordProblem(password);
  if (problem) throw new ServiceError(400, problem, [{ path, message: problem }]);
}

/** Who an open invitation or reset link is for (name and e-mail for the page), or null. */
export async function tokenHolder(db: Knex, token: string, purpose: TokenPurpose, now = new Date()): Promise<SessionUser | null> {
  const userId = await peekToken(db, token, purpose, now);
  const row = userId === null ? null : await findUserById(db, userId);
  return row && row.active ? sessionUserOf(db, row) : null;
}

const linkNotValid = (): ServiceError =>
  new ServiceError(400, 'This link has expired or was already used. Ask for a new one.', [{ path: 'token', message: 'expired or used' }]);

async function limitLinkUse(db: Knex, token: string, clientAddress: string, now: Date): Promise<void> {
  for (const [bucket, rule] of [
    [tokenAddressBucket(clientAddress), TOKEN_ADDRESS_LIMIT],
    [tokenUseBucket(token), TOKEN_USE_LIMIT],
  ] as const) {
    const verdict = await consume(db, bucket, rule, now);
    if (!verdict.allowed)
      throw new ServiceError(
        429,
        'Too many tries with this link; wait a few minutes and try again.',
        [{ path: 'token', message: 'too many attempts' }],
        { 'Retry-After': String(verdict.retryAfterSeconds) },
      );
  }
}

/** Rate limit, then the token, then the password rules, and only then the (costly) hash. */
async function setPasswordWithToken(db: Knex, link: LinkUse, purpose: TokenPurpose, now: Date): Promise<number> {
  const { token, password, clientAddress } = link;
  await limitLinkUse(db, token, clientAddress, now);
  const holder = await tokenHolder(db, token, purpose, now);
  if (!holder) throw linkNotValid();
  checkNewPassword(password, 'password');
  const passwordHash = await hashPassword(password);
  return db.transaction(async (trx) => {
    // The conditional use in consumeToken settles a race between two uses of one link.
    const userId = await consumeToken(trx, token, purpose, now);
    const row = userId === null ? null : await findUserById(trx, userId);
    if (!row || !row.active) throw linkNotValid();
    await setPasswordHash(trx, row.id, passwordHash, now);
    await invalidateUserSessions(trx, row.id);
    await auditPerson(trx, row.id, purpose === 'invite' ? 'person.invite-accept' : 'person.password-reset', row.id, undefined, now);
    return row.id;
  });
}

export interface LinkUse {
  token: string;
  password: string;
  clientAddress: string;
}

/** The invitee chooses a password and is signed in. */
export async function acceptInvite(db: Knex, link: LinkUse, now = new Date()): Promise<NewSession> {
  const userId = await setPasswordWithToken(db, link, 'invite', now);
  const { token: sessionToken, session } = await createSession(db, userId, now);
  return { token: sessionToken, session, user: await sessionUserOf(db, (await findUserById(db, userId))!) };
}

/** Same answer and no mail-sending delay whether or not the address is known (ASVS 5.0 V6.3.8). */
export async function requestPasswordReset(db: Knex, email: string, baseUrl: string, now = new Date()): Promise<void> {
  const allowed = (await consume(db, `reset:account:${email.toLowerCase()}`, RESET_REQUEST_LIMIT, now)).allowed;
  const row = await findUserByEmail(db, email);
  if (!allowed || !row || !row.active) return;
  const token = await issueToken(db, { userId: row.id, purpose: 'reset', createdBy: null }, now);
  sendMailInBackground(
    row.email,
    resetMessage({ name: row.name, link: `${baseUrl}/reset?token=${token}`, validMinutes: RESET_VALID_MINUTES }),
  );
}

export async function resetPassword(db: Knex, link: LinkUse, now = new Date()): Promise<void> {
  const userId = await setPasswordWithToken(db, link, 'reset', now);
  const row = await findUserById(db, userId);
  if (row) await reset(db, accountBucket(row.email));
}

export interface PasswordChange {
  currentPassword: string;
  newPassword: string;
}

/** Ends every session of the person, then opens a fresh one for the browser that asked. */
export async function changePassword(db: Knex, user: SessionUser, change: PasswordChange, now = new Date()): Promise<NewSession> {
  const limited = !(await consume(db, accountBucket(user.email), SIGNIN_ACCOUNT_LIMIT, now)).allowed;
  if (limited)
    throw new ServiceError(429, 'Too many wrong passwords; wait a few minutes and try again.', [
      { path: 'currentPassword', message: 'too many attempts' },
    ]);
  const row = await findUserById(db, user.id);
  if (!row?.password_hash || !(await verifyPassword(row.password_hash, change.currentPassword))) {
    throw new ServiceError(400, 'The current password is not right.', [{ path: 'currentPassword', message: 'not right' }]);
  }
  checkNewPassword(change.newPassword, 'newPassword');
  await reset(db, accountBucket(user.email));
  const passwordHash = await hashPassword(change.newPassword);
  await db.transaction(async (trx) => {
    await setPasswordHash(trx, user.id, passwordHash, now);
    await invalidateUserSessions(trx, user.id);
    await auditPerson(trx, user.id, 'person.password-change', user.id, undefined, now);
  });
  const { token, session } = await createSession(db, user.id, now);
  return { token, session, user };
}

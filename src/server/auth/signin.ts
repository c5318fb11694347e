/**
 * Sign-in: rate limits per account and per client address (counted in MariaDB), a password check that
 * takes as long for an unknown address as for a known one, and one generic failure.
 * OWASP ASVS 5.0 V6.3.1 (brute force), V6.3.8 (no account enumeration), V7.2.4 (new session on sign-in).
 */
import type { Db } from '../db.ts';
import { hashPassword, verifyPassword } from './password.ts';
import { consume, refund, reset, type RateLimit } from '../repos/rate-limit.ts';
import { createSession } from '../repos/sessions.ts';
import { findUserByEmail, normalizeEmail, sessionUserOf } from '../repos/users.ts';
import type { SessionInfo, SessionUser } from './types.ts';

/** Failed attempts allowed per account in 15 minutes. */
export const SIGNIN_ACCOUNT_LIMIT: RateLimit = { limit: 10, windowSeconds: 15 * 60 };
/** Failed attempts allowed per client address in 15 minutes (offices share one address). */
export const SIGNIN_ADDRESS_LIMIT: RateLimit = { limit: 50, windowSeconds: 15 * 60 };

export const accountBucket = (email: string): string => `signin:account:${normalizeEmail(email)}`;
export const addressBucket = (address: string): string => `signin:address:${address}`;

export type SignInResult =
  | { kind: 'ok'; token: string; session: SessionInfo; user: SessionUser }
  | { kind: 'invalid' }
  | { kind: 'limited'; retryAfterSeconds: number };

let dummyHash: Promise<string> | null = null;
/** Verifying against a throw-away hash keeps an unknown address as slow as a known one. */
function dummyPasswordHash(): Promise<string> {
  dummyHash ??= hashPassword(crypto.randomUUID());
  return dummyHash;
}

export interface SignInInput {
  email: string;
  password: string;
  clientAddress: string;
}

export async function signIn(db: Db, input: SignInInput, now: Date = new Date()): Promise<SignInResult> {
  const byAccount = await consume(db, accountBucket(input.email), SIGNIN_ACCOUNT_LIMIT, now);
  const byAddress = await consume(db, addressBucket(input.clientAddress), SIGNIN_ADDRESS_LIMIT, now);
  if (!byAccount.allowed || !byAddress.allowed) {
    return { kind: 'limited', retryAfterSeconds: Math.max(byAccount.retryAfterSeconds, byAddress.retryAfterSeconds) };
  }
  const row = await findUserByEmail(db, input.email);
  const ok = await verifyPassword(row?.password_hash ?? (await dummyPasswordHash()), input.password);
  if (!row || !row.active || row.password_hash === null || !ok) return { kind: 'invalid' };
  await reset(db, accountBucket(input.email));
  await refund(db, addressBucket(input.clientAddress));
  const { token, session } = await createSession(db, row.id, now);
  return { kind: 'ok', token, session, user: await sessionUserOf(db, row) };
}

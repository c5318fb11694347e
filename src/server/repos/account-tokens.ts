/**
 * Single-use e-mailed tokens (invitations, password resets). The token is 256 random bits; only its
 * SHA-256 is stored, and it is looked up by that hash, so a database reader cannot use a token and the
 * lookup's timing says nothing about the token. Issuing a new one withdraws the open ones of the same kind.
 * OWASP ASVS 5.0 V6.4.1 (random, expiring, single-use activation codes), V6.4.3 (secure forgotten-password process).
 */
import { sha256 } from '@oslojs/crypto/sha2';
import { encodeBase32LowerCaseNoPadding } from '@oslojs/encoding';
import type { Db } from '../db.ts';

export type TokenPurpose = 'invite' | 'reset';
export const INVITE_VALID_HOURS = 72;
export const RESET_VALID_MINUTES = 30;
export const TOKEN_TTL_MS: Readonly<Record<TokenPurpose, number>> = {
  invite: INVITE_VALID_HOURS * 60 * 60 * 1000,
  reset: RESET_VALID_MINUTES * 60 * 1000,
};

function tokenHash(token: string): Buffer {
  return Buffer.from(sha256(new TextEncoder().encode(token)));
}

/** A name for the token in rate-limit buckets (its SHA-256 in hex: the token itself is never stored). */
export const tokenBucketId = (token: string): string => tokenHash(token).toString('hex');

export interface IssueInput {
  userId: number;
  purpose: TokenPurpose;
  createdBy: number | null;
}

export async function issueToken(db: Db, input: IssueInput, now: Date = new Date()): Promise<string> {
  const bytes = new Uint8Array(32);
  crypto.getRandomValues(bytes);
  const token = encodeBase32LowerCaseNoPadding(bytes);
  await withdrawTokens(db, input.userId, input.purpose, now);
  await db('account_tokens').insert({
    token_hash: tokenHash(token),
    purpose: input.purpose,
    user_id: input.userId,
    created_by: input.createdBy,
    created_at: now,
    expires_at: new Date(now.getTime() + TOKEN_TTL_MS[input.purpose]),
    used_at: null,
  });
  return token;
}

export async function withdrawTokens(db: Db, userId: number, purpose: TokenPurpose | null, now: Date): Promise<void> {
  const q = db('account_tokens').where({ user_id: userId }).whereNull('used_at');
  await (purpose ? q.andWhere({ purpose }) : q).update({ used_at: now });
}

function openToken(db: Db, token: string, purpose: TokenPurpose, now: Date) {
  return db('account_tokens')
    .where({ token_hash: tokenHash(token), purpose })
    .whereNull('used_at')
    .where('expires_at', '>', now);
}

/** The person an open token belongs to, without using it up (to show the accept page). */
export async function peekToken(db: Db, token: string, purpose: TokenPurpose, now: Date = new Date()): Promise<number | null> {
  if (!/^[a-z2-7]{52}$/.test(token)) return null;
  const row: { user_id: number } | undefined = await openToken(db, token, purpose, now).first('user_id');
  return row ? row.user_id : null;
}

/** Uses the token up; the person it belongs to, or null when unknown, used, withdrawn or expired. */
export async function consumeToken(db: Db, token: string, purpose: TokenPurpose, now: Date = new Date()): Promise<number | null> {
  const userId = await peekToken(db, token, purpose, now);
  if (userId === null) return null;
  // The conditional update is the single-use guarantee: of two racing uses only one changes a row.
  const changed = await openToken(db, token, purpose, now).update({ used_at: now });
  return changed === 1 ? userId : null;
}

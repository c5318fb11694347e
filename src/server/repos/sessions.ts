/**
 * Sessions after the Lucia sessions guide, with @oslojs: the token is `id.secret`, both halves random
 * from the platform CSPRNG; only SHA-256(secret) is stored and it is compared in constant time.
 * Every function takes `now` so tests can move the clock. OWASP ASVS 5.0 V7 (session management).
 */
import { sha256 } from '@oslojs/crypto/sha2';
import { constantTimeEqual } from '@oslojs/crypto/subtle';
import { encodeBase32LowerCaseNoPadding } from '@oslojs/encoding';
import type { Db } from '../db.ts';
import type { SessionInfo, SessionUser } from '../auth/types.ts';
import { findUserById, sessionUserOf } from './users.ts';

const HOUR_MS = 60 * 60 * 1000;
const DAY_MS = 24 * HOUR_MS;
/** Idle timeout: a session unused this long ends (ASVS 5.0 V7.3.1). */
export const SESSION_IDLE_MS = 7 * DAY_MS;
/** Absolute timeout: a session ends this long after sign-in, however busy (ASVS 5.0 V7.3.2). */
export const SESSION_ABSOLUTE_MS = 30 * DAY_MS;
/** The idle clock is pushed forward at most this often, to spare the database a write per request. */
export const SESSION_REFRESH_MS = HOUR_MS;

interface SessionRow {
  id: string;
  secret_hash: Buffer;
  user_id: number;
  created_at: Date;
  last_active_at: Date;
}

export interface ValidSession {
  session: SessionInfo;
  user: SessionUser;
  /** True when the idle clock moved: the cookie's expiry should be sent again. */
  refreshed: boolean;
}

/** 20 random bytes (160 bits) as lower-case base32: 32 characters. ASVS 5.0 V7.2.3 (≥ 128 bits). */
function randomPart(): string {
  const bytes = new Uint8Array(20);
  crypto.getRandomValues(bytes);
  return encodeBase32LowerCaseNoPadding(bytes);
}

function hashSecret(secret: string): Uint8Array {
  return sha256(new TextEncoder().encode(secret));
}

export function sessionExpiresAt(createdAt: Date, lastActiveAt: Date): Date {
  return new Date(Math.min(lastActiveAt.getTime() + SESSION_IDLE_MS, createdAt.getTime() + SESSION_ABSOLUTE_MS));
}

export async function createSession(db: Db, userId: number, now: Date = new Date()): Promise<{ token: string; session: SessionInfo }> {
  const id = randomPart();
  const secret = randomPart();
  await db('sessions').insert({ id, secret_hash: Buffer.from(hashSecret(secret)), user_id: userId, created_at: now, last_active_at: now });
  return { token: `${id}.${secret}`, session: { id, expiresAt: sessionExpiresAt(now, now) } };
}

function splitToken(token: string): [string, string] | null {
  const parts = token.split('.');
  if (parts.length !== 2 || !/^[a-z2-7]{32}$/.test(parts[0]) || !/^[a-z2-7]{32}$/.test(parts[1])) return null;
  return [parts[0], parts[1]];
}

/** The session and person behind a token, or null (unknown, wrong secret, expired, person deactivated). */
export async function validateSessionToken(db: Db, token: string, now: Date = new Date()): Promise<ValidSession | null> {
  const parts = splitToken(token);
  if (!parts) return null;
  const [id, secret] = parts;
  const row: SessionRow | undefined = await db<SessionRow>('sessions').where({ id }).first();
  if (!row) return null;
  if (!constantTimeEqual(hashSecret(secret), new Uint8Array(row.secret_hash))) return null;
  const createdAt = new Date(row.created_at);
  let lastActiveAt = new Date(row.last_active_at);
  if (now.getTime() >= sessionExpiresAt(createdAt, lastActiveAt).getTime()) {
    await invalidateSession(db, id);
    return null;
  }
  const userRow = await findUserById(db, row.user_id);
  if (!userRow || !userRow.active) {
    await invalidateSession(db, id);
    return null;
  }
  const refreshed = now.getTime() - lastActiveAt.getTime() >= SESSION_REFRESH_MS;
  if (refreshed) {
    lastActiveAt = now;
    await db('sessions').where({ id }).update({ last_active_at: now });
  }
  const user = await sessionUserOf(db, userRow);
  return { session: { id, expiresAt: sessionExpiresAt(createdAt, lastActiveAt) }, user, refreshed };
}

export async function invalidateSession(db: Db, sessionId: string): Promise<void> {
  await db('sessions').where({ id: sessionId }).delete();
}

/** Sign out everywhere; also on password change and deactivation (ASVS 5.0 V7.4.3, V7.4.2). */
export async function invalidateUserSessions(db: Db, userId: number): Promise<number> {
  return db('sessions').where({ user_id: userId }).delete();
}

/** The session id (public half) of a token, for signing out without a database round trip first. */
export function sessionIdOf(token: string): string | null {
  return splitToken(token)?.[0] ?? null;
}

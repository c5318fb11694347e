/**
 * The catalogue's version (db/migrations/20261203180000_create_catalogue_version.ts): one token per writer
 * slot, changed by trigger in every transaction that writes what the match reads. Equal answers from two
 * reads mean nothing was committed in between.
 */
import type { Db } from '../db.ts';

/** 8 tables × insert, update, delete. */
export const CATALOGUE_TRIGGER_COUNT = 24;

/** The version as one string (the tokens are 64-bit, so read as text). */
export async function catalogueVersion(db: Db): Promise<string> {
  const rows: { slot: number; token: string }[] = await db('catalogue_version')
    .select('slot', db.raw('CAST(token AS CHAR) AS token'))
    .orderBy('slot');
  return rows.map((r) => `${r.slot}:${r.token}`).join(',');
}

/** True when every catalogue-version trigger exists (they are left out where the server does not allow them). */
export async function catalogueTriggersInstalled(db: Db): Promise<boolean> {
  const [rows] = (await db.raw(
    "SELECT COUNT(*) AS n FROM information_schema.TRIGGERS WHERE TRIGGER_SCHEMA = DATABASE() AND TRIGGER_NAME LIKE 'catver\\_%'",
  )) as [{ n: number | string }[]];
  return Number(rows[0]?.n ?? 0) === CATALOGUE_TRIGGER_COUNT;
}

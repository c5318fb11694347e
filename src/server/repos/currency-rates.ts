/** The rates table: foreign currencies into the organisation's currency (see the migration's comments). */
import type { Db } from '../db.ts';
import type { CurrencyRate } from '../../lib/buying.ts';
import { isoDate } from './part-mapping.ts';

interface DbCurrencyRateRow {
  id: number;
  currency: string;
  rate_to_org: string | number;
  as_of: Date | string;
  set_by: number | null;
  updated_at: Date;
}

export interface StoredCurrencyRate extends CurrencyRate {
  id: number;
  setByName: string | null;
  updatedAt: string;
}

function fromRow(row: DbCurrencyRateRow & { set_by_name?: string | null }): StoredCurrencyRate {
  return {
    id: row.id,
    currency: row.currency,
    rateToOrg: Number(row.rate_to_org),
    asOf: isoDate(row.as_of) as string,
    setByName: row.set_by_name ?? null,
    updatedAt: row.updated_at.toISOString(),
  };
}

export async function listCurrencyRates(db: Db): Promise<StoredCurrencyRate[]> {
  const rows = await db('currency_rates as r')
    .leftJoin('users as u', 'u.id', 'r.set_by')
    .select('r.*', 'u.name as set_by_name')
    .orderBy('r.currency');
  return rows.map(fromRow);
}

/** The row of a currency, locked for the rest of the transaction; null when there is none yet. */
export async function lockCurrencyRate(trx: Db, currency: string): Promise<StoredCurrencyRate | null> {
  const row = await trx('currency_rates').where({ currency }).forUpdate().first();
  return row ? fromRow(row) : null;
}

/** Inserts or replaces the rate of a currency; returns its id. */
export async function upsertCurrencyRate(
  trx: Db,
  rate: { currency: string; rateToOrg: number; asOf: string; setBy: number | null },
): Promise<number> {
  await trx('currency_rates')
    .insert({ currency: rate.currency, rate_to_org: rate.rateToOrg, as_of: rate.asOf, set_by: rate.setBy })
    .onConflict('currency')
    .merge({ rate_to_org: rate.rateToOrg, as_of: rate.asOf, set_by: rate.setBy, updated_at: trx.fn.now(3) });
  const row = await trx('currency_rates').select('id').where({ currency: rate.currency }).first();
  return row.id as number;
}

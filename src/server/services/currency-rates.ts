/** The exchange rates an admin keeps; every change is written with who set it and an audit event. */
import { db } from '../db.ts';
import { appConfig } from '../config.ts';
import type { SessionUser } from '../auth/types.ts';
import type { CurrencyRateInput } from '../../lib/schemas/rates.ts';
import { insertAuditEvent } from '../repos/audit.ts';
import { listCurrencyRates, lockCurrencyRate, upsertCurrencyRate, type StoredCurrencyRate } from '../repos/currency-rates.ts';
import { ServiceError } from './errors.ts';

export interface RatesView {
  orgCurrency: string;
  rates: StoredCurrencyRate[];
}

export async function currencyRates(): Promise<RatesView> {
  return { orgCurrency: appConfig().buying.orgCurrency, rates: await listCurrencyRates(db()) };
}

/** Sets (or replaces) one currency's rate into the organisation's currency. */
export async function setCurrencyRate(actor: SessionUser, input: CurrencyRateInput): Promise<StoredCurrencyRate> {
  const org = appConfig().buying.orgCurrency;
  if (input.currency === org)
    throw new ServiceError(400, `${org} is the organisation's currency: it needs no rate.`, [
      { path: 'currency', message: `${org} converts 1:1 into itself` },
    ]);
  await db().transaction(async (trx) => {
    const before = await lockCurrencyRate(trx, input.currency);
    const id = await upsertCurrencyRate(trx, { ...input, setBy: actor.id });
    await insertAuditEvent(trx, {
      actorUserId: actor.id,
      action: 'currency_rate.set',
      entityType: 'currency_rate',
      entityId: id,
      before: before && { currency: before.currency, rateToOrg: before.rateToOrg, asOf: before.asOf },
      after: { currency: input.currency, rateToOrg: input.rateToOrg, asOf: input.asOf, orgCurrency: org },
    });
  });
  const stored = (await listCurrencyRates(db())).find((r) => r.currency === input.currency);
  if (!stored) throw new ServiceError(409, 'The rate was removed while it was being saved. Try again.');
  return stored;
}

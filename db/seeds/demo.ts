/**
 * Demo data for the invented Kestrel Fluidics scenario: people and the parts catalogue.
 * Idempotent: a part is inserted only when its (manufacturer, mpn) is absent, a person only when the
 * e-mail is absent, so a second run adds nothing.
 */
import type { Knex } from 'knex';
import { insertPart, findPartId, type NewPart } from '../../src/server/repos/parts.ts';
import { hashPassword } from '../../src/server/auth/password.ts';
import { demoDiodes, demoDrivers, demoMosfets, demoMotors } from './data/index.ts';
import { seedDesigns } from './designs.ts';
import { appConfig } from '../../src/server/config.ts';

export const DEMO_PASSWORD = 'stallpoint-demo';
export const DEMO_DOMAIN = 'kestrel-fluidics.example';

export const demoPeople = [
  { email: `admin@${DEMO_DOMAIN}`, name: 'Ada Brennan', roles: ['admin'] },
  { email: `librarian@${DEMO_DOMAIN}`, name: 'Luis Ferreira', roles: ['librarian'] },
  { email: `designer@${DEMO_DOMAIN}`, name: 'Dana Okafor', roles: ['designer'] },
  { email: `buyer@${DEMO_DOMAIN}`, name: 'Bea Lindqvist', roles: ['buyer'] },
] as const;

async function seedPeople(knex: Knex): Promise<Map<string, number>> {
  const ids = new Map<string, number>();
  let passwordHash: string | null = null;
  for (const person of demoPeople) {
    const existing = await knex('users').select('id').where({ email: person.email }).first();
    if (existing) {
      ids.set(person.email, existing.id);
      continue;
    }
    passwordHash ??= await hashPassword(DEMO_PASSWORD);
    await knex.transaction(async (trx) => {
      const [id] = await trx('users').insert({ email: person.email, name: person.name, password_hash: passwordHash });
      await trx('user_roles').insert(person.roles.map((role) => ({ user_id: id, role })));
      ids.set(person.email, id);
    });
  }
  return ids;
}

export function demoParts(): NewPart[] {
  return [...demoMotors, ...demoMosfets, ...demoDrivers, ...demoDiodes] as NewPart[];
}

/** The catalogue is entered by the librarian, except the parts waiting for review: a designer proposed those. */
async function seedParts(knex: Knex, librarianId: number | null, designerId: number | null): Promise<number> {
  let added = 0;
  for (const part of demoParts()) {
    if ((await findPartId(knex, part.manufacturer, part.mpn)) !== null) continue;
    await knex.transaction(async (trx) => {
      await insertPart(trx, part, part.reviewStatus === 'pending' ? (designerId ?? librarianId) : librarianId);
    });
    added += 1;
  }
  return added;
}

/** Invented exchange rates (not market data): the value of one unit in EUR, set on an invented day. */
export const DEMO_EUR_VALUE: Readonly<Record<string, number>> = { EUR: 1, USD: 0.915, GBP: 1.172 };
export const DEMO_RATES_AS_OF = '2026-12-01';

/**
 * The rates table for the organisation's currency: each demo currency other than it, crossed through the
 * EUR values above. Only currencies without a row get one, so an admin's rate is never overwritten.
 */
async function seedCurrencyRates(knex: Knex, orgCurrency: string): Promise<void> {
  const orgInEur = DEMO_EUR_VALUE[orgCurrency];
  if (orgInEur === undefined) return; // an organisation currency the demo has no figure for: the admin enters rates
  for (const [currency, inEur] of Object.entries(DEMO_EUR_VALUE)) {
    if (currency === orgCurrency || (await knex('currency_rates').where({ currency }).first())) continue;
    await knex('currency_rates').insert({ currency, rate_to_org: Number((inEur / orgInEur).toFixed(8)), as_of: DEMO_RATES_AS_OF });
  }
}

export interface SeedReport {
  partsAdded: number;
  designsAdded: number;
}

export async function seed(knex: Knex): Promise<SeedReport> {
  const people = await seedPeople(knex);
  const designer = people.get(`designer@${DEMO_DOMAIN}`);
  const partsAdded = await seedParts(knex, people.get(`librarian@${DEMO_DOMAIN}`) ?? null, designer ?? null);
  const designsAdded = designer ? await seedDesigns(knex, designer) : 0;
  await seedCurrencyRates(knex, appConfig().buying.orgCurrency);
  return { partsAdded, designsAdded };
}

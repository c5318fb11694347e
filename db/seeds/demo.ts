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

export interface SeedReport {
  partsAdded: number;
  designsAdded: number;
}

export async function seed(knex: Knex): Promise<SeedReport> {
  const people = await seedPeople(knex);
  const designer = people.get(`designer@${DEMO_DOMAIN}`);
  const partsAdded = await seedParts(knex, people.get(`librarian@${DEMO_DOMAIN}`) ?? null, designer ?? null);
  const designsAdded = designer ? await seedDesigns(knex, designer) : 0;
  return { partsAdded, designsAdded };
}

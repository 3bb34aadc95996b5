import { count, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type DbHandle } from './client.js';
import { pgErrorOf } from './errors.js';
import { memberships, operations, parties, users } from './schema/index.js';
import { seedDemo } from './seed.js';
import { createScratchDatabase } from './test-db.js';

const baseUrl = process.env.DATABASE_URL;
if (!baseUrl) throw new Error('DATABASE_URL is not set: run the tests through `npm test`.');

let scratch: Awaited<ReturnType<typeof createScratchDatabase>>;
let h: DbHandle;

beforeAll(async () => {
  scratch = await createScratchDatabase(baseUrl);
  h = createDb(scratch.url, { max: 4 });
});
afterAll(async () => {
  await h.close();
  await scratch.drop();
});

describe('demo seed', () => {
  it('seeds the demo outfit once and leaves it alone on a second and a concurrent run', async () => {
    expect(await seedDemo(h.db)).toBe('seeded');
    const again = await Promise.all([seedDemo(h.db), seedDemo(h.db)]);
    expect(again).toEqual(['already-seeded', 'already-seeded']);
    expect((await h.db.select({ n: count() }).from(operations))[0]!.n).toBe(1);
    expect((await h.db.select({ n: count() }).from(users))[0]!.n).toBe(6);
  });

  it('has three households, two neighbours and a township road district', async () => {
    const rows = await h.db.select({ kind: parties.kind, relationship: parties.relationship }).from(parties);
    expect(rows.filter((r) => r.kind === 'household')).toHaveLength(3);
    expect(rows.filter((r) => r.kind === 'customer' && r.relationship === 'neighbour')).toHaveLength(2);
    expect(rows.filter((r) => r.kind === 'customer' && r.relationship === 'agency')).toHaveLength(1);
  });

  it('ties the two demo customers to different customer parties', async () => {
    const rows = await h.db
      .select({ email: users.email, partyId: memberships.partyId, kind: parties.kind })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .innerJoin(parties, eq(parties.id, memberships.partyId))
      .where(eq(memberships.role, 'customer'));
    expect(rows.map((r) => r.email).sort()).toEqual(['customer2@hitchbook.test', 'customer@hitchbook.test']);
    expect(new Set(rows.map((r) => r.partyId)).size).toBe(2);
    expect(rows.every((r) => r.kind === 'customer')).toBe(true);
  });
});

async function violated(promise: Promise<unknown>): Promise<string | undefined> {
  try {
    await promise;
  } catch (err) {
    return pgErrorOf(err)?.constraint;
  }
  throw new Error('the insert was accepted');
}

describe('constraints', () => {
  it('refuses a membership that points at a party of another operation', async () => {
    const [a] = await h.db.insert(operations).values({ name: 'A' }).returning();
    const [b] = await h.db.insert(operations).values({ name: 'B' }).returning();
    const [partyOfB] = await h.db.insert(parties).values({ operationId: b!.id, kind: 'household', name: 'B home', relationship: 'family' }).returning();
    const [u] = await h.db.insert(users).values({ email: 'cross@example.test', name: 'Cross' }).returning();
    expect(await violated(h.db.insert(memberships).values({ operationId: a!.id, userId: u!.id, role: 'partner', partyId: partyOfB!.id }))).toBe('memberships_party_fk');
  });

  it('refuses a customer membership without a party and a duplicate e-mail in any letter case', async () => {
    const [op] = await h.db.insert(operations).values({ name: 'C' }).returning();
    const [u] = await h.db.insert(users).values({ email: 'case@example.test', name: 'Case' }).returning();
    expect(await violated(h.db.insert(memberships).values({ operationId: op!.id, userId: u!.id, role: 'customer' }))).toBe('memberships_customer_party_check');
    expect(await violated(h.db.insert(users).values({ email: 'CASE@example.test', name: 'Case again' }))).toBe('users_email_lower_idx');
  });
});

import { fileURLToPath } from 'node:url';
import bcrypt from 'bcrypt';
import { sql } from 'drizzle-orm';
import { createDb, type Database, type Transaction } from './client.js';
import { seedBilling } from './demo/billing.js';
import { seedFleet } from './demo/fleet.js';
import { DEMO_PASSWORD, demoCustomers, demoHouseholds, demoOperation, demoUsers } from './demo/people.js';
import { seedSquareUp } from './demo/square-up.js';
import { seedWork } from './demo/work.js';
import { memberships, operations, parties, users } from './schema/index.js';

export const BCRYPT_COST = 12;

/** What the foundation part of the seed created, for the parts that build on it. */
export interface DemoContext {
  operationId: string;
  /** Party ids by the keys in demo/people.ts. */
  partyIds: Map<string, string>;
  /** User ids by e-mail. */
  userIds: Map<string, string>;
}

/** Later parts of the demo (fleet, work, billing, square-up); each runs once, in order, in the seed's transaction. */
export type DemoPart = (tx: Transaction, ctx: DemoContext) => Promise<void>;
const demoParts: DemoPart[] = [seedFleet, seedWork, seedBilling, seedSquareUp];

/** Seeds the invented demo outfit once; a second run finds the owner and leaves everything alone. */
export async function seedDemo(db: Database): Promise<'seeded' | 'already-seeded'> {
  return db.transaction(async (tx) => {
    // Serialises concurrent seed runs so two starts cannot both insert the demo.
    await tx.execute(sql`select pg_advisory_xact_lock(424242)`);
    const existing = await tx.select({ id: users.id }).from(users).where(sql`lower(${users.email}) = 'owner@hitchbook.test'`);
    if (existing.length > 0) return 'already-seeded';

    const [operation] = await tx.insert(operations).values(demoOperation).returning();
    if (!operation) throw new Error('operation insert returned nothing');

    const partyIds = new Map<string, string>();
    for (const h of demoHouseholds) {
      const [row] = await tx
        .insert(parties)
        .values({ operationId: operation.id, kind: 'household', name: h.name, relationship: h.relationship, notes: h.notes })
        .returning({ id: parties.id });
      partyIds.set(h.key, row!.id);
    }
    for (const c of demoCustomers) {
      const [row] = await tx
        .insert(parties)
        .values({ operationId: operation.id, kind: 'customer', name: c.name, relationship: c.relationship, email: c.email, address: c.address })
        .returning({ id: parties.id });
      partyIds.set(c.key, row!.id);
    }

    const userIds = new Map<string, string>();
    for (const u of demoUsers) {
      const passwordHash = await bcrypt.hash(DEMO_PASSWORD, BCRYPT_COST);
      const [user] = await tx
        .insert(users)
        .values({ email: u.email, name: u.name, passwordHash, passwordChangedAt: new Date() })
        .returning({ id: users.id });
      userIds.set(u.email, user!.id);
      await tx.insert(memberships).values({
        operationId: operation.id,
        userId: user!.id,
        role: u.role,
        partyId: u.party ? partyIds.get(u.party)! : null,
      });
    }
    const ctx: DemoContext = { operationId: operation.id, partyIds, userIds };
    for (const part of demoParts) await part(tx, ctx);
    return 'seeded';
  });
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const url = process.env.DATABASE_URL;
  if (!url) {
    console.error('DATABASE_URL is not set.');
    process.exit(1);
  }
  const handle = createDb(url, { max: 1, applicationName: 'hitchbook-seed' });
  seedDemo(handle.db)
    .then((result) => console.log(result === 'seeded' ? 'Demo data seeded.' : 'Demo data already present; nothing changed.'))
    .catch((err: unknown) => {
      console.error('Seeding failed:', err instanceof Error ? err.message : err);
      process.exitCode = 1;
    })
    .finally(() => handle.close());
}

import { randomUUID } from 'node:crypto';
import bcrypt from 'bcrypt';
import { memberships, operations, parties, users, type Database } from '@hitchbook/db';
import type { Role } from '@hitchbook/shared/roles';
import { seedDefaultWorkTypes } from '../modules/work-types/default-work-types.js';
import type { TestApp } from './test-app.js';

export const FIXTURE_PASSWORD = 'correct-horse-battery';
let fixtureHash: Promise<string> | null = null;

export interface OperationFixture {
  operationId: string;
  households: [string, string];
  customers: [string, string];
  /** One member per role; two customers tied to different customer parties. */
  members: Record<Role | 'customer2', { userId: string; membershipId: string; email: string }>;
}

/** A fresh operation with its own people, so tests never share mutable rows. */
export async function createOperation(db: Database, label = 'Test outfit'): Promise<OperationFixture> {
  const passwordHash = await (fixtureHash ??= bcrypt.hash(FIXTURE_PASSWORD, 4));
  const tag = randomUUID().slice(0, 8);
  const [op] = await db.insert(operations).values({ name: `${label} ${tag}` }).returning({ id: operations.id });
  const operationId = op!.id;
  await seedDefaultWorkTypes(db, operationId);
  const partyRows = await db
    .insert(parties)
    .values([
      { operationId, kind: 'household', name: `Household A ${tag}`, relationship: 'family' },
      { operationId, kind: 'household', name: `Household B ${tag}`, relationship: 'family' },
      { operationId, kind: 'customer', name: `Neighbour C ${tag}`, relationship: 'neighbour', email: `c-${tag}@example.test`, phone: '555-0100' },
      { operationId, kind: 'customer', name: `Agency D ${tag}`, relationship: 'agency' },
    ])
    .returning({ id: parties.id });
  const [hA, hB, cC, cD] = partyRows.map((r) => r.id) as [string, string, string, string];
  const plan: Array<[Role | 'customer2', Role, string | null]> = [
    ['owner', 'owner', hA],
    ['partner', 'partner', hB],
    ['operator', 'operator', null],
    ['bookkeeper', 'bookkeeper', null],
    ['customer', 'customer', cC],
    ['customer2', 'customer', cD],
  ];
  const members = {} as OperationFixture['members'];
  for (const [key, role, partyId] of plan) {
    const email = `${key}-${tag}@example.test`;
    const [u] = await db.insert(users).values({ email, name: `${key} ${tag}`, passwordHash }).returning({ id: users.id });
    const [m] = await db.insert(memberships).values({ operationId, userId: u!.id, role, partyId }).returning({ id: memberships.id });
    members[key] = { userId: u!.id, membershipId: m!.id, email };
  }
  return { operationId, households: [hA, hB], customers: [cC, cD], members };
}

export async function signIn(t: TestApp, email: string, password = FIXTURE_PASSWORD): Promise<{ token: string; cookie: string }> {
  const res = await t.http().post('/api/auth/login').send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in of ${email} failed with ${res.status}: ${JSON.stringify(res.body)}`);
  const setCookie = res.headers['set-cookie'] as unknown as string[];
  return { token: res.body.accessToken as string, cookie: setCookie.map((c) => c.split(';')[0]).join('; ') };
}

export async function signInAll(t: TestApp, fx: OperationFixture): Promise<Record<keyof OperationFixture['members'], string>> {
  const out = {} as Record<keyof OperationFixture['members'], string>;
  for (const key of Object.keys(fx.members) as Array<keyof OperationFixture['members']>) {
    out[key] = (await signIn(t, fx.members[key].email)).token;
  }
  return out;
}

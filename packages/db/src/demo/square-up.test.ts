import { Decimal } from 'decimal.js';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SquareUpStatementDto } from '@hitchbook/shared/schemas/square-ups';
import { needsActualRates, squareUpStatementOrThrow } from '@hitchbook/shared/square-up';
import { createDb, type DbHandle } from '../client.js';
import { seedDemo } from '../seed.js';
import { actualMachineRates, statementSums } from '../square-up-sums.js';
import { createScratchDatabase } from '../test-db.js';

const baseUrl = process.env.DATABASE_URL;
if (!baseUrl) throw new Error('DATABASE_URL is not set: run the tests through `npm test`.');

let scratch: Awaited<ReturnType<typeof createScratchDatabase>>;
let h: DbHandle;

type PeriodRow = {
  id: string;
  operation_id: string;
  name: string;
  period_from: string;
  period_to: string;
  status: 'open' | 'closed';
  statement: SquareUpStatementDto | null;
};

let periods: PeriodRow[];

beforeAll(async () => {
  scratch = await createScratchDatabase(baseUrl);
  h = createDb(scratch.url, { max: 2 });
  await seedDemo(h.db);
  periods = (await h.db.execute<PeriodRow>(sql`
    select id, operation_id, name, period_from::text, period_to::text, status, statement from square_ups order by period_from`)).rows;
}, 120_000);
afterAll(async () => {
  await h.close();
  await scratch.drop();
});

describe('demo square-ups', () => {
  it('has last season closed and this season open, back to back, this one covering today', () => {
    expect(periods.map((p) => p.status)).toEqual(['closed', 'open']);
    const [last, current] = periods as [PeriodRow, PeriodRow];
    const dayAfter = new Date(Date.parse(`${last.period_to}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);
    expect(current.period_from).toBe(dayAfter);
    const today = new Date().toISOString().slice(0, 10);
    expect(current.period_from <= today && today <= current.period_to).toBe(true);
  });

  it('froze a statement that a fresh computation from the same rows reproduces, with balances summing to zero', async () => {
    const last = periods[0]!;
    const frozen = last.statement!;
    expect(frozen.frozen).toBe(true);
    expect(frozen.transfers.length).toBeGreaterThan(0);
    const scope = { operationId: last.operation_id, from: last.period_from, to: last.period_to };
    const sums = await statementSums(h.db, scope);
    const actual = needsActualRates(sums) ? await actualMachineRates(h.db, last.operation_id, Number(last.period_to.slice(0, 4))) : new Map();
    const fresh = squareUpStatementOrThrow(frozen.squareUp, sums, actual, frozen.computedAt);
    expect(fresh.households).toEqual(frozen.households);
    expect(fresh.totals).toEqual(frozen.totals);
    expect(fresh.transfers.map(({ id: _id, ...t }) => t)).toEqual(frozen.transfers.map(({ id: _id, ...t }) => t));
    const net = frozen.households.reduce((sum, row) => sum.plus(row.balance), new Decimal(0));
    expect(net.toFixed(2)).toBe('0.00');
  });

  it('recorded every transfer of last season as paid, and squared its family work', async () => {
    const last = periods[0]!;
    const transfers = (await h.db.execute<{ amount: string; paid_on: string | null; method: string | null }>(sql`
      select amount::text, paid_on::text, method from square_up_transfers where square_up_id = ${last.id} order by position`)).rows;
    expect(transfers.map((t) => t.amount)).toEqual(last.statement!.transfers.map((t) => t.amount));
    expect(transfers.every((t) => t.paid_on !== null && t.method !== null)).toBe(true);
    const states = (await h.db.execute<{ state: string; n: number }>(sql`
      select we.state, count(*)::int as n from work_entries we join parties p on p.id = we.bill_to_party_id
      where p.kind = 'household' and we.work_date between ${last.period_from} and ${last.period_to} group by we.state`)).rows;
    expect(states.find((s) => s.state === 'squared')?.n).toBeGreaterThan(0);
    expect(states.find((s) => s.state === 'approved')).toBeUndefined();
  });
});

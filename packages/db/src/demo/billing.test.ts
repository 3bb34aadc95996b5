import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type DbHandle } from '../client.js';
import { seedDemo } from '../seed.js';
import { createScratchDatabase } from '../test-db.js';

const baseUrl = process.env.DATABASE_URL;
if (!baseUrl) throw new Error('DATABASE_URL is not set: run the tests through `npm test`.');

let scratch: Awaited<ReturnType<typeof createScratchDatabase>>;
let h: DbHandle;

beforeAll(async () => {
  scratch = await createScratchDatabase(baseUrl);
  h = createDb(scratch.url, { max: 2 });
  await seedDemo(h.db);
});
afterAll(async () => {
  await h.close();
  await scratch.drop();
});

async function rows<T>(query: ReturnType<typeof sql>): Promise<T[]> {
  return (await h.db.execute(query)).rows as T[];
}

describe('demo rate sheets and invoices', () => {
  it('has a family, a neighbour and an agency sheet and one party override, covering the work billed to customers', async () => {
    const sheets = await rows<{ relationship: string; party: string | null }>(sql`select s.relationship, p.name as party from rate_sheets s left join parties p on p.id = s.party_id order by 1, 2`);
    expect(sheets).toEqual([
      { relationship: 'agency', party: null },
      { relationship: 'family', party: null },
      { relationship: 'neighbour', party: 'Okonkwo Dairy (Emeka Okonkwo)' },
      { relationship: 'neighbour', party: null },
    ]);
    const unpriced = await rows<{ key: string }>(sql`
      select distinct wt.key from work_entries w join parties p on p.id = w.bill_to_party_id join work_types wt on wt.id = w.work_type_id
      where p.kind = 'customer' and not exists (
        select 1 from rate_sheets s join rate_sheet_lines l on l.rate_sheet_id = s.id
        where s.relationship = p.relationship and s.party_id is null and l.work_type_id = w.work_type_id and l.unit = wt.default_unit)`);
    expect(unpriced).toEqual([]);
    const [rates] = await rows<{ machines: number; rated: number }>(sql`
      select (select count(*)::int from machines) as machines,
             (select count(*)::int from machine_rates r join rate_sheets s on s.id = r.rate_sheet_id where s.relationship = 'family') as rated`);
    expect(rates!.rated).toBe(rates!.machines);
  });

  it('has a paid invoice and an open one for the neighbours, numbered 1 and 2 in date order, with the counter at 3', async () => {
    const issued = await rows<{ number: number; party: string; issue_date: string; total: string; amount_paid: string; due_date: string; past_due: boolean }>(sql`
      select i.number, p.name as party, i.issue_date::text, i.total, i.amount_paid, i.due_date::text, i.due_date < current_date as past_due
      from invoices i join parties p on p.id = i.party_id order by i.number`);
    expect(issued.map((i) => [i.number, i.party])).toEqual([
      [1, 'Okonkwo Dairy (Emeka Okonkwo)'],
      [2, 'Marisol Brandvold'],
    ]);
    expect(issued[0]!.issue_date < issued[1]!.issue_date).toBe(true);
    expect(issued[0]!.amount_paid).toBe(issued[0]!.total);
    expect(issued[1]).toMatchObject({ amount_paid: '0.00', past_due: false });
    const [payment] = await rows<{ amount: string; method: string }>(sql`select amount, method from payments`);
    expect(payment).toEqual({ amount: issued[0]!.total, method: 'cheque' });
    const [counter] = await rows<{ next_number: number }>(sql`select next_number from invoice_counters where series = 'INV'`);
    expect(counter!.next_number).toBe(3);
  });

  it('prices every line as quantity times rate, rounded half-up to the cent, and totals the lines', async () => {
    const off = await rows<{ id: string }>(sql`select id from invoice_lines where amount <> round(quantity * rate, 2)`);
    expect(off).toEqual([]);
    const mistotalled = await rows<{ id: string }>(sql`select i.id from invoices i where i.total <> (select sum(l.amount) from invoice_lines l where l.invoice_id = i.id)`);
    expect(mistotalled).toEqual([]);
  });

  it('bills only approved work of the invoice’s own party, each entry once and marked invoiced', async () => {
    const [check] = await rows<{ billed: number; invoiced: number; foreign: number; unlocked: number }>(sql`
      select
        (select count(*)::int from invoice_entries) as billed,
        (select count(*)::int from work_entries where state = 'invoiced') as invoiced,
        (select count(*)::int from invoice_entries ie join invoices i on i.id = ie.invoice_id join work_entries w on w.id = ie.work_entry_id where w.bill_to_party_id <> i.party_id) as foreign,
        (select count(*)::int from invoice_lines l where l.work_entry_id is not null and not exists (select 1 from invoice_entries ie where ie.work_entry_id = l.work_entry_id and ie.invoice_id = l.invoice_id)) as unlocked`);
    expect(check!.billed).toBeGreaterThan(0);
    expect(check).toEqual({ billed: check!.billed, invoiced: check!.billed, foreign: 0, unlocked: 0 });
    const [left] = await rows<{ n: number }>(sql`select count(*)::int as n from work_entries w join parties p on p.id = w.bill_to_party_id where p.kind = 'customer' and w.state = 'approved'`);
    expect(left!.n).toBeGreaterThan(0);
  });
});

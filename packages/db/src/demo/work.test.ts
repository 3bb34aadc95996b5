import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { plausibilityWarnings, type CheckedMachine } from '@hitchbook/shared/work-entry-checks';
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

describe('demo work entries', () => {
  it('are mostly approved, with some submitted and a few drafts', async () => {
    const counts = new Map((await rows<{ state: string; n: number }>(sql`select state, count(*)::int as n from work_entries group by state`)).map((r) => [r.state, r.n]));
    expect(counts.get('approved')).toBeGreaterThan(200);
    expect(counts.get('submitted')).toBeGreaterThan(3);
    expect(counts.get('draft')).toBeGreaterThan(0);
    expect(counts.get('approved')!).toBeGreaterThan(5 * (counts.get('submitted')! + counts.get('draft')!));
  });

  it('bill the households, both neighbours and the township road district', async () => {
    const billed = await rows<{ kind: string; relationship: string; n: number }>(
      sql`select p.kind, p.relationship, count(distinct p.id)::int as n from work_entries w join parties p on p.id = w.bill_to_party_id group by p.kind, p.relationship`,
    );
    expect(billed).toEqual(
      expect.arrayContaining([
        { kind: 'household', relationship: 'family', n: 3 },
        { kind: 'customer', relationship: 'neighbour', n: 2 },
        { kind: 'customer', relationship: 'agency', n: 1 },
      ]),
    );
    const roadside = await rows<{ name: string }>(sql`select distinct p.name from work_entries w join fields f on f.id = w.field_id join parties p on p.id = w.bill_to_party_id where f.kind = 'roadside'`);
    expect(roadside.map((r) => r.name)).toEqual(['Fenwold Township Road District']);
  });

  it('keep every machine meter running forward, with each meter end stored as a reading', async () => {
    const [check] = await rows<{ backwards: number; ties: number; unread: number; mismatched: number }>(sql`
      with r as (
        select kind, hours, read_at, lag(hours) over w as prev_hours, lag(read_at) over w as prev_at
        from meter_readings window w as (partition by machine_id order by read_at, created_at))
      select
        (select count(*)::int from r where kind = 'reading' and hours < prev_hours) as backwards,
        (select count(*)::int from r where read_at = prev_at) as ties,
        (select count(*)::int from work_entries w where w.meter_end is not null
           and not exists (select 1 from meter_readings m where m.work_entry_id = w.id and m.hours = w.meter_end)) as unread,
        (select count(*)::int from work_entries where meter_end - meter_start <> hours) as mismatched`);
    expect(check).toEqual({ backwards: 0, ties: 0, unread: 0, mismatched: 0 });
  });

  it('are plausible except the one submitted pass left for the approver to catch', async () => {
    const machines = new Map(
      (
        await rows<CheckedMachine>(sql`select id, name, class_id as "classId", kind, width_ft as "widthFt", speed_mph as "speedMph", field_efficiency_pct as "fieldEfficiencyPct" from machines`)
      ).map((m) => [m.id, m]),
    );
    type Row = { id: string; workDate: string; state: string; hours: string; operatorHours: string | null; acres: string | null; startedAt: Date | null; endedAt: Date | null; meterStart: string | null; meterEnd: string | null; powerMachineId: string | null; implementMachineId: string | null };
    const entries = await rows<Row>(sql`
      select id, work_date::text as "workDate", state, hours, operator_hours as "operatorHours", acres, started_at as "startedAt", ended_at as "endedAt",
             meter_start as "meterStart", meter_end as "meterEnd", power_machine_id as "powerMachineId", implement_machine_id as "implementMachineId"
      from work_entries`);
    const byDay = new Map<string, Row[]>();
    for (const e of entries) byDay.set(e.workDate, [...(byDay.get(e.workDate) ?? []), e]);
    const flagged = entries.flatMap((e) => {
      const sameDay = byDay.get(e.workDate)!.map((o) => ({ ...o, startedAt: o.startedAt && new Date(o.startedAt), endedAt: o.endedAt && new Date(o.endedAt), label: o.id }));
      const warnings = plausibilityWarnings({
        entry: { ...e, startedAt: e.startedAt && new Date(e.startedAt), endedAt: e.endedAt && new Date(e.endedAt) },
        power: (e.powerMachineId && machines.get(e.powerMachineId)) || null,
        implement: (e.implementMachineId && machines.get(e.implementMachineId)) || null,
        sameDay,
      });
      return warnings.map((w) => `${e.state} ${w.code}`);
    });
    expect(flagged).toEqual(['submitted above-field-capacity']);
  });
});

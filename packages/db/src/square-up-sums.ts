import { sql, type SQL } from 'drizzle-orm';
import { actualMachineRateOrThrow, type ActualRate, type CostCategory } from '@hitchbook/shared/actual-rate';
import type { StatementCostGroup, StatementHousehold, StatementShareSet, StatementSums, StatementUseGroup } from '@hitchbook/shared/square-up';
import type { Executor } from './client.js';
import { executePrepared } from './prepared.js';

// The sums a square-up statement and a machine's actual rate are made from, in SQL. They live in the
// data package because the API and the demo seed must compute a statement the same way. Every query is
// scoped by the operation id and bounded by its period's dates, so the date indexes of work_entries and
// cost_entries keep other periods out of the read.

/** Row types for execute(): the driver's rows are plain records of these fields. */
type Row<T> = T & Record<string, unknown>;

export interface PeriodScope {
  operationId: string;
  from: string;
  to: string;
}

// ---------------------------------------------------------------- a machine's year

/** Entries whose hours are settled: approved, billed on an invoice or squared up between households. */
export const COUNTED_STATES = sql`('approved', 'invoiced', 'squared')`;

export interface YearBounds {
  from: string;
  to: string;
}

export function yearBounds(year: number): YearBounds {
  return { from: `${year}-01-01`, to: `${year}-12-31` };
}

export type MachineUseSums = { machineId: string; hours: string; acres: string };

/** Costs summed by what the engine needs to spread them over years: improvements keep their year and life. */
export type CostSums = { machineId: string; category: CostCategory; year: number; lifeYears: number | null; amount: string };

/**
 * Each entry's hours count for its power unit and its implement alike; the lateral VALUES turns one
 * entry row into one row per machine without reading the table twice.
 */
export function machineUseRows(operationId: string, bounds: YearBounds, states: SQL): SQL {
  return sql`
    select m.machine_id, we.id as work_entry_id, we.work_date, we.hours, we.acres, we.field_id, we.work_type_id
    from work_entries we
    cross join lateral (values (we.power_machine_id), (we.implement_machine_id)) as m(machine_id)
    where we.operation_id = ${operationId}
      and we.work_date between ${bounds.from} and ${bounds.to}
      and we.state in ${states}
      and m.machine_id is not null`;
}

/** Settled hours and acres of each machine that worked in the year, from the kept sums (machine_work_type_years). */
export async function machineUseSums(executor: Executor, operationId: string, year: number): Promise<MachineUseSums[]> {
  const result = await executePrepared<Row<MachineUseSums>>(executor, sql`
    select machine_id as "machineId", sum(hours)::text as hours, sum(acres)::text as acres
    from machine_work_type_years
    where operation_id = ${operationId} and year = ${year}
    group by machine_id`);
  return result.rows;
}

/** The year's costs, plus improvements of earlier years whose life reaches into it. */
export async function machineCostSums(executor: Executor, operationId: string, year: number): Promise<CostSums[]> {
  const bounds = yearBounds(year);
  const result = await executePrepared<Row<CostSums>>(executor, sql`
    select machine_id as "machineId", category, ${year}::int as year, null::int as "lifeYears", sum(amount)::text as amount
    from cost_entries
    where operation_id = ${operationId} and category <> 'improvement' and incurred_on between ${bounds.from} and ${bounds.to}
    group by machine_id, category
    union all
    select machine_id, category, extract(year from incurred_on)::int, improvement_life_years, sum(amount)::text
    from cost_entries
    where operation_id = ${operationId} and category = 'improvement' and incurred_on <= ${bounds.to}
      and extract(year from incurred_on)::int + improvement_life_years > ${year}
    group by machine_id, category, extract(year from incurred_on), improvement_life_years`);
  return result.rows;
}

export function costSumsAsEntries(costs: readonly CostSums[]) {
  return costs.map((cost) => ({ category: cost.category, amount: cost.amount, year: cost.year, lifeYears: cost.lifeYears ?? undefined }));
}

/** The engine's actual rate of every machine that worked or cost money in the year. */
export async function actualMachineRates(executor: Executor, operationId: string, year: number): Promise<Map<string, ActualRate>> {
  const [uses, costs] = await Promise.all([machineUseSums(executor, operationId, year), machineCostSums(executor, operationId, year)]);
  const ids = new Set([...uses.map((u) => u.machineId), ...costs.map((c) => c.machineId)]);
  return new Map(
    [...ids].map((id) => [
      id,
      actualMachineRateOrThrow({ year, hours: uses.find((u) => u.machineId === id)?.hours ?? '0', entries: costSumsAsEntries(costs.filter((c) => c.machineId === id)) }),
    ]),
  );
}

// ---------------------------------------------------------------- the square-up's period

/** Each machine's share sets with the day the next one starts: a day falls in exactly one of them. */
export function shareSetsCte(operationId: string): SQL {
  return sql`share_sets as (
    select machine_id, effective_from, lead(effective_from) over (partition by machine_id order by effective_from) as next_from
    from (select distinct machine_id, effective_from from machine_shares where operation_id = ${operationId}) s
  )`;
}

export function inShareSet(alias: string, machine: SQL, day: SQL): SQL {
  const a = sql.raw(alias);
  return sql`${a}.machine_id = ${machine} and ${a}.effective_from <= ${day} and (${a}.next_from is null or ${day} < ${a}.next_from)`;
}

/** Family sheets for everyone (not party overrides), each in force until the next one starts. */
function familySheetsCte(operationId: string): SQL {
  return sql`family_sheets as (
    select id, effective_from, lead(effective_from) over (order by effective_from, created_at) as next_from
    from rate_sheets
    where operation_id = ${operationId} and relationship = 'family' and party_id is null and archived_at is null
  )`;
}

/**
 * Machine use by household: work billed to a household (approved or squared) is that household's; work
 * billed outside the households counts for the household that owns the field, whatever its billing
 * state, so invoicing it later does not move it. An entry's hours count for its power unit and implement.
 */
export function usesCte({ operationId, from, to }: PeriodScope): SQL {
  return sql`uses as (
    select m.machine_id, we.id as work_entry_id, we.work_date, we.hours, we.acres, we.state, we.field_id, we.work_type_id, we.bill_to_party_id,
           case when bp.kind = 'household' then bp.id else fo.id end as household_id
    from work_entries we
    cross join lateral (values (we.power_machine_id), (we.implement_machine_id)) as m(machine_id)
    join parties bp on bp.operation_id = we.operation_id and bp.id = we.bill_to_party_id
    left join fields f on f.operation_id = we.operation_id and f.id = we.field_id
    left join parties fo on fo.operation_id = we.operation_id and fo.id = f.owner_party_id and fo.kind = 'household'
    where we.operation_id = ${operationId}
      and we.work_date between ${from} and ${to}
      and m.machine_id is not null
      and ((bp.kind = 'household' and we.state in ('approved', 'squared'))
        or (bp.kind <> 'household' and fo.id is not null and we.state in ('approved', 'invoiced', 'squared')))
  )`;
}

/**
 * Costs dated in the period. An improvement is its yearly slices, slice k dated k years after payment;
 * the cents are dealt out like the engine's largest-remainder split of equal weights (earlier slices
 * take the odd cents), so the slices of one improvement add up to it exactly.
 */
export function datedCostsCte({ operationId, from, to }: PeriodScope): SQL {
  return sql`dated_costs as (
    select c.id as cost_entry_id, c.machine_id, c.category, c.incurred_on as cost_date, c.paid_by_party_id, c.amount,
           null::int as slice_index, null::int as slice_of, c.vendor, c.notes
    from cost_entries c
    where c.operation_id = ${operationId} and c.category <> 'improvement' and c.incurred_on between ${from} and ${to}
    union all
    select c.id, c.machine_id, c.category, s.slice_date, c.paid_by_party_id, s.slice_amount, s.k + 1, c.improvement_life_years, c.vendor, c.notes
    from cost_entries c
    cross join lateral (
      select k, (c.incurred_on + make_interval(years => k))::date as slice_date,
             round((round(c.amount * 100)::bigint / c.improvement_life_years
               + case when k < round(c.amount * 100)::bigint % c.improvement_life_years then 1 else 0 end)::numeric / 100, 2) as slice_amount
      from generate_series(0, c.improvement_life_years - 1) as k
    ) s
    where c.operation_id = ${operationId} and c.category = 'improvement' and c.incurred_on <= ${to}
      and s.slice_date between ${from} and ${to}
  )`;
}

export const COST_KIND = sql`case when d.category in ('fuel', 'repair', 'parts', 'tires') then 'operating' else 'fixed' end`;

export function statementCostSumsQuery(period: PeriodScope): SQL {
  return sql`
    with ${shareSetsCte(period.operationId)}, ${datedCostsCte(period)}
    select d.machine_id as "machineId", ${COST_KIND} as "costKind", ss.effective_from::text as "shareSetFrom",
           d.paid_by_party_id as "paidByPartyId", sum(d.amount)::text as amount, count(*)::int as entries
    from dated_costs d
    left join share_sets ss on ${inShareSet('ss', sql`d.machine_id`, sql`d.cost_date`)}
    group by 1, 2, 3, 4
    order by 1, 2, 3, 4`;
}

function addDays(day: string, days: number): string {
  const d = new Date(`${day}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

function monthStart(day: string): string {
  return `${day.slice(0, 7)}-01`;
}

function nextMonthStart(day: string): string {
  const d = new Date(`${monthStart(day)}T00:00:00Z`);
  d.setUTCMonth(d.getUTCMonth() + 1);
  return d.toISOString().slice(0, 10);
}

/** The months lying wholly in the period (first days, or null for none) and the part months' day ranges around them. */
export function periodMonths(from: string, to: string): { firstMonth: string | null; lastMonth: string | null; partRanges: Array<[string, string]> } {
  const firstMonth = from.endsWith('-01') ? from : nextMonthStart(from);
  const lastMonth = monthStart(addDays(to, 1)) === addDays(to, 1) ? monthStart(to) : monthStart(addDays(monthStart(to), -1));
  if (firstMonth > lastMonth) return { firstMonth: null, lastMonth: null, partRanges: [[from, to]] };
  const partRanges: Array<[string, string]> = [];
  if (from < firstMonth) partRanges.push([from, addDays(firstMonth, -1)]);
  const afterLast = nextMonthStart(lastMonth);
  if (afterLast <= to) partRanges.push([afterLast, to]);
  return { firstMonth, lastMonth, partRanges };
}

/**
 * The period's use, from the kept monthly sums (machine_household_months) where a month lies wholly in
 * the period and no share set or family sheet starts after its first day: every day of such a month is
 * then priced and split alike. The period's part months and those few months are read entry by entry,
 * range by range through the date index, so the result is the same as summing the entries.
 */
export function periodUsesCte({ operationId, from, to }: PeriodScope): SQL {
  const { firstMonth, lastMonth, partRanges } = periodMonths(from, to);
  const wholeFrom = firstMonth ?? from;
  const wholeTo = lastMonth ? addDays(nextMonthStart(lastMonth), -1) : from;
  return sql`split_months as (
    select date_trunc('month', b.effective_from)::date as month,
           case when bool_or(b.machine_id is null) then null else array_agg(b.machine_id) end as machines
    from (select machine_id, effective_from from share_sets union all select null::uuid, effective_from from family_sheets) b
    where ${firstMonth !== null} and b.effective_from between ${wholeFrom} and ${wholeTo} and extract(day from b.effective_from) <> 1
    group by 1
  ),
  entry_ranges as (
    select r.lo, r.hi, null::uuid[] as machines
    from unnest(${sql.param(partRanges.map((r) => r[0]))}::date[], ${sql.param(partRanges.map((r) => r[1]))}::date[]) as r(lo, hi)
    union all
    select month, (month + interval '1 month')::date - 1, machines from split_months
  ),
  uses as (
    select r.machine_id, r.month as work_date, r.household_id, r.hours, r.entries
    from machine_household_months r
    where r.operation_id = ${operationId} and ${firstMonth !== null} and r.month between ${wholeFrom} and ${wholeTo}
      and not exists (select 1 from split_months s where s.month = r.month and (s.machines is null or r.machine_id = any(s.machines)))
    union all
    select u.machine_id, u.work_date, u.household_id, u.hours, 1
    from entry_ranges er
    cross join lateral (
      select m.machine_id, we.work_date, we.hours, case when bp.kind = 'household' then bp.id else fo.id end as household_id
      from work_entries we
      cross join lateral (values (we.power_machine_id), (we.implement_machine_id)) as m(machine_id)
      join parties bp on bp.operation_id = we.operation_id and bp.id = we.bill_to_party_id
      left join fields f on f.operation_id = we.operation_id and f.id = we.field_id
      left join parties fo on fo.operation_id = we.operation_id and fo.id = f.owner_party_id and fo.kind = 'household'
      where we.operation_id = ${operationId}
        and we.work_date between er.lo and er.hi
        and m.machine_id is not null
        and (er.machines is null or m.machine_id = any(er.machines))
        and ((bp.kind = 'household' and we.state in ('approved', 'squared'))
          or (bp.kind <> 'household' and fo.id is not null and we.state in ('approved', 'invoiced', 'squared')))
      -- Kept apart from the outer query, so each range is its own index range scan.
      offset 0
    ) u
  )`;
}

export function statementUseSumsQuery(period: PeriodScope): SQL {
  return sql`
    with ${shareSetsCte(period.operationId)}, ${familySheetsCte(period.operationId)}, ${periodUsesCte(period)}
    select u.machine_id as "machineId", u.household_id as "householdId", ss.effective_from::text as "shareSetFrom",
           fs.id as "rateSheetId", mr.rate_per_hour::text as "ratePerHour", sum(u.hours)::text as hours, sum(u.entries)::int as entries
    from uses u
    left join share_sets ss on ${inShareSet('ss', sql`u.machine_id`, sql`u.work_date`)}
    left join family_sheets fs on fs.effective_from <= u.work_date and (fs.next_from is null or u.work_date < fs.next_from)
    left join machine_rates mr on mr.operation_id = ${period.operationId} and mr.rate_sheet_id = fs.id and mr.machine_id = u.machine_id
    group by 1, 2, 3, 4, 5
    order by 1, 2, 3, 4`;
}

function uuidArray(ids: readonly string[]): SQL {
  return sql`${sql.param([...ids])}::uuid[]`;
}

/** Everything the statement splits, summed: the engine does the rest (@hitchbook/shared/square-up). */
export async function statementSums(executor: Executor, period: PeriodScope): Promise<StatementSums> {
  const { operationId, from, to } = period;
  const [households, costs, uses, pending] = await Promise.all([
    executePrepared<Row<StatementHousehold>>(executor, sql`
      select id, name, archived_at is not null as archived from parties
      where operation_id = ${operationId} and kind = 'household' order by name, id`),
    executePrepared<Row<StatementCostGroup>>(executor, statementCostSumsQuery(period)),
    executePrepared<Row<StatementUseGroup>>(executor, statementUseSumsQuery(period)),
    executePrepared<Row<{ n: number }>>(executor, sql`
      select count(*)::int as n from work_entries
      where operation_id = ${operationId} and state in ('draft', 'submitted') and work_date between ${from} and ${to}`),
  ]);
  const machineIds = [...new Set([...costs.rows.map((c) => c.machineId), ...uses.rows.map((u) => u.machineId)])];
  const [machines, shares] = await Promise.all([
    executePrepared<Row<{ id: string; name: string }>>(executor, sql`
      select id, name from machines where operation_id = ${operationId} and id = any(${uuidArray(machineIds)})`),
    executePrepared<Row<{ machineId: string; effectiveFrom: string; partyId: string; sharePct: string }>>(executor, sql`
      select machine_id as "machineId", effective_from::text as "effectiveFrom", party_id as "partyId", share_pct::text as "sharePct"
      from machine_shares where operation_id = ${operationId} and machine_id = any(${uuidArray(machineIds)})
      order by machine_id, effective_from, party_id`),
  ]);
  const referenced = new Set([...costs.rows, ...uses.rows].filter((g) => g.shareSetFrom !== null).map((g) => `${g.machineId}|${g.shareSetFrom}`));
  const sets = new Map<string, StatementShareSet>();
  for (const share of shares.rows) {
    const key = `${share.machineId}|${share.effectiveFrom}`;
    if (!referenced.has(key)) continue;
    const set = sets.get(key) ?? { machineId: share.machineId, effectiveFrom: share.effectiveFrom, shares: [] };
    sets.set(key, { ...set, shares: [...set.shares, { partyId: share.partyId, sharePct: share.sharePct }] });
  }
  return {
    households: households.rows,
    machines: machines.rows,
    shareSets: [...sets.values()],
    costs: costs.rows,
    uses: uses.rows,
    pendingEntries: pending.rows[0]?.n ?? 0,
  };
}

/** Family work of the period becomes 'squared' at closing: billed to a household and approved, so never to be invoiced. */
export async function squareFamilyWork(executor: Executor, { operationId, from, to }: PeriodScope): Promise<number> {
  const result = await executor.execute(sql`
    update work_entries we set state = 'squared', version = we.version + 1, updated_at = now()
    where we.operation_id = ${operationId} and we.state = 'approved' and we.work_date between ${from} and ${to}
      and exists (select 1 from parties p where p.operation_id = we.operation_id and p.id = we.bill_to_party_id and p.kind = 'household')`);
  return result.rowCount ?? 0;
}

import { sql, type SQL } from 'drizzle-orm';
import { actualMachineRateOrThrow, type ActualRate, type CostCategory } from '@hitchbook/shared/actual-rate';
import type { StatementCostGroup, StatementHousehold, StatementShareSet, StatementSums, StatementUseGroup } from '@hitchbook/shared/square-up';
import type { Executor } from './client.js';

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

export async function machineUseSums(executor: Executor, operationId: string, bounds: YearBounds): Promise<MachineUseSums[]> {
  const result = await executor.execute<Row<MachineUseSums>>(sql`
    select u.machine_id as "machineId", sum(u.hours)::text as hours, coalesce(sum(u.acres), 0)::text as acres
    from (${machineUseRows(operationId, bounds, COUNTED_STATES)}) u
    group by u.machine_id`);
  return result.rows;
}

/** The year's costs, plus improvements of earlier years whose life reaches into it. */
export async function machineCostSums(executor: Executor, operationId: string, year: number): Promise<CostSums[]> {
  const bounds = yearBounds(year);
  const result = await executor.execute<Row<CostSums>>(sql`
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
  const [uses, costs] = await Promise.all([machineUseSums(executor, operationId, yearBounds(year)), machineCostSums(executor, operationId, year)]);
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

export function statementUseSumsQuery(period: PeriodScope): SQL {
  return sql`
    with ${shareSetsCte(period.operationId)}, ${familySheetsCte(period.operationId)}, ${usesCte(period)}
    select u.machine_id as "machineId", u.household_id as "householdId", ss.effective_from::text as "shareSetFrom",
           fs.id as "rateSheetId", mr.rate_per_hour::text as "ratePerHour", sum(u.hours)::text as hours, count(*)::int as entries
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
    executor.execute<Row<StatementHousehold>>(sql`
      select id, name, archived_at is not null as archived from parties
      where operation_id = ${operationId} and kind = 'household' order by name, id`),
    executor.execute<Row<StatementCostGroup>>(statementCostSumsQuery(period)),
    executor.execute<Row<StatementUseGroup>>(statementUseSumsQuery(period)),
    executor.execute<Row<{ n: number }>>(sql`
      select count(*)::int as n from work_entries
      where operation_id = ${operationId} and state in ('draft', 'submitted') and work_date between ${from} and ${to}`),
  ]);
  const machineIds = [...new Set([...costs.rows.map((c) => c.machineId), ...uses.rows.map((u) => u.machineId)])];
  const [machines, shares] = await Promise.all([
    executor.execute<Row<{ id: string; name: string }>>(sql`
      select id, name from machines where operation_id = ${operationId} and id = any(${uuidArray(machineIds)})`),
    executor.execute<Row<{ machineId: string; effectiveFrom: string; partyId: string; sharePct: string }>>(sql`
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

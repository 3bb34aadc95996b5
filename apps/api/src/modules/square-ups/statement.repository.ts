import { Inject, Injectable } from '@nestjs/common';
import { sql, type SQL } from 'drizzle-orm';
import type { Executor } from '@hitchbook/db';
import type { FixedCostsBy, StatementCostLineDto, StatementWorkLineDto } from '@hitchbook/shared/schemas/square-ups';
import type { StatementCostGroup, StatementHousehold, StatementShareSet, StatementUseGroup } from '@hitchbook/shared/square-up';
import { DB, type DbHandle } from '../../core/database.js';
import { uuidArray } from '../reports/sql-arrays.js';

// The square-up in SQL: every figure the statement splits is a grouped sum here, scoped by the
// operation and bounded by the period's dates so the date indexes of work_entries and cost_entries
// keep other periods out of the read. The CTEs below are shared by the sums and the drill-down lines.

export interface Period {
  operationId: string;
  from: string;
  to: string;
}

/** Each machine's share sets with the day the next one starts: a day falls in exactly one of them. */
function shareSetsCte(operationId: string): SQL {
  return sql`share_sets as (
    select machine_id, effective_from, lead(effective_from) over (partition by machine_id order by effective_from) as next_from
    from (select distinct machine_id, effective_from from machine_shares where operation_id = ${operationId}) s
  )`;
}

function inShareSet(alias: string, machine: SQL, day: SQL): SQL {
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
function usesCte({ operationId, from, to }: Period): SQL {
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
function datedCostsCte({ operationId, from, to }: Period): SQL {
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

/** Row types for execute(): the driver's rows are plain records of these fields. */
type Row<T> = T & Record<string, unknown>;

const COST_KIND = sql`case when d.category in ('fuel', 'repair', 'parts', 'tires') then 'operating' else 'fixed' end`;

export interface StatementSums {
  households: StatementHousehold[];
  machines: Array<{ id: string; name: string }>;
  shareSets: StatementShareSet[];
  costs: StatementCostGroup[];
  uses: StatementUseGroup[];
  pendingEntries: number;
}

export interface LinesFilter {
  household: string | null;
  machine: string | null;
  fixedCostsBy: FixedCostsBy;
  limit: number;
  offset: number;
}

@Injectable()
export class StatementRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  costSumsQuery(period: Period): SQL {
    return sql`
      with ${shareSetsCte(period.operationId)}, ${datedCostsCte(period)}
      select d.machine_id as "machineId", ${COST_KIND} as "costKind", ss.effective_from::text as "shareSetFrom",
             d.paid_by_party_id as "paidByPartyId", sum(d.amount)::text as amount, count(*)::int as entries
      from dated_costs d
      left join share_sets ss on ${inShareSet('ss', sql`d.machine_id`, sql`d.cost_date`)}
      group by 1, 2, 3, 4
      order by 1, 2, 3, 4`;
  }

  useSumsQuery(period: Period): SQL {
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

  async sums(period: Period, executor: Executor = this.dbh.db): Promise<StatementSums> {
    const { operationId, from, to } = period;
    const [households, costs, uses, pending] = await Promise.all([
      executor.execute<Row<StatementHousehold>>(sql`
        select id, name, archived_at is not null as archived from parties
        where operation_id = ${operationId} and kind = 'household' order by name, id`),
      executor.execute<Row<StatementCostGroup>>(this.costSumsQuery(period)),
      executor.execute<Row<StatementUseGroup>>(this.useSumsQuery(period)),
      executor.execute<{ n: number }>(sql`
        select count(*)::int as n from work_entries
        where operation_id = ${operationId} and state in ('draft', 'submitted') and work_date between ${from} and ${to}`),
    ]);
    const machineIds = [...new Set([...costs.rows.map((c) => c.machineId), ...uses.rows.map((u) => u.machineId)])];
    const [machines, shares] = await Promise.all([
      executor.execute<{ id: string; name: string }>(sql`
        select id, name from machines where operation_id = ${operationId} and id = any(${uuidArray(machineIds)})`),
      executor.execute<{ machineId: string; effectiveFrom: string; partyId: string; sharePct: string }>(sql`
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

  /**
   * The cost entries behind the figures; with a household, those it paid or bears a part of: by its
   * share on the cost's date, or by its own use when the cost is split by use.
   */
  async costLines(period: Period, filter: LinesFilter, executor: Executor = this.dbh.db): Promise<{ rows: StatementCostLineDto[]; total: number }> {
    const { operationId } = period;
    const household = filter.household;
    const result = await executor.execute<Row<StatementCostLineDto & { total: number }>>(sql`
      with ${shareSetsCte(operationId)}, ${usesCte(period)}, ${datedCostsCte(period)},
      owner_use as (
        select distinct u.machine_id, u.household_id
        from uses u
        join share_sets ss on ${inShareSet('ss', sql`u.machine_id`, sql`u.work_date`)}
        join machine_shares ms on ms.operation_id = ${operationId} and ms.machine_id = u.machine_id and ms.effective_from = ss.effective_from and ms.party_id = u.household_id
        where u.hours > 0
      ),
      lines as (
        select d.*, ${COST_KIND} as cost_kind, ss.effective_from as share_set_from,
               (${COST_KIND} = 'operating' or ${filter.fixedCostsBy} = 'use') and exists (select 1 from owner_use ou where ou.machine_id = d.machine_id) as by_use
        from dated_costs d
        left join share_sets ss on ${inShareSet('ss', sql`d.machine_id`, sql`d.cost_date`)}
      ),
      marked as (
        select l.*,
               case when ${household}::uuid is null then null else l.paid_by_party_id is not distinct from ${household}::uuid end as paid_by_household,
               case when ${household}::uuid is null then null
                    when l.by_use then exists (select 1 from owner_use ou where ou.machine_id = l.machine_id and ou.household_id = ${household}::uuid)
                    else exists (select 1 from machine_shares ms where ms.operation_id = ${operationId} and ms.machine_id = l.machine_id
                                 and ms.effective_from = l.share_set_from and ms.party_id = ${household}::uuid) end as bears_share
        from lines l
        where ${filter.machine}::uuid is null or l.machine_id = ${filter.machine}::uuid
      )
      select k.cost_entry_id as "costEntryId", k.cost_date::text as "incurredOn", k.machine_id as "machineId", m.name as "machineName",
             k.category, case when k.slice_index is null then null else json_build_object('index', k.slice_index, 'of', k.slice_of) end as "improvementSlice",
             k.cost_kind as "costKind", k.amount::text as amount, k.paid_by_party_id as "paidByPartyId", p.name as "paidByName",
             k.share_set_from::text as "shareSetFrom", k.vendor, k.notes, k.paid_by_household as "paidByHousehold", k.bears_share as "bearsShare",
             count(*) over ()::int as total
      from marked k
      join machines m on m.operation_id = ${operationId} and m.id = k.machine_id
      left join parties p on p.operation_id = ${operationId} and p.id = k.paid_by_party_id
      where ${household}::uuid is null or k.paid_by_household or k.bears_share
      order by k.cost_date, m.name, k.cost_entry_id
      limit ${filter.limit} offset ${filter.offset}`);
    return { rows: result.rows.map(({ total: _total, ...row }) => row), total: result.rows[0]?.total ?? 0 };
  }

  /**
   * Each machine's hours on each counted entry; with a household, its own use and others' use of
   * machines it owned that day (what it was credited for).
   */
  async workLines(period: Period, filter: LinesFilter, executor: Executor = this.dbh.db): Promise<{ rows: StatementWorkLineDto[]; total: number }> {
    const { operationId } = period;
    const household = filter.household;
    const result = await executor.execute<Row<StatementWorkLineDto & { total: number }>>(sql`
      with ${shareSetsCte(operationId)}, ${usesCte(period)},
      marked as (
        select u.*, ss.effective_from as share_set_from,
               exists (select 1 from machine_shares ms where ms.operation_id = ${operationId} and ms.machine_id = u.machine_id
                       and ms.effective_from = ss.effective_from and ms.party_id = u.household_id) as user_owned,
               case when ${household}::uuid is null then false
                    else exists (select 1 from machine_shares ms where ms.operation_id = ${operationId} and ms.machine_id = u.machine_id
                                 and ms.effective_from = ss.effective_from and ms.party_id = ${household}::uuid) end as household_owned
        from uses u
        left join share_sets ss on ${inShareSet('ss', sql`u.machine_id`, sql`u.work_date`)}
        where ${filter.machine}::uuid is null or u.machine_id = ${filter.machine}::uuid
      )
      select k.work_entry_id as "workEntryId", k.work_date::text as "workDate", k.machine_id as "machineId", m.name as "machineName",
             f.name as "fieldName", wt.name as "workTypeName", k.hours::text as hours, k.acres::text as acres, bp.name as "billToName",
             k.state, k.household_id as "householdId", hh.name as "householdName", k.user_owned as "userOwned",
             k.share_set_from::text as "shareSetFrom", count(*) over ()::int as total
      from marked k
      join machines m on m.operation_id = ${operationId} and m.id = k.machine_id
      join fields f on f.operation_id = ${operationId} and f.id = k.field_id
      join work_types wt on wt.operation_id = ${operationId} and wt.id = k.work_type_id
      join parties bp on bp.operation_id = ${operationId} and bp.id = k.bill_to_party_id
      join parties hh on hh.operation_id = ${operationId} and hh.id = k.household_id
      where ${household}::uuid is null or k.household_id = ${household}::uuid or (k.household_owned and not k.user_owned)
      order by k.work_date, m.name, k.work_entry_id
      limit ${filter.limit} offset ${filter.offset}`);
    return { rows: result.rows.map(({ total: _total, ...row }) => row), total: result.rows[0]?.total ?? 0 };
  }
}

import { Inject, Injectable } from '@nestjs/common';
import { sql } from 'drizzle-orm';
import type { Executor } from '@hitchbook/db';
import { COST_KIND, datedCostsCte, inShareSet, shareSetsCte, usesCte, type PeriodScope } from '@hitchbook/db/square-up-sums';
import type { FixedCostsBy, StatementCostLineDto, StatementWorkLineDto } from '@hitchbook/shared/schemas/square-ups';
import { DB, type DbHandle } from '../../core/database.js';

// The drill-down behind a statement: the same CTEs the statement's sums are made from
// (@hitchbook/db/square-up-sums), listed row by row and paged.

/** Row types for execute(): the driver's rows are plain records of these fields. */
type Row<T> = T & Record<string, unknown>;

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

  /**
   * The cost entries behind the figures; with a household, those it paid or bears a part of: by its
   * share on the cost's date, or by its own use when the cost is split by use.
   */
  async costLines(period: PeriodScope, filter: LinesFilter, executor: Executor = this.dbh.db): Promise<{ rows: StatementCostLineDto[]; total: number }> {
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
  async workLines(period: PeriodScope, filter: LinesFilter, executor: Executor = this.dbh.db): Promise<{ rows: StatementWorkLineDto[]; total: number }> {
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

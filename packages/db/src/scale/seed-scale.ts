/**
 * The scale dataset: two invented outfits, each with a decade of history (20,000 work entries, 2,000 costs
 * and 300 issued invoices a year), for the benchmark and for reading query plans at a realistic size.
 *
 * Deterministic: ids are md5 digests of fixed keys, the small attributes come from a seeded mulberry32,
 * and the bulk rows come from a seeded hash of their row number in SQL, so two runs give the same rows.
 * Bulk rows are written set-based (INSERT ... SELECT over generate_series), one year per statement.
 */
import { createHash } from 'node:crypto';
import { fileURLToPath } from 'node:url';
import bcrypt from 'bcrypt';
import type pg from 'pg';
import { DEFAULT_WORK_TYPES } from '@hitchbook/shared/work-types';
import { createDb } from '../client.js';
import { BENCH_BATCH_ENTRIES, BENCH_BATCHES, benchBatchRange, SCALE_LAST_YEAR, SCALE_OPERATIONS, SCALE_PASSWORD, scaleEmail, type ScaleOperationKey } from './accounts.js';

export const ENTRIES_PER_YEAR = 20_000;
export const COSTS_PER_YEAR = 2_000;
export const INVOICES_PER_YEAR = 300;
const MACHINES = { power: 20, selfPropelled: 5, implements: 35 };
const FIELDS = { field: 340, roadside: 60 };
const HOUSEHOLDS = 5;
const CUSTOMERS = 40;
const OPERATORS = 12;

/** Small seeded PRNG (mulberry32): enough spread for names and sizes, and the same sequence every run. */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A stable uuid for a key, so the same row gets the same id in every run; shaped as version 4, which the API's id checks expect. */
export function stableId(key: string): string {
  const h = createHash('md5').update(key).digest('hex');
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-4${h.slice(13, 16)}-8${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

/** The same shaping in SQL, for ids made in bulk. */
const SQL_STABLE_ID = `create function pg_temp.sid(key text) returns uuid language sql immutable
  as $$ select overlay(overlay(md5(key) placing '4' from 13) placing '8' from 17)::uuid $$`;

const SURNAMES = ['Aldercott', 'Brisby', 'Callowen', 'Dunmarrow', 'Eskvale', 'Fennick', 'Gorselund', 'Hathersage', 'Ilvane', 'Juniper', 'Kestrow', 'Larchmont', 'Millbury', 'Norrow', 'Oakhurst', 'Pellow', 'Quenby', 'Rushmere', 'Stavely', 'Thornbeck'];
const FIRST = ['Ada', 'Bram', 'Cora', 'Dell', 'Esme', 'Finn', 'Greta', 'Hal', 'Ida', 'Jory', 'Kit', 'Lena', 'Milo', 'Nell', 'Otto', 'Pia', 'Rune', 'Sada', 'Tove', 'Wren'];
const PLACES = ['Cinder Flat', 'Heron Bend', 'Magpie Hill', 'Sorrel Creek', 'Teasel Ridge', 'Wicker Hollow', 'Yarrow Plain', 'Bittern Marsh'];
const ROADS = ['County Road', 'Township Line', 'Quarry Road', 'Mill Road', 'Ferry Road', 'Ridge Road'];
const MAKES = ['Harlan', 'Orwin', 'Brakkefield', 'Tamsen', 'Calder & Voss', 'Brisling'];
const POWER_CLASSES = ['tractor-2wd', 'tractor-mfwd', 'tractor-4wd'];
const SELF_PROPELLED_CLASSES = ['combine-sp', 'windrower-sp'];
const IMPLEMENT_CLASSES = ['tandem-disk', 'field-cultivator', 'row-crop-planter', 'grain-drill', 'boom-sprayer', 'anhydrous-applicator', 'rotary-mower', 'grain-cart', 'wagon', 'chisel-plow'];
/** Prices per default unit (invented): [lowest, spread]. */
const RATE_RANGE: Record<string, [number, number]> = { acre: [12, 30], hour: [60, 120], mile: [30, 30], load: [9, 12], each: [20, 30] };

interface Outfit {
  key: ScaleOperationKey;
  operationId: string;
  ownerId: string;
  households: string[];
  customers: string[];
  operators: string[];
  power: string[];
  implementIds: string[];
  machines: string[];
  fields: string[];
  workTypes: string[];
}

export interface ScaleOptions {
  years: number;
  log?: (line: string) => void;
}

const money = (n: number) => n.toFixed(2);

class Generator {
  private readonly rnd: () => number;
  private readonly id: (kind: string, n: number | string) => string;
  private readonly firstYear: number;

  constructor(
    private readonly client: pg.PoolClient,
    private readonly op: (typeof SCALE_OPERATIONS)[number],
    private readonly years: number,
    private readonly passwordHash: string,
    private readonly log: (line: string) => void,
  ) {
    this.rnd = mulberry32(op.seed);
    this.id = (kind, n) => stableId(`${op.key}:${kind}:${n}`);
    this.firstYear = SCALE_LAST_YEAR - years + 1;
  }

  private pick<T>(items: readonly T[]): T {
    return items[Math.floor(this.rnd() * items.length)]!;
  }

  private async q(text: string, params: unknown[] = []): Promise<pg.QueryResult> {
    return this.client.query(text, params);
  }

  /** Inserts rows of same-shaped objects in one statement per chunk. */
  private async insertRows(table: string, rows: Record<string, unknown>[]): Promise<void> {
    const columns = Object.keys(rows[0]!);
    for (let i = 0; i < rows.length; i += 500) {
      const chunk = rows.slice(i, i + 500);
      const params: unknown[] = [];
      const tuples = chunk.map((row) => `(${columns.map((c) => `$${params.push(row[c])}`).join(', ')})`);
      await this.q(`insert into ${table} (${columns.join(', ')}) values ${tuples.join(', ')}`, params);
    }
  }

  async run(): Promise<void> {
    const o = await this.foundation();
    await this.fleet(o);
    await this.rateSheets(o);
    await this.workHistory(o);
    // The planner must see the rows just written, or the invoice statements join them blindly.
    await this.q('analyze work_entries, parties, fields, work_types, rate_sheets, rate_sheet_lines');
    await this.invoices(o);
    await this.costs(o);
    await this.benchBatches(o);
    await this.squareUps(o);
  }

  private async foundation(): Promise<Outfit> {
    const { key } = this.op;
    const operationId = this.id('operation', 0);
    await this.insertRows('operations', [{ id: operationId, name: this.op.name, address: `${this.pick(PLACES)}, Fenwold Township`, email: scaleEmail(key, 'office') }]);
    const households = Array.from({ length: HOUSEHOLDS }, (_, i) => this.id('household', i));
    const customers = Array.from({ length: CUSTOMERS }, (_, i) => this.id('customer', i));
    await this.insertRows('parties', [
      ...households.map((id, i) => ({ id, operation_id: operationId, kind: 'household', name: `${SURNAMES[i]} household`, relationship: 'family', email: null as string | null })),
      ...customers.map((id, i) => ({
        id,
        operation_id: operationId,
        kind: 'customer',
        name: `${this.pick(FIRST)} ${SURNAMES[(i + 5) % SURNAMES.length]} (${PLACES[i % PLACES.length]} ${i + 1})`,
        relationship: i % 4 === 3 ? 'agency' : 'neighbour',
        email: scaleEmail(key, `customer${i}`),
      })),
    ]);

    const people: Array<{ who: string; role: string; party: string | null }> = [
      { who: 'owner', role: 'owner', party: null },
      { who: 'bookkeeper', role: 'bookkeeper', party: null },
      ...households.map((party, i) => ({ who: `partner${i}`, role: 'partner', party })),
      ...Array.from({ length: OPERATORS }, (_, i) => ({ who: `operator${i}`, role: 'operator', party: null })),
      ...customers.map((party, i) => ({ who: `customer${i}`, role: 'customer', party })),
    ];
    const userIds = people.map((p) => this.id('user', p.who));
    await this.insertRows(
      'users',
      people.map((p, i) => ({ id: userIds[i], email: scaleEmail(key, p.who), name: `${this.pick(FIRST)} ${this.pick(SURNAMES)}`, password_hash: this.passwordHash, password_changed_at: new Date(Date.UTC(2024, 0, 1)) })),
    );
    await this.insertRows(
      'memberships',
      people.map((p, i) => ({ id: this.id('membership', p.who), operation_id: operationId, user_id: userIds[i], role: p.role, party_id: p.party })),
    );
    const workTypes = DEFAULT_WORK_TYPES.map((t) => this.id('work-type', t.key));
    await this.insertRows(
      'work_types',
      DEFAULT_WORK_TYPES.map((t, i) => ({ id: workTypes[i], operation_id: operationId, key: t.key, name: t.name, default_unit: t.defaultUnit, cautions: [...t.cautions], typical_class_id: t.typicalClassId })),
    );
    const operators = people.map((p, i) => (p.role === 'operator' || p.role === 'partner' ? userIds[i]! : null)).filter((u): u is string => u !== null);
    this.log(`  ${key}: operation, ${HOUSEHOLDS} households, ${CUSTOMERS} customers, ${people.length} members`);
    return { key, operationId, ownerId: userIds[0]!, households, customers, operators, power: [], implementIds: [], machines: [], fields: [], workTypes };
  }

  private async fleet(o: Outfit): Promise<void> {
    const machines: Record<string, unknown>[] = [];
    const shares: Record<string, unknown>[] = [];
    const add = (kind: 'power' | 'self-propelled' | 'implement', classes: string[], count: number, label: string) => {
      for (let i = 0; i < count; i++) {
        const id = this.id(`machine-${kind}`, i);
        const price = 20_000 + Math.floor(this.rnd() * 300_000);
        const bought = this.firstYear - 1 - Math.floor(this.rnd() * 15);
        machines.push({
          id,
          operation_id: o.operationId,
          name: `${label} ${i + 1}`,
          class_id: classes[i % classes.length],
          kind,
          make: this.pick(MAKES),
          model: `${String.fromCharCode(65 + (i % 26))}${100 + Math.floor(this.rnd() * 800)}`,
          year: bought,
          unit_number: `${o.key.toUpperCase()}-${kind[0]!.toUpperCase()}${i + 1}`,
          pto_hp: kind === 'implement' ? null : String(60 + Math.floor(this.rnd() * 300)),
          fuel_type: kind === 'implement' ? null : 'diesel',
          list_price: money(price * 1.2),
          purchase_price: money(price),
          purchase_date: `${bought}-03-01`,
          planned_years_owned: 12,
          planned_hours_per_year: '400.0',
        });
        const [first, second] = [o.households[i % HOUSEHOLDS]!, o.households[(i + 2) % HOUSEHOLDS]!];
        const split = this.rnd();
        const set: Array<[string, string]> = split < 0.5 ? [[first, '100']] : split < 0.8 ? [[first, '50'], [second, '50']] : [[first, '60'], [second, '40']];
        for (const [party, pct] of set) {
          shares.push({ id: this.id('share', `${kind}-${i}-${party}`), operation_id: o.operationId, machine_id: id, party_id: party, share_pct: pct, effective_from: `${this.firstYear}-01-01` });
        }
        (kind === 'implement' ? o.implementIds : o.power).push(id);
        o.machines.push(id);
      }
    };
    add('power', POWER_CLASSES, MACHINES.power, 'Tractor');
    add('self-propelled', SELF_PROPELLED_CLASSES, MACHINES.selfPropelled, 'Self-propelled');
    add('implement', IMPLEMENT_CLASSES, MACHINES.implements, 'Implement');
    await this.insertRows('machines', machines);
    await this.insertRows('machine_shares', shares);

    const fields: Record<string, unknown>[] = [];
    for (let i = 0; i < FIELDS.field + FIELDS.roadside; i++) {
      const roadside = i >= FIELDS.field;
      const id = this.id('field', i);
      const lengthMiles = 0.5 + Math.floor(this.rnd() * 40) / 10;
      fields.push({
        id,
        operation_id: o.operationId,
        kind: roadside ? 'roadside' : 'field',
        name: roadside ? `${this.pick(ROADS)} ${i - FIELDS.field + 1} ditch` : `${this.pick(PLACES)} ${i + 1}`,
        acres: roadside ? ((lengthMiles * 5280 * 10) / 43560).toFixed(3) : (5 + Math.floor(this.rnd() * 1500) / 10).toFixed(3),
        owner_party_id: i % 3 === 0 ? o.households[i % HOUSEHOLDS] : null,
        farm_label: roadside ? null : `Farm ${1 + (i % 12)}`,
        length_miles: roadside ? lengthMiles.toFixed(3) : null,
        width_ft: roadside ? '10.00' : null,
      });
      o.fields.push(id);
    }
    await this.insertRows('fields', fields);
    this.log(`  ${o.key}: ${o.machines.length} machines, ${o.fields.length} fields and road stretches`);
  }

  private async rateSheets(o: Outfit): Promise<void> {
    const from = `${this.firstYear}-01-01`;
    for (const relationship of ['family', 'neighbour', 'agency'] as const) {
      const sheetId = this.id('sheet', relationship);
      await this.insertRows('rate_sheets', [
        { id: sheetId, operation_id: o.operationId, name: `${relationship[0]!.toUpperCase()}${relationship.slice(1)} rates`, relationship, effective_from: from, minimum_charge: relationship === 'family' ? '0.00' : '60.00', travel_flat: '0.00', operator_wage: '22.00', terms_days: 30 },
      ]);
      await this.insertRows(
        'rate_sheet_lines',
        DEFAULT_WORK_TYPES.map((t, i) => {
          const [low, spread] = RATE_RANGE[t.defaultUnit]!;
          return { id: this.id('sheet-line', `${relationship}-${t.key}`), operation_id: o.operationId, rate_sheet_id: sheetId, work_type_id: o.workTypes[i], unit: t.defaultUnit, rate: (low + Math.floor(this.rnd() * spread * 4) / 4).toFixed(4) };
        }),
      );
      if (relationship === 'family') {
        await this.insertRows(
          'machine_rates',
          o.machines.map((m, i) => ({ id: this.id('machine-rate', i), operation_id: o.operationId, rate_sheet_id: sheetId, machine_id: m, rate_per_hour: (15 + Math.floor(this.rnd() * 120)).toFixed(4) })),
        );
      }
    }
  }

  /** One year of entries per statement; columns are drawn from a seeded md5 of (seed, row, column). */
  private async workHistory(o: Outfit): Promise<void> {
    for (let year = this.firstYear; year <= SCALE_LAST_YEAR; year++) {
      const past = year < SCALE_LAST_YEAR;
      const offset = (year - this.firstYear) * ENTRIES_PER_YEAR;
      await this.q(
        `insert into work_entries (id, operation_id, work_date, operator_user_id, field_id, power_machine_id, implement_machine_id, work_type_id,
           hours, operator_hours, acres, miles, loads, each_count, fuel_gallons, bill_to_party_id, state, submitted_at, approved_at, approved_by, version, created_by)
         select pg_temp.sid($1 || ':entry:' || g), $2, d.work_date, d.operator, d.field, d.power, d.implement, d.work_type,
                d.hours, d.hours, d.acres, d.miles, d.loads, 1, round(d.hours * 3.2, 3), d.bill_to, d.state,
                case when d.state <> 'draft' then d.work_date + time '18:00' end,
                case when d.state in ('approved', 'squared') then d.work_date + time '20:00' end,
                case when d.state in ('approved', 'squared') then $3::uuid end, 1, d.operator
         from generate_series($4::int + 1, $4::int + $5::int) as g
         cross join lateral (
           select make_date($6, 1, 1) + pg_temp.rnd($7, g, 1) % (make_date($6 + 1, 1, 1) - make_date($6, 1, 1)) as work_date,
                  ($8::uuid[])[1 + pg_temp.rnd($7, g, 2) % cardinality($8::uuid[])] as operator,
                  ($9::uuid[])[1 + pg_temp.rnd($7, g, 3) % cardinality($9::uuid[])] as field,
                  ($10::uuid[])[1 + pg_temp.rnd($7, g, 4) % cardinality($10::uuid[])] as power,
                  case when pg_temp.rnd($7, g, 5) % 5 <> 0 then ($11::uuid[])[1 + pg_temp.rnd($7, g, 6) % cardinality($11::uuid[])] end as implement,
                  ($12::uuid[])[1 + pg_temp.rnd($7, g, 7) % cardinality($12::uuid[])] as work_type,
                  round((5 + pg_temp.rnd($7, g, 8) % 86) / 10.0, 2) as hours,
                  round((pg_temp.rnd($7, g, 9) % 12000) / 100.0 + 1, 3) as acres,
                  round((pg_temp.rnd($7, g, 10) % 500) / 100.0 + 0.5, 3) as miles,
                  1 + pg_temp.rnd($7, g, 11) % 20 as loads,
                  case when pg_temp.rnd($7, g, 12) % 10 < 6 then ($13::uuid[])[1 + pg_temp.rnd($7, g, 13) % cardinality($13::uuid[])]
                       else ($14::uuid[])[1 + pg_temp.rnd($7, g, 14) % cardinality($14::uuid[])] end as bill_to,
                  case when $15 then (case when pg_temp.rnd($7, g, 12) % 10 < 6 then 'squared' else 'approved' end)
                       else (array['draft', 'submitted', 'approved', 'approved', 'approved', 'approved', 'approved', 'approved', 'approved', 'approved'])[1 + pg_temp.rnd($7, g, 15) % 10] end as state
         ) d`,
        [o.key, o.operationId, o.ownerId, offset, ENTRIES_PER_YEAR, year, this.op.seed, o.operators, o.fields, o.power, o.implementIds, o.workTypes, o.households, o.customers, past],
      );
      this.log(`  ${o.key}: work entries ${year} (${offset + ENTRIES_PER_YEAR} of ${this.years * ENTRIES_PER_YEAR})`);
    }
  }

  /**
   * Issued invoices: a customer's approved work of one month, for the months picked by the seeded hash,
   * priced from its relationship's sheet, locked to the invoice, mostly paid.
   */
  private async invoices(o: Outfit): Promise<void> {
    const count = INVOICES_PER_YEAR * this.years;
    await this.q(`drop table if exists pg_temp.scale_invoice_months`);
    await this.q(
      `create temp table scale_invoice_months as
       select pg_temp.sid($1 || ':invoice:' || month || ':' || party_id) as id, party_id, month,
              row_number() over (order by month, party_id) as number
       from (
         select party_id, month from (
           select distinct we.bill_to_party_id as party_id, date_trunc('month', we.work_date)::date as month
           from work_entries we join parties p on p.operation_id = we.operation_id and p.id = we.bill_to_party_id
           where we.operation_id = $2 and p.kind = 'customer' and we.state = 'approved' and we.work_date < make_date($3, 12, 1)
         ) m
         order by md5($1 || month || party_id)
         limit $4
       ) picked`,
      [o.key, o.operationId, SCALE_LAST_YEAR, count],
    );
    await this.q(
      `insert into invoices (id, operation_id, kind, series, number, party_id, status, period_from, period_to, issue_date, due_date, terms_days,
         issuer_snapshot, party_snapshot, issued_at, issued_by, created_by, version)
       select m.id, $1, 'invoice', 'INV', m.number, m.party_id, 'issued', m.month, (m.month + interval '1 month' - interval '1 day')::date,
              (m.month + interval '1 month')::date + 4, (m.month + interval '1 month')::date + 34, 30,
              jsonb_build_object('name', op.name, 'email', op.email, 'phone', op.phone, 'address', op.address),
              jsonb_build_object('name', p.name, 'email', p.email, 'phone', p.phone, 'address', p.address),
              (m.month + interval '1 month' + interval '4 days 9 hours'), $2, $2, 2
       from scale_invoice_months m
       join operations op on op.id = $1
       join parties p on p.operation_id = $1 and p.id = m.party_id`,
      [o.operationId, o.ownerId],
    );
    await this.q(
      `insert into invoice_lines (operation_id, invoice_id, position, kind, work_entry_id, work_date, description, field_name, work_type_name, quantity, unit, rate, amount, details)
       select $1, m.id, row_number() over (partition by m.id order by we.work_date, we.id), 'work', we.id, we.work_date,
              wt.name || ', ' || f.name, f.name, wt.name, q.quantity, wt.default_unit, rl.rate, round(q.quantity * rl.rate, 2),
              jsonb_build_object('rateSheetId', rs.id, 'rateSheetName', rs.name, 'chargeType', rl.charge_type, 'entryVersion', we.version, 'exactQuantity', q.quantity::text)
       from scale_invoice_months m
       join parties p on p.operation_id = $1 and p.id = m.party_id
       join work_entries we on we.operation_id = $1 and we.bill_to_party_id = m.party_id and we.state = 'approved'
            and we.work_date >= m.month and we.work_date < m.month + interval '1 month'
       join work_types wt on wt.operation_id = $1 and wt.id = we.work_type_id
       join fields f on f.operation_id = $1 and f.id = we.field_id
       join rate_sheets rs on rs.operation_id = $1 and rs.party_id is null and rs.relationship = p.relationship
       join rate_sheet_lines rl on rl.rate_sheet_id = rs.id and rl.work_type_id = we.work_type_id and rl.unit = wt.default_unit
       cross join lateral (select case wt.default_unit when 'acre' then we.acres when 'hour' then we.hours when 'mile' then we.miles
                                                        when 'load' then we.loads else we.each_count end as quantity) q`,
      [o.operationId],
    );
    await this.q(
      `insert into invoice_entries (work_entry_id, operation_id, invoice_id)
       select work_entry_id, operation_id, invoice_id from invoice_lines where operation_id = $1 and work_entry_id is not null`,
      [o.operationId],
    );
    await this.q(
      `update work_entries we set state = 'invoiced', version = 2
       from invoice_entries ie where ie.operation_id = $1 and we.operation_id = $1 and we.id = ie.work_entry_id`,
      [o.operationId],
    );
    await this.q(
      `update invoices i set subtotal = s.total, total = s.total
       from (select invoice_id, sum(amount) as total from invoice_lines where operation_id = $1 group by invoice_id) s
       where i.operation_id = $1 and i.id = s.invoice_id`,
      [o.operationId],
    );
    // Most invoices are paid in full, some in part, the rest are open (the newest months among them).
    await this.q(
      `insert into payments (operation_id, invoice_id, method, amount, received_on, reference, created_by)
       select $1, i.id, (array['cheque', 'transfer', 'cash', 'cheque'])[1 + i.number % 4],
              case when i.number % 10 = 8 then round(i.total / 2, 2) else i.total end, i.issue_date + 12 + i.number % 20, 'Ref ' || i.number, $2
       from invoices i
       where i.operation_id = $1 and i.status = 'issued' and i.total > 0 and i.number % 10 <> 9 and i.issue_date < make_date($3, 10, 1)`,
      [o.operationId, o.ownerId, SCALE_LAST_YEAR],
    );
    await this.q(
      `update invoices i set amount_paid = s.paid
       from (select invoice_id, sum(amount) as paid from payments where operation_id = $1 group by invoice_id) s
       where i.operation_id = $1 and i.id = s.invoice_id`,
      [o.operationId],
    );
    await this.q(`insert into invoice_counters (operation_id, series, next_number) values ($1, 'INV', $2)`, [o.operationId, count + 1]);
    const lines = await this.q(`select count(*)::int as n from invoice_lines where operation_id = $1`, [o.operationId]);
    this.log(`  ${o.key}: ${count} issued invoices with ${lines.rows[0].n} lines, entry locks and payments`);
  }

  private async costs(o: Outfit): Promise<void> {
    for (let year = this.firstYear; year <= SCALE_LAST_YEAR; year++) {
      const offset = (year - this.firstYear) * COSTS_PER_YEAR;
      await this.q(
        `insert into cost_entries (id, operation_id, machine_id, category, incurred_on, amount, gallons, vendor, paid_by_party_id, improvement_life_years, created_by)
         select pg_temp.sid($1 || ':cost:' || g), $2, c.machine, c.category, c.incurred_on,
                case when c.category = 'improvement' then 2000 + pg_temp.rnd($3, g, 23) % 12000 else round(20 + (pg_temp.rnd($3, g, 24) % 250000) / 100.0, 2) end,
                case when c.category = 'fuel' then round(20 + (pg_temp.rnd($3, g, 25) % 30000) / 100.0, 3) end,
                (array['Fenwold Co-op', 'Sorrel Creek Implement', 'Heron Bend Tire', 'Magpie Hill Fuel'])[1 + pg_temp.rnd($3, g, 26) % 4],
                c.paid_by, case when c.category = 'improvement' then 3 + pg_temp.rnd($3, g, 27) % 5 end, $4
         from generate_series($5::int + 1, $5::int + $6::int) as g
         cross join lateral (
           select ($7::uuid[])[1 + pg_temp.rnd($3, g, 20) % cardinality($7::uuid[])] as machine,
                  case when pg_temp.rnd($3, g, 21) % 100 = 0 then 'improvement'
                       else (array['fuel', 'fuel', 'fuel', 'repair', 'repair', 'parts', 'tires', 'insurance', 'taxes', 'housing', 'interest'])[1 + pg_temp.rnd($3, g, 22) % 11] end as category,
                  make_date($8, 1, 1) + pg_temp.rnd($3, g, 28) % (make_date($8 + 1, 1, 1) - make_date($8, 1, 1)) as incurred_on,
                  ($9::uuid[])[1 + pg_temp.rnd($3, g, 29) % cardinality($9::uuid[])] as paid_by
         ) c`,
        [o.key, o.operationId, this.op.seed, o.ownerId, offset, COSTS_PER_YEAR, o.machines, year, o.households],
      );
    }
    this.log(`  ${o.key}: ${COSTS_PER_YEAR * this.years} cost entries`);
  }

  /** Approved, unbilled work of the first customer, a week per batch, for drafting and issuing 500-entry invoices. */
  private async benchBatches(o: Outfit): Promise<void> {
    const mowing = o.workTypes[DEFAULT_WORK_TYPES.findIndex((t) => t.key === 'mowing-rotary')];
    for (let batch = 0; batch < BENCH_BATCHES; batch++) {
      const { from } = benchBatchRange(batch);
      await this.q(
        `insert into work_entries (id, operation_id, work_date, operator_user_id, field_id, power_machine_id, implement_machine_id, work_type_id,
           hours, operator_hours, acres, bill_to_party_id, state, submitted_at, approved_at, approved_by, created_by)
         select pg_temp.sid($1 || ':bench:' || $2 || ':' || g), $3, $4::date + g % 7, ($5::uuid[])[1 + g % cardinality($5::uuid[])],
                ($6::uuid[])[1 + g % cardinality($6::uuid[])], ($7::uuid[])[1 + g % cardinality($7::uuid[])], ($8::uuid[])[1 + g % cardinality($8::uuid[])],
                $9, round(1 + (g % 60) / 10.0, 2), round(1 + (g % 60) / 10.0, 2), round(5 + (g % 400) / 10.0, 3), $10, 'approved',
                $4::date + g % 7 + time '18:00', $4::date + g % 7 + time '20:00', $11, ($5::uuid[])[1 + g % cardinality($5::uuid[])]
         from generate_series(1, $12::int) as g`,
        [o.key, batch, o.operationId, from, o.operators, o.fields, o.power, o.implementIds, mowing, o.customers[0], o.ownerId, BENCH_BATCH_ENTRIES],
      );
    }
    this.log(`  ${o.key}: ${BENCH_BATCHES} batches of ${BENCH_BATCH_ENTRIES} approved entries kept for issuing`);
  }

  private async squareUps(o: Outfit): Promise<void> {
    const rows = [];
    for (let year = this.firstYear; year <= SCALE_LAST_YEAR; year++) {
      rows.push({ id: this.id('square-up', year), operation_id: o.operationId, name: `Year ${year}`, period_from: `${year}-01-01`, period_to: `${year}-12-31`, status: 'open', fixed_costs_by: 'ownership', created_by: o.ownerId });
    }
    await this.insertRows('square_ups', rows);
  }
}

/** Fills an empty, migrated database with the two outfits; refuses a database that already holds them. */
export async function seedScale(url: string, { years, log = console.log }: ScaleOptions): Promise<void> {
  if (!Number.isInteger(years) || years < 1 || years > 10) throw new Error('--years must be a whole number from 1 to 10.');
  const handle = createDb(url, { max: 1, applicationName: 'hitchbook-seed-scale' });
  const client = await handle.pool.connect();
  try {
    const started = Date.now();
    const existing = await client.query(`select name from operations where id = $1`, [stableId('a:operation:0')]);
    if (existing.rowCount) throw new Error(`this database already holds the scale outfits ("${existing.rows[0].name}"); generate into a fresh, migrated database`);
    log(`Scale data: 2 operations × ${years} year(s) to ${SCALE_LAST_YEAR}, ${ENTRIES_PER_YEAR * years} work entries each`);
    // Each outfit is one transaction: a failed run leaves that outfit out entirely, never half of it.
    await client.query(`create function pg_temp.rnd(seed int, g int, k int) returns int language sql immutable
      as $$ select ('x' || substr(md5(seed || ':' || g || ':' || k), 1, 8))::bit(32)::int & 2147483647 $$`);
    await client.query(SQL_STABLE_ID);
    const passwordHash = await bcrypt.hash(SCALE_PASSWORD, 12);
    for (const op of SCALE_OPERATIONS) {
      await client.query('begin');
      try {
        await new Generator(client, op, years, passwordHash, log).run();
        await client.query('commit');
      } catch (err) {
        await client.query('rollback');
        throw err;
      }
    }
    log('  analyze');
    await client.query('analyze');
    log(`Scale data done in ${((Date.now() - started) / 1000).toFixed(0)} s`);
  } finally {
    client.release();
    await handle.close();
  }
}

function yearsArgument(args: string[]): number {
  const i = args.indexOf('--years');
  if (i === -1) return 10;
  return Number(args[i + 1]);
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const url = process.env.DATABASE_URL;
  if (!url) {
    console.error('DATABASE_URL is not set.');
    process.exit(1);
  }
  seedScale(url, { years: yearsArgument(process.argv.slice(2)) }).catch((err: unknown) => {
    console.error('Scale seeding failed:', err instanceof Error ? err.message : err);
    process.exitCode = 1;
  });
}

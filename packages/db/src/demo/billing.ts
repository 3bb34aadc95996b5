/**
 * The invented outfit's rate sheets and first invoices: a family sheet with machine-hour rates, a
 * neighbour sheet, a public-agency sheet that adjusts for diesel, and an override sheet for Okonkwo
 * Dairy from mid-year; a paid invoice for Okonkwo Dairy's first month of custom work and an open one
 * for Marisol Brandvold's latest month, both priced line by line by the engine from the work part's
 * approved entries. Every rate and amount here is made up.
 */
import type { Decimal } from 'decimal.js';
import { and, asc, eq, gte, inArray, lte, sql } from 'drizzle-orm';
import { Dec } from '@hitchbook/shared/decimal';
import { toMoneyString } from '@hitchbook/shared/money';
import { priceVisitOrThrow, type LineItem, type Rate, type RateSheet as EngineSheet, type RateUnit } from '@hitchbook/shared/pricing';
import type { Transaction } from '../client.js';
import type { DemoPart } from '../seed.js';
import {
  fields,
  invoiceCounters,
  invoiceEntries,
  invoiceLines,
  invoices,
  machineRates,
  machines,
  operations,
  parties,
  payments,
  rateSheetLines,
  rateSheets,
  workEntries,
  workTypes,
  type NewRateSheet,
  type WorkEntry,
} from '../schema/index.js';

type Prices = Readonly<Record<string, string>>;

/** Neighbour custom rates by work-type key, in each type's usual unit. */
const NEIGHBOUR_PRICES: Prices = {
  'mowing-rotary': '18.50',
  'roadside-mowing': '45.00',
  disking: '19.00',
  'field-cultivating': '17.25',
  planting: '24.50',
  drilling: '20.00',
  'side-dressing': '14.00',
  'anhydrous-application': '16.50',
  spraying: '9.25',
  'grain-cart': '85.00',
  hauling: '14.00',
  'brush-clearing': '95.00',
  tiling: '120.00',
  other: '90.00',
};
/** Family work is charged at about two thirds of the neighbour rate. */
const FAMILY_SHARE = '0.66';
const AGENCY_PRICES: Prices = { 'roadside-mowing': '48.00', 'mowing-rotary': '19.50', 'brush-clearing': '98.00', hauling: '15.00' };
const OKONKWO_PRICES: Prices = { ...NEIGHBOUR_PRICES, 'mowing-rotary': '16.75', hauling: '12.50' };

const iso = (d: Date) => d.toISOString().slice(0, 10);
const addDays = (date: string, days: number) => iso(new Date(Date.parse(`${date}T00:00:00Z`) + days * 86_400_000));
const monthEnd = (month: string) => iso(new Date(Date.UTC(Number(month.slice(0, 4)), Number(month.slice(5, 7)), 0)));

const KIND_OF: Record<LineItem['kind'], 'work' | 'fuel-adjustment' | 'labour' | 'minimum' | 'travel'> = {
  work: 'work',
  'fuel-adjustment': 'fuel-adjustment',
  'operator-labor': 'labour',
  'minimum-charge': 'minimum',
  'travel-flat': 'travel',
  'travel-mileage': 'travel',
};

interface SeededSheet {
  id: string;
  name: string;
  values: NewRateSheet;
  prices: Prices;
}

export const seedBilling: DemoPart = async (tx, ctx) => {
  const { operationId } = ctx;
  const typeRows = await tx.select().from(workTypes).where(eq(workTypes.operationId, operationId));
  const typeByKey = new Map(typeRows.map((t) => [t.key, t]));
  const [first] = await tx.select({ date: workEntries.workDate }).from(workEntries).where(eq(workEntries.operationId, operationId)).orderBy(asc(workEntries.workDate)).limit(1);
  if (!first) return;
  const today = iso(new Date());
  const yearStart = `${first.date.slice(0, 4)}-01-01`;
  // Okonkwo Dairy's own prices start on the first of the month six months back.
  const sixMonthsBack = new Date();
  sixMonthsBack.setUTCMonth(sixMonthsBack.getUTCMonth() - 6, 1);
  const overrideFrom = iso(sixMonthsBack);

  const sheet = async (values: Omit<NewRateSheet, 'operationId'>, prices: Prices): Promise<SeededSheet> => {
    const full = { ...values, operationId };
    const [row] = await tx.insert(rateSheets).values(full).returning({ id: rateSheets.id });
    const lines = Object.entries(prices)
      .filter(([key]) => typeByKey.has(key))
      .map(([key, rate]) => ({ operationId, rateSheetId: row!.id, workTypeId: typeByKey.get(key)!.id, unit: typeByKey.get(key)!.defaultUnit, chargeType: 'custom' as const, rate }));
    await tx.insert(rateSheetLines).values(lines);
    return { id: row!.id, name: values.name, values: full, prices };
  };

  const familyPrices = Object.fromEntries(Object.entries(NEIGHBOUR_PRICES).map(([k, v]) => [k, new Dec(v).times(FAMILY_SHARE).toDecimalPlaces(2).toFixed(2)]));
  const family = await sheet({ name: 'Family rates', relationship: 'family', effectiveFrom: yearStart, termsDays: 30, notes: 'Used for square-ups between the households.' }, familyPrices);
  // Machine-hour rates for one household using another's machine (invented: about $0.40 per PTO hp plus $8).
  const fleet = await tx.select().from(machines).where(eq(machines.operationId, operationId));
  await tx.insert(machineRates).values(
    fleet.map((m) => ({
      operationId,
      rateSheetId: family.id,
      machineId: m.id,
      ratePerHour: m.ptoHp ? new Dec(m.ptoHp).times('0.40').plus(8).toDecimalPlaces(0).toFixed(2) : '15.00',
    })),
  );
  const neighbour = await sheet(
    { name: 'Neighbour custom rates', relationship: 'neighbour', effectiveFrom: yearStart, minimumCharge: '75.00', minimumPer: 'entry', travelFlat: '20.00', termsDays: 21 },
    NEIGHBOUR_PRICES,
  );
  await sheet(
    {
      name: 'Road district rates',
      relationship: 'agency',
      effectiveFrom: yearStart,
      travelPerMile: '0.6500',
      fuelBasePrice: '3.6000',
      fuelStep: '0.2000',
      fuelAdjustPctPerStep: '1.5000',
      termsDays: 30,
      notes: 'Fuel adjustment per the road district agreement.',
    },
    AGENCY_PRICES,
  );
  await sheet(
    {
      name: 'Okonkwo Dairy rates',
      relationship: 'neighbour',
      partyId: ctx.partyIds.get('neighbourB')!,
      effectiveFrom: overrideFrom,
      minimumCharge: '60.00',
      minimumPer: 'visit',
      termsDays: 21,
      notes: 'Next door: no travel charge, one minimum per visit.',
    },
    OKONKWO_PRICES,
  );

  // The paid invoice: Okonkwo Dairy's busiest month of custom work before its own sheet started.
  const okonkwo = ctx.partyIds.get('neighbourB')!;
  const firstMonth = busiest((await billableMonths(tx, operationId, okonkwo)).filter((m) => monthEnd(m.month) < overrideFrom), 'earliest');
  let number = 0;
  let lastIssue = '';
  if (firstMonth) {
    const issueDate = addDays(monthEnd(firstMonth), 3);
    const id = await issueInvoice(tx, { operationId, partyId: okonkwo, month: firstMonth, sheet: neighbour, number: ++number, issueDate, typeKeyOf: (id) => typeRows.find((t) => t.id === id)!.key });
    const [inv] = await tx.select().from(invoices).where(eq(invoices.id, id));
    await tx.insert(payments).values({ operationId, invoiceId: id, method: 'cheque', amount: inv!.total, receivedOn: addDays(issueDate, 12), reference: 'Cheque 2218' });
    await tx.update(invoices).set({ amountPaid: inv!.total }).where(eq(invoices.id, id));
    lastIssue = issueDate;
  }

  // The open invoice: Marisol Brandvold's busiest month, issued a few days ago; later work is left to bill.
  const brandvold = ctx.partyIds.get('neighbourA')!;
  const lastMonth = busiest(await billableMonths(tx, operationId, brandvold), 'latest');
  if (lastMonth) {
    // Numbers and issue dates run in the same order; never later than today.
    const latest = [addDays(today, -3), addDays(monthEnd(lastMonth), 1), ...(lastIssue ? [addDays(lastIssue, 1)] : [])].sort().at(-1)!;
    await issueInvoice(tx, { operationId, partyId: brandvold, month: lastMonth, sheet: neighbour, number: ++number, issueDate: latest > today ? today : latest, typeKeyOf: (id) => typeRows.find((t) => t.id === id)!.key });
  }
  if (number > 0) await tx.insert(invoiceCounters).values({ operationId, series: 'INV', nextNumber: number + 1 });
};

/** Months (YYYY-MM) in which the party has approved, unbilled entries, oldest first, with how many. */
async function billableMonths(tx: Transaction, operationId: string, partyId: string): Promise<Array<{ month: string; entries: number }>> {
  const rows = await tx
    .select({ date: workEntries.workDate })
    .from(workEntries)
    .where(and(eq(workEntries.operationId, operationId), eq(workEntries.billToPartyId, partyId), eq(workEntries.state, 'approved')))
    .orderBy(asc(workEntries.workDate));
  const counts = new Map<string, number>();
  for (const r of rows) counts.set(r.date.slice(0, 7), (counts.get(r.date.slice(0, 7)) ?? 0) + 1);
  return [...counts].map(([month, entries]) => ({ month, entries }));
}

/** The month with the most entries; a tie goes to the earliest or the latest of them. */
function busiest(months: Array<{ month: string; entries: number }>, tie: 'earliest' | 'latest'): string | undefined {
  const ordered = tie === 'latest' ? [...months].reverse() : months;
  return ordered.reduce<{ month: string; entries: number } | undefined>((best, m) => (!best || m.entries > best.entries ? m : best), undefined)?.month;
}

interface InvoicePlan {
  operationId: string;
  partyId: string;
  month: string;
  sheet: SeededSheet;
  number: number;
  issueDate: string;
  typeKeyOf: (workTypeId: string) => string;
}

/** Prices the month's entries day by day as the API does, and stores the invoice issued with frozen lines. */
async function issueInvoice(tx: Transaction, plan: InvoicePlan): Promise<string> {
  const from = `${plan.month}-01`;
  const to = monthEnd(plan.month);
  const entries = await tx
    .select({ entry: workEntries, fieldName: fields.name, workTypeName: workTypes.name, unit: workTypes.defaultUnit })
    .from(workEntries)
    .innerJoin(fields, eq(fields.id, workEntries.fieldId))
    .innerJoin(workTypes, eq(workTypes.id, workEntries.workTypeId))
    .where(and(eq(workEntries.operationId, plan.operationId), eq(workEntries.billToPartyId, plan.partyId), eq(workEntries.state, 'approved'), gte(workEntries.workDate, from), lte(workEntries.workDate, to)))
    .orderBy(asc(workEntries.workDate), asc(fields.name), asc(workEntries.id));
  const s = plan.sheet.values;
  const engineSheet = (rates: Rate[]): EngineSheet => ({ kind: s.relationship, rates, travel: { flatPerVisit: s.travelFlat ?? '0', perMile: s.travelPerMile ?? '0' } });

  const lines: Array<Omit<typeof invoiceLines.$inferInsert, 'invoiceId'>> = [];
  const byDay = new Map<string, typeof entries>();
  for (const e of entries) byDay.set(e.entry.workDate, [...(byDay.get(e.entry.workDate) ?? []), e]);
  for (const [workDate, day] of byDay) {
    const rates = new Map<string, Rate>();
    for (const e of day) {
      rates.set(e.entry.workTypeId, {
        workTypeId: e.entry.workTypeId,
        label: e.workTypeName,
        unit: e.unit,
        chargeType: 'custom',
        pricePerUnit: plan.sheet.prices[plan.typeKeyOf(e.entry.workTypeId)]!,
        ...(s.minimumCharge && new Dec(s.minimumCharge).gt(0) ? { minimumCharge: { amount: s.minimumCharge, per: s.minimumPer ?? 'entry' } } : {}),
      });
    }
    const priced = priceVisitOrThrow(engineSheet([...rates.values()]), {
      visitId: workDate,
      partyId: plan.partyId,
      entries: day.map((e) => ({ entryId: e.entry.id, workTypeId: e.entry.workTypeId, quantity: quantityOf(e.entry, e.unit), machineHours: e.entry.hours })),
    });
    for (const item of priced.lines) {
      const billed = day.find((e) => e.entry.id === item.entryId);
      lines.push({
        operationId: plan.operationId,
        position: lines.length + 1,
        kind: KIND_OF[item.kind],
        workEntryId: item.entryId,
        workDate,
        description: item.label,
        fieldName: billed?.fieldName ?? null,
        workTypeName: billed?.workTypeName ?? null,
        quantity: new Dec(item.quantity).toDecimalPlaces(3).toFixed(),
        unit: item.unit,
        rate: new Dec(item.unitPrice).toDecimalPlaces(4).toFixed(),
        amount: item.amount,
        details: { rateSheetId: plan.sheet.id, rateSheetName: plan.sheet.name, chargeType: 'custom', entryVersion: billed ? billed.entry.version + 1 : null, exactQuantity: item.quantity },
      });
    }
  }
  const total = toMoneyString(lines.reduce<Decimal>((sum, l) => sum.plus(l.amount), new Dec(0)));
  const [operation] = await tx.select().from(operations).where(eq(operations.id, plan.operationId));
  const [party] = await tx.select().from(parties).where(eq(parties.id, plan.partyId));
  const snapshot = (p: { name: string; email: string | null; phone: string | null; address: string | null }) => ({ name: p.name, email: p.email, phone: p.phone, address: p.address });
  const termsDays = s.termsDays ?? 30;
  const [invoice] = await tx
    .insert(invoices)
    .values({
      operationId: plan.operationId,
      kind: 'invoice',
      series: 'INV',
      number: plan.number,
      partyId: plan.partyId,
      status: 'issued',
      periodFrom: from,
      periodTo: to,
      issueDate: plan.issueDate,
      dueDate: addDays(plan.issueDate, termsDays),
      termsDays,
      subtotal: total,
      total,
      issuerSnapshot: snapshot(operation!),
      partySnapshot: snapshot(party!),
      issuedAt: new Date(`${plan.issueDate}T15:00:00Z`),
      sentAt: new Date(`${plan.issueDate}T15:05:00Z`),
    })
    .returning({ id: invoices.id });
  const id = invoice!.id;
  await tx.insert(invoiceLines).values(lines.map((l) => ({ ...l, invoiceId: id })));
  const entryIds = entries.map((e) => e.entry.id);
  await tx.insert(invoiceEntries).values(entryIds.map((workEntryId) => ({ workEntryId, operationId: plan.operationId, invoiceId: id })));
  await tx
    .update(workEntries)
    .set({ state: 'invoiced', version: sql`${workEntries.version} + 1` })
    .where(inArray(workEntries.id, entryIds));
  return id;
}

function quantityOf(entry: WorkEntry, unit: RateUnit): string {
  const value = { acre: entry.acres, hour: entry.hours, mile: entry.miles, load: entry.loads, each: entry.eachCount }[unit];
  if (value === null) throw new Error(`demo entry ${entry.id} has no quantity per ${unit}`);
  return value;
}

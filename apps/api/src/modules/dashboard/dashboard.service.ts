import { Inject, Injectable } from '@nestjs/common';
import { and, count, eq } from 'drizzle-orm';
import { memberships, parties } from '@hitchbook/db';
import { Dec, fixed } from '@hitchbook/shared/decimal';
import { formatMoney } from '@hitchbook/shared/money';
import { MONEY_ROLES } from '@hitchbook/shared/roles';
import type { DashboardCardDto, DashboardChartDto, DashboardDto } from '@hitchbook/shared/schemas/reports';
import type { InvoiceState } from '@hitchbook/shared/schemas/invoices';
import type { Actor } from '../../common/auth/actor.js';
import { DB, type DbHandle } from '../../core/database.js';
import { invoiceScopeOf, wholeOperation, type InvoiceScope } from '../customer-portal/invoice-scope.js';
import { numberLabel } from '../invoices/invoice-numbers.js';
import { InvoicesRepository } from '../invoices/invoices.repository.js';
import { PartiesRepository } from '../parties/parties.repository.js';
import { SquareUpsService } from '../square-ups/square-ups.service.js';
import { DashboardRepository } from './dashboard.repository.js';

const DAY_MS = 24 * 60 * 60 * 1000;
/** A power unit that worked without a meter reading for this long needs one. */
const METER_READING_DAYS = 30;
const CHART_WEEKS = 12;
/** Invoices added up per card; an outfit with more overdue than this has bigger trouble than the card. */
const INVOICE_CARD_LIMIT = 500;
const OPEN_STATES: InvoiceState[] = ['issued', 'partly-paid', 'overdue'];

function isoDay(ms: number): string {
  return new Date(ms).toISOString().slice(0, 10);
}

/** The Monday starting the week `weeksBack` weeks before the current one (UTC calendar). */
function mondayWeeksBack(now: number, weeksBack: number): string {
  const dayOfWeek = (new Date(now).getUTCDay() + 6) % 7;
  return isoDay(now - (dayOfWeek + 7 * weeksBack) * DAY_MS);
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** What each role should see first when it signs in: what needs doing, and a few small charts. Operators never see money. */
@Injectable()
export class DashboardService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(PartiesRepository) private readonly parties: PartiesRepository,
    @Inject(DashboardRepository) private readonly repo: DashboardRepository,
    @Inject(InvoicesRepository) private readonly invoices: InvoicesRepository,
    @Inject(SquareUpsService) private readonly squareUps: SquareUpsService,
  ) {}

  async dashboard(actor: Actor): Promise<DashboardDto> {
    if (actor.role === 'customer') return { cards: await this.customerCards(actor), charts: [] };
    const now = Date.now();
    const cards: DashboardCardDto[] = [];
    const charts: DashboardChartDto[] = [];
    const money = MONEY_ROLES.includes(actor.role);

    if (actor.role === 'owner' || actor.role === 'partner') {
      const counts = await this.repo.entryCounts(actor.operationId, null);
      cards.push({ key: 'entries-waiting', label: 'Entries waiting for approval', value: String(counts.submitted), hint: 'Submitted from the cab; approve them to bill or square up' });
    }
    if (actor.role === 'operator') {
      const mine = await this.repo.entryCounts(actor.operationId, actor.userId);
      cards.push({ key: 'my-drafts', label: 'My drafts', value: String(mine.draft), hint: 'Saved but not yet submitted' });
      cards.push({ key: 'my-submitted', label: 'My entries waiting', value: String(mine.submitted), hint: 'Submitted, waiting for approval' });
    }
    if (money) {
      const unbilled = await this.repo.unbilledByCustomer(actor.operationId);
      const estimate = unbilled.reduce((sum, row) => sum.plus(row.estimate), new Dec(0));
      const entries = unbilled.reduce((sum, row) => sum + row.entries, 0);
      const unpriced = unbilled.reduce((sum, row) => sum + row.unpriced, 0);
      cards.push({
        key: 'unbilled-work',
        label: 'Unbilled work',
        value: formatMoney(estimate),
        hint: `${plural(entries, 'approved entry', 'approved entries')} for ${plural(unbilled.length, 'customer')}, at sheet rates before minimums and travel${unpriced > 0 ? `; ${unpriced} without a rate` : ''}`,
      });
      charts.push({
        key: 'unbilled-by-customer',
        label: 'Unbilled work by customer',
        kind: 'bar',
        unit: 'usd',
        points: unbilled.map((row) => ({ label: row.name, value: row.estimate })),
        hint: 'At sheet rates before minimums, travel and fuel adjustment',
      });
      cards.push(await this.overdueCard(wholeOperation(actor.operationId)));
      if (actor.role === 'owner') {
        const refunds = await this.refundsDueCard(actor.operationId);
        if (refunds) cards.push(refunds);
      }
      cards.push(await this.squareUpCard(actor.operationId, isoDay(now)));
    }
    if (actor.role !== 'bookkeeper') {
      const due = await this.repo.machinesDueForReading(actor.operationId, isoDay(now - METER_READING_DAYS * DAY_MS));
      cards.push({
        key: 'meter-readings-due',
        label: 'Machines due for a meter reading',
        value: String(due.length),
        hint: due.length > 0 ? `Worked without a reading in ${METER_READING_DAYS} days: ${due.slice(0, 3).map((m) => m.name).join(', ')}${due.length > 3 ? '…' : ''}` : `Every machine that worked has a reading from the last ${METER_READING_DAYS} days`,
      });
    }
    charts.unshift(await this.hoursChart(actor, now));
    cards.push(...(await this.outfitCards(actor)));
    return { cards, charts };
  }

  private async hoursChart(actor: Actor, now: number): Promise<DashboardChartDto> {
    const own = actor.role === 'operator';
    const fromMonday = mondayWeeksBack(now, CHART_WEEKS - 1);
    const hours = await this.repo.hoursPerWeek(actor.operationId, fromMonday, own ? actor.userId : null);
    const start = Date.parse(`${fromMonday}T00:00:00Z`);
    const points = Array.from({ length: CHART_WEEKS }, (_, week) => {
      const monday = isoDay(start + week * 7 * DAY_MS);
      return { label: monday, value: fixed(new Dec(hours.get(monday) ?? 0), 2) };
    });
    return { key: 'hours-per-week', label: own ? 'My hours per week' : 'Machine hours per week', kind: 'bar', unit: 'hours', points, hint: `The last ${CHART_WEEKS} weeks, by the Monday each starts` };
  }

  /** Shown only while there is money to hand back: only the owner can refund it. */
  private async refundsDueCard(operationId: string): Promise<DashboardCardDto | null> {
    const due = await this.repo.refundsDue(operationId);
    if (due.length === 0) return null;
    const owed = due.reduce((sum, row) => sum.plus(row.left), new Dec(0));
    const labels = [...new Set(due.map((row) => numberLabel(row.series, row.number)))];
    return {
      key: 'refunds-due',
      label: 'Card refunds due',
      value: String(due.length),
      hint: `${formatMoney(owed)} paid by card to hand back, on ${labels.slice(0, 3).join(', ')}${labels.length > 3 ? '…' : ''}`,
    };
  }

  private async overdueCard(scope: InvoiceScope): Promise<DashboardCardDto> {
    const { rows, total } = await this.invoices.summaries(scope, { states: ['overdue'], kind: 'invoice', sort: 'dueDate', limit: INVOICE_CARD_LIMIT, offset: 0 });
    const owed = rows.reduce((sum, row) => sum.plus(row.balance), new Dec(0));
    return { key: 'overdue-invoices', label: 'Overdue invoices', value: String(total), hint: total > 0 ? `${formatMoney(owed)} past due${total > rows.length ? ` on the oldest ${rows.length}` : ''}` : 'Nothing past due' };
  }

  private async squareUpCard(operationId: string, today: string): Promise<DashboardCardDto> {
    const open = await this.squareUps.openBalance(operationId, today);
    if (!open) return { key: 'square-up-balance', label: 'Open square-up', value: formatMoney(0), hint: 'No open square-up period' };
    return { key: 'square-up-balance', label: `Open square-up: ${open.squareUp.name}`, value: formatMoney(open.positiveBalances), hint: 'What the households owe one another so far' };
  }

  private async outfitCards(actor: Actor): Promise<DashboardCardDto[]> {
    const byKind = await this.parties.countByKind(actor.operationId);
    const cards: DashboardCardDto[] = [
      { key: 'households', label: 'Households', value: String(byKind.household), hint: 'Family households that own and use machines' },
      { key: 'customers', label: 'Customers', value: String(byKind.customer), hint: 'Neighbours and agencies billed for custom work' },
    ];
    if (actor.role === 'owner' || actor.role === 'bookkeeper') {
      const rows = await this.dbh.db
        .select({ status: memberships.status, n: count() })
        .from(memberships)
        .where(eq(memberships.operationId, actor.operationId))
        .groupBy(memberships.status);
      const n = (s: string) => rows.find((r) => r.status === s)?.n ?? 0;
      cards.push({ key: 'members', label: 'People with a sign-in', value: String(n('active')) });
      cards.push({ key: 'invitations', label: 'Invitations waiting', value: String(n('invited')), hint: 'Sent but not yet accepted' });
    }
    return cards;
  }

  private async customerCards(actor: Actor): Promise<DashboardCardDto[]> {
    const [party] = actor.partyId
      ? await this.dbh.db.select({ name: parties.name }).from(parties).where(and(eq(parties.id, actor.partyId), eq(parties.operationId, actor.operationId)))
      : [];
    const { rows, total } = await this.invoices.summaries(invoiceScopeOf(actor), { states: OPEN_STATES, kind: 'invoice', sort: 'dueDate', limit: INVOICE_CARD_LIMIT, offset: 0 });
    const owed = rows.reduce((sum, row) => sum.plus(row.balance), new Dec(0));
    return [
      { key: 'open-invoices', label: 'Open invoices', value: String(total), hint: 'Issued and not yet paid in full' },
      { key: 'open-balance', label: 'Balance due', value: formatMoney(owed), hint: 'Pay online or by cheque' },
      { key: 'billed-to', label: 'Account', value: party?.name ?? actor.name },
      { key: 'billed-by', label: 'Custom work by', value: actor.operationName },
    ];
  }
}

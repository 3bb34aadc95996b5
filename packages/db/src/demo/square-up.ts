/**
 * The invented outfit's square-ups: last season closed, its statement frozen and its transfers paid;
 * this season open and in progress. The statement is computed from the demo's own costs and entries with
 * the same sums and engine the API uses. Dates follow the day the seed runs, like the other demo parts.
 */
import { eq } from 'drizzle-orm';
import type { SquareUpDto, SquareUpStatementDto, TransferMethod } from '@hitchbook/shared/schemas/square-ups';
import { needsActualRates, squareUpStatementOrThrow } from '@hitchbook/shared/square-up';
import type { DemoPart } from '../seed.js';
import { squareUps, squareUpTransfers } from '../schema/index.js';
import { actualMachineRates, squareFamilyWork, statementSums } from '../square-up-sums.js';

const DAY_MS = 24 * 60 * 60 * 1000;
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
/** How the households settled last season, one transfer after another. */
const PAYMENTS: ReadonlyArray<{ method: TransferMethod; reference: string; daysAfterClose: number }> = [
  { method: 'cheque', reference: 'Cheque 2291', daysAfterClose: 4 },
  { method: 'transfer', reference: 'Farm account transfer', daysAfterClose: 9 },
  { method: 'cash', reference: 'Paid at the Sunday dinner', daysAfterClose: 15 },
];

/** The first day of the month `offset` months from the one containing `now`. */
function monthStart(now: Date, offset: number): Date {
  return new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() + offset, 1));
}

const iso = (d: Date) => d.toISOString().slice(0, 10);
const label = (d: Date) => `${MONTHS[d.getUTCMonth()]} ${d.getUTCFullYear()}`;

export const seedSquareUp: DemoPart = async (tx, ctx) => {
  const { operationId } = ctx;
  const now = new Date();
  const owner = ctx.userIds.get('owner@hitchbook.test')!;
  // Last season: the six months that start a year ago, well before any entry still waits for approval.
  const closedFrom = monthStart(now, -12);
  const closedTo = new Date(monthStart(now, -6).getTime() - DAY_MS);
  const openTo = new Date(monthStart(now, 6).getTime() - DAY_MS);
  const closedAt = new Date(closedTo.getTime() + 10 * DAY_MS);

  const [last] = await tx
    .insert(squareUps)
    .values({ operationId, name: `Last season, ${label(closedFrom)} to ${label(closedTo)}`, periodFrom: iso(closedFrom), periodTo: iso(closedTo), createdBy: owner, createdAt: closedAt })
    .returning();
  const scope = { operationId, from: last!.periodFrom, to: last!.periodTo };
  const sums = await statementSums(tx, scope);
  if (sums.pendingEntries > 0) throw new Error(`The demo's last season has ${sums.pendingEntries} entries waiting for approval; it cannot close.`);
  const actual = needsActualRates(sums) ? await actualMachineRates(tx, operationId, closedTo.getUTCFullYear()) : new Map();
  const header: SquareUpDto = {
    id: last!.id,
    name: last!.name,
    periodFrom: last!.periodFrom,
    periodTo: last!.periodTo,
    status: 'closed',
    fixedCostsBy: last!.fixedCostsBy,
    closedAt: closedAt.toISOString(),
    createdAt: last!.createdAt.toISOString(),
  };
  const statement = squareUpStatementOrThrow(header, sums, actual, closedAt.toISOString());

  const transfers =
    statement.transfers.length === 0
      ? []
      : await tx
          .insert(squareUpTransfers)
          .values(statement.transfers.map((t) => ({ operationId, squareUpId: last!.id, position: t.position, fromPartyId: t.fromHouseholdId, toPartyId: t.toHouseholdId, amount: t.amount })))
          .returning();
  await squareFamilyWork(tx, scope);
  const frozen: SquareUpStatementDto = {
    ...statement,
    frozen: true,
    transfers: statement.transfers.map((t, index) => ({ ...t, id: transfers[index]!.id })),
  };
  await tx.update(squareUps).set({ status: 'closed', closedAt, closedBy: owner, statement: frozen }).where(eq(squareUps.id, last!.id));

  for (const [index, transfer] of transfers.entries()) {
    const payment = PAYMENTS[index % PAYMENTS.length]!;
    const paidOn = new Date(closedAt.getTime() + payment.daysAfterClose * DAY_MS);
    await tx
      .update(squareUpTransfers)
      .set({ paidOn: iso(paidOn), method: payment.method, reference: payment.reference, recordedBy: owner, recordedAt: paidOn })
      .where(eq(squareUpTransfers.id, transfer.id));
  }

  // This season: from the day after last season to the end of the fifth month ahead, twelve months in all.
  const openFrom = monthStart(now, -6);
  await tx.insert(squareUps).values({
    operationId,
    name: `This season, ${label(openFrom)} to ${label(openTo)}`,
    periodFrom: iso(openFrom),
    periodTo: iso(openTo),
    createdBy: owner,
  });
};

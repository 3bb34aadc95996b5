import { Inject, Injectable } from '@nestjs/common';
import type { Executor } from '@hitchbook/db';
import { conflict } from '../../common/errors/app-error.js';
import { DB, type DbHandle } from '../../core/database.js';
import { SquareUpsRepository } from './square-ups.repository.js';

/**
 * The guard other features call before writing a cost or a work entry dated on a day: a closed
 * square-up's statement is final, so a correction goes into the next period instead.
 */
@Injectable()
export class SquareUpPeriods {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(SquareUpsRepository) private readonly repo: SquareUpsRepository,
  ) {}

  /**
   * Throws a 409 when the day falls in a closed period. Pass the transaction of the write: the check
   * then holds a share lock on the covering periods, so a period cannot close while the write is in flight.
   */
  async assertPeriodOpenOrThrow(operationId: string, date: string, executor: Executor = this.dbh.db): Promise<void> {
    const closed = (await this.repo.coveringForShare(operationId, date, executor)).find((period) => period.status === 'closed');
    if (closed) throw conflict(closedMessage(date, closed));
  }

  /** For a file of many rows: each of the days that falls in a closed period, with the same reason, in one query. */
  async closedDaysAmong(operationId: string, days: string[], executor: Executor = this.dbh.db): Promise<Map<string, string>> {
    const found = new Map<string, string>();
    if (days.length === 0) return found;
    const sorted = [...days].sort();
    const closed = await this.repo.closedOverlappingForShare(operationId, sorted[0]!, sorted[sorted.length - 1]!, executor);
    for (const day of days) {
      const period = closed.find((p) => p.periodFrom <= day && p.periodTo >= day);
      if (period) found.set(day, closedMessage(day, period));
    }
    return found;
  }
}

function closedMessage(date: string, period: { name: string; periodFrom: string; periodTo: string }): string {
  return `${date} falls in the closed square-up "${period.name}" (${period.periodFrom} to ${period.periodTo}); record the correction in the next period.`;
}

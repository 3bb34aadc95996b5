import { sql, type SQL } from 'drizzle-orm';
import type PgBoss from 'pg-boss';
import type { Executor } from '@hitchbook/db';

/**
 * Lets pg-boss write its job row through an open Drizzle transaction, so a job is queued if and only if
 * the change that asked for it commits (an outbox without a second table). pg-boss numbers its
 * parameters $1, $2, …; each one becomes a bound parameter again, never text.
 */
export function jobDbOf(executor: Executor): PgBoss.Db {
  return {
    async executeSql(text: string, values: unknown[] = []) {
      const chunks: SQL[] = [];
      let last = 0;
      for (const match of text.matchAll(/\$(\d+)/g)) {
        chunks.push(sql.raw(text.slice(last, match.index)));
        chunks.push(sql`${sql.param(values[Number(match[1]) - 1] ?? null)}`);
        last = match.index + match[0].length;
      }
      chunks.push(sql.raw(text.slice(last)));
      const result = await executor.execute(sql.join(chunks));
      return { rows: result.rows };
    },
  };
}

import { createHash } from 'node:crypto';
import type { SQL } from 'drizzle-orm';
import type { Executor } from './client.js';

/** What drizzle's node-postgres database and transaction keep to build and send a query. */
interface DrizzleInternals {
  dialect: { sqlToQuery(query: SQL): { sql: string; params: unknown[] } };
  session: { prepareQuery(query: { sql: string; params: unknown[] }, fields: undefined, name: string, arrayMode: false): { execute(): Promise<{ rows: unknown[] }> } };
}

/**
 * Runs a read as a named prepared statement, on the database or inside a transaction. Each pooled
 * connection then parses and plans the text once, and PostgreSQL keeps a generic plan once it is no
 * worse than the custom ones: for the year reports' many-CTE queries, planning cost about as much as
 * running them. The name is the digest of the text, so it suits only texts built from a fixed set of
 * shapes with every value a parameter. An executor that is not drizzle's (one that records the queries
 * it is given) is handed the query as it is.
 */
export async function executePrepared<T extends Record<string, unknown>>(executor: Executor, query: SQL): Promise<{ rows: T[] }> {
  const { dialect, session } = executor as unknown as Partial<DrizzleInternals>;
  if (!dialect || !session) return (await executor.execute<T>(query)) as unknown as { rows: T[] };
  const built = dialect.sqlToQuery(query);
  const name = `hb_${createHash('sha1').update(built.sql).digest('base64url')}`;
  return (await session.prepareQuery(built, undefined, name, false).execute()) as { rows: T[] };
}

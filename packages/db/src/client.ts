import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema/index.js';

export type Database = NodePgDatabase<typeof schema> & { $client: pg.Pool };
export type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];
/** Either the database or an open transaction: repositories accept both. */
export type Executor = Database | Transaction;

export interface DbHandle {
  db: Database;
  pool: pg.Pool;
  close(): Promise<void>;
}

// numeric and bigint columns stay strings: money and quantities go to decimal.js, never to a JS number.
pg.types.setTypeParser(pg.types.builtins.NUMERIC, (v) => v);

export interface DbOptions {
  max?: number;
  applicationName?: string;
  /**
   * The server ends a session that sits this long inside a transaction without sending anything, so a
   * stuck request cannot hold row locks (an invoice counter, say) for ever.
   */
  idleInTransactionTimeoutMs?: number;
}

export function createDb(connectionString: string, options: DbOptions = {}): DbHandle {
  const pool = new pg.Pool({
    connectionString,
    max: options.max ?? 10,
    connectionTimeoutMillis: 3000,
    idleTimeoutMillis: 30000,
    application_name: options.applicationName ?? 'hitchbook',
    ...(options.idleInTransactionTimeoutMs ? { idle_in_transaction_session_timeout: options.idleInTransactionTimeoutMs } : {}),
  });
  // A dropped idle connection (database restart) must not crash the process; the pool reconnects on next use.
  pool.on('error', () => undefined);
  // A connection in use whose server goes away (pg_terminate_backend, an immediate shutdown) reports it as
  // an 'error' event outside any query, which would end the process unheard. The query in flight fails on
  // its own, and the pool drops the broken connection when it is given back.
  pool.on('connect', (client) => client.on('error', () => undefined));
  const db = drizzle({ client: pool, schema, casing: 'snake_case' }) as Database;
  return { db, pool, close: () => pool.end() };
}

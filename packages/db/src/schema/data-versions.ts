import { bigint, pgTable, primaryKey, uuid } from 'drizzle-orm/pg-core';

// An operation's data version: a counter that moves with every committed transaction writing that
// operation's rows, so a computed answer (a list page, a year's report) can be kept and reused until the
// data under it changes. Nothing in the application writes these tables: triggers on every table of an
// operation's rows note the change, and the note is published when the transaction commits (migration 0012).

/** The version of each operation that has seen a write; an operation missing here is at version 0. */
export const operationDataVersions = pgTable('operation_data_versions', {
  // No foreign key: the version of an operation being deleted is published in the same commit.
  operationId: uuid().primaryKey(),
  version: bigint({ mode: 'bigint' }).notNull(),
});

/**
 * The operations a transaction in flight has written, one row each. The row's deferred trigger bumps the
 * version at commit and removes the row, so the version's row lock is held only while committing, after
 * every other lock the transaction takes, and two writers cannot deadlock on it.
 */
export const operationDataChanges = pgTable(
  'operation_data_changes',
  {
    txid: bigint({ mode: 'bigint' }).notNull(),
    operationId: uuid().notNull(),
  },
  (t) => [primaryKey({ name: 'operation_data_changes_pkey', columns: [t.txid, t.operationId] })],
);

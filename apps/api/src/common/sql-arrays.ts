import { sql, type SQL } from 'drizzle-orm';

// A JavaScript array inside drizzle's sql template expands to a parenthesised list; bound as one
// parameter instead, the driver sends it as a PostgreSQL array.
export type ArrayType = 'uuid' | 'numeric' | 'text' | 'date' | 'timestamptz';

export function typedArray(values: readonly unknown[], type: ArrayType): SQL {
  return sql`${sql.param([...values])}::${sql.raw(type)}[]`;
}

export function uuidArray(ids: readonly string[]): SQL {
  return typedArray(ids, 'uuid');
}

export function numericArray(values: readonly string[]): SQL {
  return typedArray(values, 'numeric');
}

/**
 * A batch of rows as one array parameter per column, for `insert … select … from unnest(…)`: one statement
 * whatever the batch's size, and no parameter per cell to build and bind.
 */
export function columnsOf<Row>(rows: readonly Row[]) {
  return <T>(type: ArrayType, pick: (row: Row) => T): SQL => typedArray(rows.map(pick), type);
}

import { sql, type SQL } from 'drizzle-orm';

// A JavaScript array inside drizzle's sql template expands to a parenthesised list; bound as one
// parameter instead, the driver sends it as a PostgreSQL array.
export function uuidArray(ids: readonly string[]): SQL {
  return sql`${sql.param([...ids])}::uuid[]`;
}

export function numericArray(values: readonly string[]): SQL {
  return sql`${sql.param([...values])}::numeric[]`;
}

import { randomUUID } from 'node:crypto';
import pg from 'pg';
import { runMigrations } from './migrate.js';

/**
 * Creates a throwaway database next to the test database, migrated, for tests that need an empty one.
 * Returns its URL and a function that drops it.
 */
export async function createScratchDatabase(baseUrl: string): Promise<{ url: string; drop(): Promise<void> }> {
  const name = `hb_scratch_${randomUUID().replace(/-/g, '').slice(0, 12)}`;
  const admin = new URL(baseUrl);
  admin.pathname = '/postgres';
  const client = new pg.Client({ connectionString: admin.toString() });
  await client.connect();
  await client.query(`create database ${name}`);
  await client.end();
  const url = new URL(baseUrl);
  url.pathname = `/${name}`;
  await runMigrations(url.toString());
  return {
    url: url.toString(),
    async drop() {
      const c = new pg.Client({ connectionString: admin.toString() });
      await c.connect();
      await c.query(`drop database if exists ${name} with (force)`);
      await c.end();
    },
  };
}

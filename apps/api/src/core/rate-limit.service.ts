import { Inject, Injectable } from '@nestjs/common';
import { sql } from 'drizzle-orm';
import { DB, type DbHandle } from './database.js';

export interface RateLimitState {
  hits: number;
  blockedForSeconds: number;
}

/**
 * Fixed-window counters in PostgreSQL, so every API instance shares one count per key.
 * One upsert per hit: the window restarts once it has passed.
 */
@Injectable()
export class RateLimitService {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  async hit(key: string, windowSeconds: number, limit: number, blockSeconds: number): Promise<RateLimitState> {
    const result = await this.dbh.db.execute<{ hits: number; blocked_for: string | null }>(sql`
      insert into rate_limits as r (key, hits, window_ends_at)
      values (${key}, 1, now() + make_interval(secs => ${windowSeconds}))
      on conflict (key) do update set
        hits = case when r.window_ends_at < now() then 1 else r.hits + 1 end,
        window_ends_at = case when r.window_ends_at < now() then now() + make_interval(secs => ${windowSeconds}) else r.window_ends_at end,
        blocked_until = case
          when r.blocked_until > now() then r.blocked_until
          when r.window_ends_at >= now() and r.hits + 1 >= ${limit} then now() + make_interval(secs => ${blockSeconds})
          else null end
      returning hits, ceil(extract(epoch from (blocked_until - now())))::text as blocked_for`);
    const row = result.rows[0]!;
    return { hits: row.hits, blockedForSeconds: row.blocked_for ? Math.max(1, Number(row.blocked_for)) : 0 };
  }

  async blockedFor(key: string): Promise<number> {
    const result = await this.dbh.db.execute<{ blocked_for: string | null }>(sql`
      select ceil(extract(epoch from (blocked_until - now())))::text as blocked_for
      from rate_limits where key = ${key} and blocked_until > now()`);
    const value = result.rows[0]?.blocked_for;
    return value ? Math.max(1, Number(value)) : 0;
  }

  async clear(key: string): Promise<void> {
    await this.dbh.db.execute(sql`delete from rate_limits where key = ${key}`);
  }
}

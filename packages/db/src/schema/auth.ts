import { sql } from 'drizzle-orm';
import { check, index, integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { id } from './columns.js';
import { memberships, users } from './users.js';

/** One signed-in device: the family of refresh tokens that descend from one sign-in. */
export const authSessions = pgTable(
  'auth_sessions',
  {
    id: id(),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    membershipId: uuid()
      .notNull()
      .references(() => memberships.id, { onDelete: 'cascade' }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    lastUsedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    /** Absolute lifetime: no refresh extends a session past this. */
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    revokedAt: timestamp({ withTimezone: true }),
    revokedReason: text(),
  },
  (t) => [index('auth_sessions_user_idx').on(t.userId)],
);

/** Refresh tokens are stored only as SHA-256 hashes; each is good for one rotation. */
export const refreshTokens = pgTable(
  'refresh_tokens',
  {
    id: id(),
    sessionId: uuid()
      .notNull()
      .references(() => authSessions.id, { onDelete: 'cascade' }),
    tokenHash: text().notNull().unique('refresh_tokens_token_hash_key'),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    usedAt: timestamp({ withTimezone: true }),
  },
  (t) => [index('refresh_tokens_session_idx').on(t.sessionId)],
);

/** Single-use links sent by e-mail: invitations and password resets. */
export const userTokens = pgTable(
  'user_tokens',
  {
    id: id(),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    membershipId: uuid().references(() => memberships.id, { onDelete: 'cascade' }),
    purpose: text({ enum: ['invitation', 'password-reset'] }).notNull(),
    tokenHash: text().notNull().unique('user_tokens_token_hash_key'),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    usedAt: timestamp({ withTimezone: true }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('user_tokens_user_idx').on(t.userId),
    check('user_tokens_purpose_check', sql`${t.purpose} in ('invitation', 'password-reset')`),
  ],
);

/** Fixed-window counters kept in the database so every API instance sees the same counts. */
export const rateLimits = pgTable('rate_limits', {
  key: text().primaryKey(),
  hits: integer().notNull().default(0),
  windowEndsAt: timestamp({ withTimezone: true }).notNull(),
  blockedUntil: timestamp({ withTimezone: true }),
});

export type AuthSession = typeof authSessions.$inferSelect;
export type RefreshToken = typeof refreshTokens.$inferSelect;
export type UserToken = typeof userTokens.$inferSelect;

import { createSecretKey } from 'node:crypto';
import { Inject, Injectable } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import { and, eq, gt, isNull, ne, sql, type Placeholder } from 'drizzle-orm';
import { authSessions, memberships, operationDataVersions, operations, refreshTokens, users, type Executor } from '@hitchbook/db';
import type { SessionUser } from '@hitchbook/shared/schemas/auth';
import type { Actor } from '../../common/auth/actor.js';
import { AppError } from '../../common/errors/app-error.js';
import { APP_CONFIG, type AppConfig } from '../../core/config.js';
import { DB, type DbHandle } from '../../core/database.js';
import { digestToken, newOpaqueToken } from './tokens.js';

export const JWT_AUDIENCE = 'hitchbook-api';
export const JWT_ISSUER = 'hitchbook';

interface AccessClaims {
  sub: string;
  sid: string;
  typ: string;
}

export interface IssuedSession {
  sessionId: string;
  refreshToken: string;
  refreshExpiresAt: Date;
}

/** Sessions, refresh-token rotation with reuse detection, and access tokens. */
@Injectable()
export class SessionService {
  /**
   * jsonwebtoken turns a string secret into a key on every call, first trying it as a public key and
   * catching the failure, which costs more than checking the signature; the key is made once.
   * @nestjs/jwt hands it through as it is, though its option type names only strings and buffers.
   */
  private readonly jwtKey: Buffer;
  private readonly actorOfSession: ReturnType<SessionService['actorQuery']>;
  private readonly actorOfUserSession: ReturnType<SessionService['actorQuery']>;

  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @Inject(JwtService) private readonly jwt: JwtService,
  ) {
    this.jwtKey = createSecretKey(Buffer.from(config.jwtSecret)) as unknown as Buffer;
    this.actorOfSession = this.actorQuery('session_actor', undefined);
    this.actorOfUserSession = this.actorQuery('session_actor_of_user', sql.placeholder('userId'));
  }

  async issueAccessToken(userId: string, sessionId: string): Promise<string> {
    const claims: AccessClaims = { sub: userId, sid: sessionId, typ: 'access' };
    return this.jwt.signAsync(claims, {
      algorithm: 'HS256',
      audience: JWT_AUDIENCE,
      issuer: JWT_ISSUER,
      expiresIn: this.config.accessTokenTtlSeconds,
      secret: this.jwtKey,
    });
  }

  /** Verifies the token and resolves the member from the database; null for anything not currently valid. */
  async actorFromAccessToken(token: string): Promise<Actor | null> {
    let claims: AccessClaims;
    try {
      claims = await this.jwt.verifyAsync<AccessClaims>(token, {
        algorithms: ['HS256'],
        audience: JWT_AUDIENCE,
        issuer: JWT_ISSUER,
        secret: this.jwtKey,
      });
    } catch {
      return null;
    }
    if (claims.typ !== 'access' || typeof claims.sid !== 'string' || typeof claims.sub !== 'string') return null;
    if (!/^[0-9a-f-]{36}$/i.test(claims.sid) || !/^[0-9a-f-]{36}$/i.test(claims.sub)) return null;
    return this.actorForSession(claims.sid, claims.sub);
  }

  async actorForSession(sessionId: string, userId?: string): Promise<Actor | null> {
    const rows = userId === undefined ? await this.actorOfSession.execute({ sessionId }) : await this.actorOfUserSession.execute({ sessionId, userId });
    const row = rows[0];
    return row ? { ...row, sessionId } : null;
  }

  /** Every signed-in request asks this, so it is built once and prepared, its plan kept per connection. */
  private actorQuery(name: string, userId: Placeholder | undefined) {
    return this.dbh.db
      .select({
        userId: users.id,
        email: users.email,
        name: users.name,
        membershipId: memberships.id,
        operationId: memberships.operationId,
        operationName: operations.name,
        role: memberships.role,
        partyId: memberships.partyId,
        dataVersion: sql<string>`coalesce(${operationDataVersions.version}, 0)::text`,
      })
      .from(authSessions)
      .innerJoin(memberships, eq(memberships.id, authSessions.membershipId))
      .innerJoin(users, eq(users.id, authSessions.userId))
      .innerJoin(operations, eq(operations.id, memberships.operationId))
      .leftJoin(operationDataVersions, eq(operationDataVersions.operationId, memberships.operationId))
      .where(
        and(
          eq(authSessions.id, sql.placeholder('sessionId')),
          userId ? eq(authSessions.userId, userId) : undefined,
          isNull(authSessions.revokedAt),
          gt(authSessions.expiresAt, sql`now()`),
          isNull(users.disabledAt),
          eq(memberships.status, 'active'),
        ),
      )
      .limit(1)
      .prepare(name);
  }

  toSessionUser(actor: Actor): SessionUser {
    return {
      id: actor.userId,
      email: actor.email,
      name: actor.name,
      role: actor.role,
      operationId: actor.operationId,
      operationName: actor.operationName,
      partyId: actor.partyId,
    };
  }

  async start(userId: string, membershipId: string, executor: Executor = this.dbh.db): Promise<IssuedSession> {
    const expiresAt = new Date(Date.now() + this.config.sessionAbsoluteSeconds * 1000);
    const [session] = await executor.insert(authSessions).values({ userId, membershipId, expiresAt }).returning({ id: authSessions.id });
    return this.addRefreshToken(session!.id, expiresAt, executor);
  }

  private async addRefreshToken(sessionId: string, sessionExpiresAt: Date, executor: Executor): Promise<IssuedSession> {
    const refreshToken = newOpaqueToken();
    const idleEnd = Date.now() + this.config.refreshIdleSeconds * 1000;
    const refreshExpiresAt = new Date(Math.min(idleEnd, sessionExpiresAt.getTime()));
    await executor.insert(refreshTokens).values({ sessionId, tokenHash: digestToken(refreshToken), expiresAt: refreshExpiresAt });
    return { sessionId, refreshToken, refreshExpiresAt };
  }

  /**
   * Trades a refresh token for a new one. A token that was already traded is a sign it was copied:
   * the whole session (every token descended from the same sign-in) is revoked.
   */
  async rotate(refreshToken: string): Promise<IssuedSession & { userId: string }> {
    const outcome = await this.dbh.db.transaction(async (tx) => {
      const [token] = await tx
        .select({
          id: refreshTokens.id,
          sessionId: refreshTokens.sessionId,
          usedAt: refreshTokens.usedAt,
          expiresAt: refreshTokens.expiresAt,
          sessionRevokedAt: authSessions.revokedAt,
          sessionExpiresAt: authSessions.expiresAt,
          userId: authSessions.userId,
        })
        .from(refreshTokens)
        .innerJoin(authSessions, eq(authSessions.id, refreshTokens.sessionId))
        .where(eq(refreshTokens.tokenHash, digestToken(refreshToken)))
        .for('update', { of: refreshTokens })
        .limit(1);
      if (!token) return { kind: 'unknown' as const };
      if (token.sessionRevokedAt) return { kind: 'revoked' as const };
      if (token.usedAt) {
        await tx.update(authSessions).set({ revokedAt: new Date(), revokedReason: 'refresh-token-reuse' }).where(eq(authSessions.id, token.sessionId));
        return { kind: 'reused' as const };
      }
      const now = Date.now();
      if (token.expiresAt.getTime() <= now || token.sessionExpiresAt.getTime() <= now) return { kind: 'expired' as const };
      await tx.update(refreshTokens).set({ usedAt: new Date() }).where(eq(refreshTokens.id, token.id));
      await tx.update(authSessions).set({ lastUsedAt: new Date() }).where(eq(authSessions.id, token.sessionId));
      const issued = await this.addRefreshToken(token.sessionId, token.sessionExpiresAt, tx);
      return { kind: 'rotated' as const, issued: { ...issued, userId: token.userId } };
    });
    if (outcome.kind !== 'rotated') throw new AppError('unauthenticated', 'Your session has ended; sign in again.');
    return outcome.issued;
  }

  async revokeByRefreshToken(refreshToken: string): Promise<void> {
    await this.dbh.db.execute(sql`
      update auth_sessions set revoked_at = now(), revoked_reason = 'logout'
      where revoked_at is null and id = (select session_id from refresh_tokens where token_hash = ${digestToken(refreshToken)})`);
  }

  async revoke(sessionId: string, reason: string, executor: Executor = this.dbh.db): Promise<void> {
    await executor
      .update(authSessions)
      .set({ revokedAt: new Date(), revokedReason: reason })
      .where(and(eq(authSessions.id, sessionId), isNull(authSessions.revokedAt)));
  }

  /** Ends every session of a user (optionally but one), e.g. after a password change or reset. */
  async revokeAllForUser(userId: string, reason: string, exceptSessionId: string | null, executor: Executor = this.dbh.db): Promise<void> {
    await executor
      .update(authSessions)
      .set({ revokedAt: new Date(), revokedReason: reason })
      .where(and(eq(authSessions.userId, userId), isNull(authSessions.revokedAt), exceptSessionId ? ne(authSessions.id, exceptSessionId) : undefined));
  }

  async revokeAllForMembership(membershipId: string, reason: string, executor: Executor = this.dbh.db): Promise<void> {
    await executor
      .update(authSessions)
      .set({ revokedAt: new Date(), revokedReason: reason })
      .where(and(eq(authSessions.membershipId, membershipId), isNull(authSessions.revokedAt)));
  }
}

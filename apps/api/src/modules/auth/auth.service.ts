import { Inject, Injectable } from '@nestjs/common';
import { and, asc, eq, gt, isNull, sql } from 'drizzle-orm';
import { memberships, users, userTokens } from '@hitchbook/db';
import type { LoginResponse } from '@hitchbook/shared/schemas/auth';
import type { Actor } from '../../common/auth/actor.js';
import { AppError, invalid, notFound } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { APP_CONFIG, type AppConfig } from '../../core/config.js';
import { DB, type DbHandle } from '../../core/database.js';
import { MailQueue } from '../../core/jobs.mail.js';
import { RateLimitService } from '../../core/rate-limit.service.js';
import { hashPassword, verifyPassword } from './passwords.js';
import { SessionService, type IssuedSession } from './session.service.js';
import { digestToken, newOpaqueToken } from './tokens.js';

const WRONG_CREDENTIALS = 'Wrong e-mail or password.';
/** Failures per account before sign-in pauses (OWASP: count per account, back off; NIST caps at 100). */
const LOGIN_FAILURES_PER_ACCOUNT = 10;
const LOGIN_WINDOW_SECONDS = 15 * 60;
/** Failures from one address across all accounts, against spraying many accounts from one place. */
const LOGIN_FAILURES_PER_IP = 100;
const RESET_TOKEN_SECONDS = 60 * 60;

export interface SignedIn {
  body: LoginResponse;
  session: IssuedSession;
}

@Injectable()
export class AuthService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @Inject(SessionService) private readonly sessions: SessionService,
    @Inject(RateLimitService) private readonly limits: RateLimitService,
    @Inject(AuditService) private readonly audit: AuditService,
    @Inject(MailQueue) private readonly mail: MailQueue,
  ) {}

  async login(email: string, password: string, ip: string): Promise<SignedIn> {
    const accountKey = `login:${email}`;
    const blocked = await this.limits.blockedFor(accountKey);
    if (blocked > 0) throw new AppError('throttled', 'Too many failed sign-ins for this account; wait a few minutes and try again.', [], blocked);
    const ipKey = `login-ip:${ip}`;
    const ipBlocked = await this.limits.blockedFor(ipKey);
    if (ipBlocked > 0) throw new AppError('throttled', 'Too many failed sign-ins from this address; wait a few minutes and try again.', [], ipBlocked);

    const [row] = await this.dbh.db
      .select({ userId: users.id, passwordHash: users.passwordHash, membershipId: memberships.id })
      .from(users)
      .innerJoin(memberships, and(eq(memberships.userId, users.id), eq(memberships.status, 'active')))
      .where(and(sql`lower(${users.email}) = ${email}`, isNull(users.disabledAt)))
      .orderBy(asc(memberships.createdAt))
      .limit(1);
    const ok = await verifyPassword(password, row?.passwordHash, this.config.bcryptCost);
    if (!row || !ok) {
      await this.limits.hit(accountKey, LOGIN_WINDOW_SECONDS, LOGIN_FAILURES_PER_ACCOUNT, LOGIN_WINDOW_SECONDS);
      await this.limits.hit(ipKey, LOGIN_WINDOW_SECONDS, LOGIN_FAILURES_PER_IP, LOGIN_WINDOW_SECONDS);
      await this.audit.record({ operationId: null, actorUserId: row?.userId ?? null, action: 'auth.login-failed', entityType: 'user', entityId: row?.userId ?? null });
      throw new AppError('unauthenticated', WRONG_CREDENTIALS);
    }
    await this.limits.clear(accountKey);
    const session = await this.sessions.start(row.userId, row.membershipId);
    const signedIn = await this.signedIn(session);
    await this.audit.record({ operationId: signedIn.body.user.operationId, actorUserId: row.userId, action: 'auth.login', entityType: 'session', entityId: session.sessionId });
    return signedIn;
  }

  async refresh(refreshToken: string | undefined): Promise<SignedIn> {
    if (!refreshToken) throw new AppError('unauthenticated', 'Sign in first.');
    const session = await this.sessions.rotate(refreshToken);
    return this.signedIn(session);
  }

  async logout(refreshToken: string | undefined): Promise<void> {
    if (refreshToken) await this.sessions.revokeByRefreshToken(refreshToken);
  }

  async changePassword(actor: Actor, currentPassword: string, newPassword: string): Promise<void> {
    const key = `password-change:${actor.userId}`;
    const blocked = await this.limits.blockedFor(key);
    if (blocked > 0) throw new AppError('throttled', 'Too many wrong passwords; wait a few minutes.', [], blocked);
    const [user] = await this.dbh.db.select({ passwordHash: users.passwordHash }).from(users).where(eq(users.id, actor.userId));
    if (!(await verifyPassword(currentPassword, user?.passwordHash, this.config.bcryptCost))) {
      await this.limits.hit(key, LOGIN_WINDOW_SECONDS, LOGIN_FAILURES_PER_ACCOUNT, LOGIN_WINDOW_SECONDS);
      throw invalid('currentPassword', 'This is not your current password.');
    }
    const passwordHash = await hashPassword(newPassword, this.config.bcryptCost);
    await this.dbh.db.transaction(async (tx) => {
      await tx.update(users).set({ passwordHash, passwordChangedAt: new Date() }).where(eq(users.id, actor.userId));
      await this.sessions.revokeAllForUser(actor.userId, 'password-change', actor.sessionId, tx);
      await this.audit.record(this.audit.byActor(actor, 'user.password-changed', 'user', actor.userId), tx);
    });
  }

  /** Always answers the same, whether or not the address has an account. */
  async requestPasswordReset(email: string): Promise<void> {
    const state = await this.limits.hit(`reset:${email}`, 60 * 60, 5, 60 * 60);
    if (state.blockedForSeconds > 0) return;
    const [user] = await this.dbh.db
      .select({ id: users.id, name: users.name, email: users.email })
      .from(users)
      .where(and(sql`lower(${users.email}) = ${email}`, isNull(users.disabledAt), sql`${users.passwordHash} is not null`))
      .limit(1);
    if (!user) return;
    const token = newOpaqueToken();
    await this.dbh.db.insert(userTokens).values({
      userId: user.id,
      purpose: 'password-reset',
      tokenHash: digestToken(token),
      expiresAt: new Date(Date.now() + RESET_TOKEN_SECONDS * 1000),
    });
    const link = `${this.config.appUrl}/reset-password?token=${encodeURIComponent(token)}`;
    // Not awaited: the answer must not take longer for addresses that have an account.
    this.mail.enqueueInBackground({
      to: user.email,
      subject: 'Reset your Hitchbook password',
      text: `Hello ${user.name},\n\nSomeone asked to reset the password of your Hitchbook sign-in. If it was you, open this link within an hour:\n\n${link}\n\nIf it was not you, ignore this e-mail; your password stays as it is.\n`,
    });
  }

  async confirmPasswordReset(token: string, password: string): Promise<void> {
    const passwordHash = await hashPassword(password, this.config.bcryptCost);
    await this.dbh.db.transaction(async (tx) => {
      const [row] = await tx
        .update(userTokens)
        .set({ usedAt: new Date() })
        .where(and(eq(userTokens.tokenHash, digestToken(token)), eq(userTokens.purpose, 'password-reset'), isNull(userTokens.usedAt), gt(userTokens.expiresAt, sql`now()`)))
        .returning({ userId: userTokens.userId });
      if (!row) throw invalid('token', 'This reset link is invalid or has expired; ask for a new one.');
      await tx.update(users).set({ passwordHash, passwordChangedAt: new Date() }).where(eq(users.id, row.userId));
      await this.sessions.revokeAllForUser(row.userId, 'password-reset', null, tx);
      await this.audit.record({ operationId: null, actorUserId: row.userId, action: 'user.password-reset', entityType: 'user', entityId: row.userId }, tx);
    });
  }

  async describeInvitation(token: string): Promise<{ email: string; role: string; operationName: string }> {
    const rows = await this.dbh.db.execute<{ email: string; role: string; operation_name: string }>(sql`
      select u.email, m.role, o.name as operation_name
      from user_tokens t
      join users u on u.id = t.user_id
      join memberships m on m.id = t.membership_id
      join operations o on o.id = m.operation_id
      where t.token_hash = ${digestToken(token)} and t.purpose = 'invitation' and t.used_at is null and t.expires_at > now()`);
    const row = rows.rows[0];
    if (!row) throw notFound('This invitation is invalid or has expired.');
    return { email: row.email, role: row.role, operationName: row.operation_name };
  }

  async acceptInvitation(token: string, name: string, password: string): Promise<SignedIn> {
    const passwordHash = await hashPassword(password, this.config.bcryptCost);
    const session = await this.dbh.db.transaction(async (tx) => {
      const [row] = await tx
        .update(userTokens)
        .set({ usedAt: new Date() })
        .where(and(eq(userTokens.tokenHash, digestToken(token)), eq(userTokens.purpose, 'invitation'), isNull(userTokens.usedAt), gt(userTokens.expiresAt, sql`now()`)))
        .returning({ userId: userTokens.userId, membershipId: userTokens.membershipId });
      if (!row || !row.membershipId) throw invalid('token', 'This invitation is invalid or has expired; ask for a new one.');
      await tx.update(users).set({ name, passwordHash, passwordChangedAt: new Date() }).where(eq(users.id, row.userId));
      const [membership] = await tx
        .update(memberships)
        .set({ status: 'active' })
        .where(eq(memberships.id, row.membershipId))
        .returning({ operationId: memberships.operationId });
      if (!membership) throw invalid('token', 'This invitation was withdrawn.');
      await this.audit.record({ operationId: membership.operationId, actorUserId: row.userId, action: 'user.invitation-accepted', entityType: 'membership', entityId: row.membershipId }, tx);
      return this.sessions.start(row.userId, row.membershipId, tx);
    });
    return this.signedIn(session);
  }

  private async signedIn(session: IssuedSession): Promise<SignedIn> {
    const actor = await this.sessions.actorForSession(session.sessionId);
    if (!actor) throw new AppError('unauthenticated', 'Your session has ended; sign in again.');
    const accessToken = await this.sessions.issueAccessToken(actor.userId, session.sessionId);
    return { body: { accessToken, expiresIn: this.config.accessTokenTtlSeconds, user: this.sessions.toSessionUser(actor) }, session };
  }
}

import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, eq, ne, sql } from 'drizzle-orm';
import { memberships, parties, users, userTokens, type Executor } from '@hitchbook/db';
import type { Role } from '@hitchbook/shared/roles';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { Actor } from '../../common/auth/actor.js';
import { conflict, invalid, notFound } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { APP_CONFIG, type AppConfig } from '../../core/config.js';
import { DB, type DbHandle } from '../../core/database.js';
import { MailQueue } from '../../core/jobs.mail.js';
import { SessionService } from '../auth/session.service.js';
import { digestToken, newOpaqueToken } from '../auth/tokens.js';

const INVITATION_SECONDS = 7 * 24 * 60 * 60;

export interface MemberDto {
  membershipId: string;
  userId: string;
  email: string;
  name: string;
  role: Role;
  partyId: string | null;
  partyName: string | null;
  status: 'active' | 'invited';
}

@Injectable()
export class UsersService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @Inject(AuditService) private readonly audit: AuditService,
    @Inject(MailQueue) private readonly mail: MailQueue,
    @Inject(SessionService) private readonly sessions: SessionService,
  ) {}

  async list(actor: Actor, page: number, pageSize: number): Promise<Page<MemberDto>> {
    const where = eq(memberships.operationId, actor.operationId);
    const [rows, totals] = await Promise.all([
      this.dbh.db
        .select({
          membershipId: memberships.id,
          userId: users.id,
          email: users.email,
          name: users.name,
          role: memberships.role,
          partyId: memberships.partyId,
          partyName: parties.name,
          status: memberships.status,
        })
        .from(memberships)
        .innerJoin(users, eq(users.id, memberships.userId))
        .leftJoin(parties, eq(parties.id, memberships.partyId))
        .where(where)
        .orderBy(asc(users.name), asc(memberships.id))
        .limit(pageSize)
        .offset((page - 1) * pageSize),
      this.dbh.db.select({ n: count() }).from(memberships).where(where),
    ]);
    return { items: rows, total: totals[0]?.n ?? 0, page, pageSize };
  }

  async invite(actor: Actor, input: { email: string; name: string; role: Role; partyId?: string | null }): Promise<MemberDto> {
    const token = newOpaqueToken();
    const member = await this.dbh.db.transaction(async (tx) => {
      const partyName = await this.checkParty(actor, input.role, input.partyId ?? null, tx);
      const [existing] = await tx.select({ id: users.id }).from(users).where(sql`lower(${users.email}) = ${input.email}`);
      if (existing) throw conflict('This e-mail address already has a Hitchbook sign-in.');
      const [user] = await tx.insert(users).values({ email: input.email, name: input.name }).returning({ id: users.id });
      const [membership] = await tx
        .insert(memberships)
        .values({ operationId: actor.operationId, userId: user!.id, role: input.role, partyId: input.partyId ?? null, status: 'invited' })
        .returning({ id: memberships.id });
      await tx.insert(userTokens).values({
        userId: user!.id,
        membershipId: membership!.id,
        purpose: 'invitation',
        tokenHash: digestToken(token),
        expiresAt: new Date(Date.now() + INVITATION_SECONDS * 1000),
      });
      const dto: MemberDto = {
        membershipId: membership!.id,
        userId: user!.id,
        email: input.email,
        name: input.name,
        role: input.role,
        partyId: input.partyId ?? null,
        partyName,
        status: 'invited',
      };
      await this.audit.record(this.audit.byActor(actor, 'membership.invited', 'membership', membership!.id, { after: dto }), tx);
      // Queued in the same transaction: the invitation mail goes out exactly when the invitation exists.
      const link = `${this.config.appUrl}/accept-invite?token=${encodeURIComponent(token)}`;
      await this.mail.enqueue(
        {
          to: input.email,
          subject: `${actor.name} invited you to ${actor.operationName} on Hitchbook`,
          text:
            `Hello ${input.name},\n\n${actor.name} invited you to join ${actor.operationName} on Hitchbook as ${input.role}.\n\n` +
            `Open this link within 7 days to choose your password and sign in:\n\n${link}\n`,
        },
        tx,
      );
      return dto;
    });
    return member;
  }

  async update(actor: Actor, membershipId: string, input: { role?: Role; partyId?: string | null }): Promise<MemberDto> {
    return this.dbh.db.transaction(async (tx) => {
      const before = await this.findMember(actor.operationId, membershipId, tx);
      const role = input.role ?? before.role;
      const partyId = input.partyId !== undefined ? input.partyId : before.partyId;
      if (before.role === 'owner' && role !== 'owner') await this.assertAnotherOwner(actor.operationId, membershipId, tx);
      const partyName = await this.checkParty(actor, role, partyId, tx);
      await tx.update(memberships).set({ role, partyId }).where(and(eq(memberships.id, membershipId), eq(memberships.operationId, actor.operationId)));
      const after: MemberDto = { ...before, role, partyId, partyName };
      await this.audit.record(this.audit.byActor(actor, 'membership.updated', 'membership', membershipId, { before, after }), tx);
      return after;
    });
  }

  async remove(actor: Actor, membershipId: string): Promise<void> {
    await this.dbh.db.transaction(async (tx) => {
      const before = await this.findMember(actor.operationId, membershipId, tx);
      if (before.role === 'owner') await this.assertAnotherOwner(actor.operationId, membershipId, tx);
      await this.sessions.revokeAllForMembership(membershipId, 'membership-removed', tx);
      await tx.delete(memberships).where(and(eq(memberships.id, membershipId), eq(memberships.operationId, actor.operationId)));
      await this.audit.record(this.audit.byActor(actor, 'membership.removed', 'membership', membershipId, { before }), tx);
    });
  }

  private async findMember(operationId: string, membershipId: string, tx: Executor): Promise<MemberDto> {
    const [row] = await tx
      .select({
        membershipId: memberships.id,
        userId: users.id,
        email: users.email,
        name: users.name,
        role: memberships.role,
        partyId: memberships.partyId,
        partyName: parties.name,
        status: memberships.status,
      })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .leftJoin(parties, eq(parties.id, memberships.partyId))
      .where(and(eq(memberships.id, membershipId), eq(memberships.operationId, operationId)))
      .for('update', { of: memberships });
    if (!row) throw notFound('No such member.');
    return row;
  }

  private async assertAnotherOwner(operationId: string, membershipId: string, tx: Executor): Promise<void> {
    const [row] = await tx
      .select({ n: count() })
      .from(memberships)
      .where(and(eq(memberships.operationId, operationId), eq(memberships.role, 'owner'), eq(memberships.status, 'active'), ne(memberships.id, membershipId)));
    if ((row?.n ?? 0) === 0) throw conflict('An operation needs at least one owner; make someone else owner first.');
  }

  /** Customers stand for a customer party; others may stand for a household or for nobody. */
  private async checkParty(actor: Actor, role: Role, partyId: string | null, tx: Executor): Promise<string | null> {
    if (!partyId) {
      if (role === 'customer') throw invalid('partyId', 'A customer sign-in must be tied to a customer party.');
      return null;
    }
    const [party] = await tx
      .select({ kind: parties.kind, name: parties.name })
      .from(parties)
      .where(and(eq(parties.id, partyId), eq(parties.operationId, actor.operationId)));
    if (!party) throw invalid('partyId', 'No such party in this operation.');
    if (role === 'customer' && party.kind !== 'customer') throw invalid('partyId', 'A customer sign-in must be tied to a customer, not a household.');
    if (role !== 'customer' && party.kind !== 'household') throw invalid('partyId', 'Members of the outfit stand for a household, not a customer.');
    return party.name;
  }
}

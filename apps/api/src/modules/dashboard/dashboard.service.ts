import { Inject, Injectable } from '@nestjs/common';
import { and, count, eq } from 'drizzle-orm';
import { memberships, parties } from '@hitchbook/db';
import type { Actor } from '../../common/auth/actor.js';
import { DB, type DbHandle } from '../../core/database.js';
import { PartiesRepository } from '../parties/parties.repository.js';

export interface DashboardCard {
  key: string;
  label: string;
  value: string;
  hint?: string;
}

/** What each role should see first when it signs in. */
@Injectable()
export class DashboardService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(PartiesRepository) private readonly parties: PartiesRepository,
  ) {}

  async cards(actor: Actor): Promise<{ cards: DashboardCard[] }> {
    if (actor.role === 'customer') return { cards: await this.customerCards(actor) };
    const byKind = await this.parties.countByKind(actor.operationId);
    const cards: DashboardCard[] = [
      { key: 'households', label: 'Households', value: String(byKind.household), hint: 'Family households that own and use machines' },
      { key: 'customers', label: 'Customers', value: String(byKind.customer), hint: 'Neighbours and agencies billed for custom work' },
    ];
    if (actor.role === 'owner' || actor.role === 'bookkeeper') {
      const rows = await this.dbh.db
        .select({ status: memberships.status, n: count() })
        .from(memberships)
        .where(eq(memberships.operationId, actor.operationId))
        .groupBy(memberships.status);
      const n = (s: string) => rows.find((r) => r.status === s)?.n ?? 0;
      cards.push({ key: 'members', label: 'People with a sign-in', value: String(n('active')) });
      cards.push({ key: 'invitations', label: 'Invitations waiting', value: String(n('invited')), hint: 'Sent but not yet accepted' });
    }
    return { cards };
  }

  private async customerCards(actor: Actor): Promise<DashboardCard[]> {
    const [party] = actor.partyId
      ? await this.dbh.db.select({ name: parties.name }).from(parties).where(and(eq(parties.id, actor.partyId), eq(parties.operationId, actor.operationId)))
      : [];
    return [
      { key: 'billed-to', label: 'Account', value: party?.name ?? actor.name },
      { key: 'billed-by', label: 'Custom work by', value: actor.operationName },
    ];
  }
}

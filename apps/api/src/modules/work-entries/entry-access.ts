import type { WorkEntry } from '@hitchbook/db';
import type { Actor } from '../../common/auth/actor.js';
import { conflict, forbidden, notFound } from '../../common/errors/app-error.js';

export type EntryAction = 'read' | 'edit' | 'submit' | 'approve' | 'reopen' | 'delete';

/** Roles that approve and reopen; the routes allow no one else, this keeps the rule in one place too. */
const APPROVERS = new Set(['owner', 'partner']);

/**
 * The one record-level check every entry operation makes first. An operator does not learn that
 * other people's entries exist (404); a known entry in the wrong state is a conflict (409).
 */
export function requireEntryAccess(actor: Actor, action: EntryAction, entry: Pick<WorkEntry, 'operatorUserId' | 'state'>, onInvoice = false): void {
  if (actor.role === 'customer') throw forbidden();
  if (actor.role === 'operator' && entry.operatorUserId !== actor.userId) throw notFound('No such work entry.');
  if (action === 'read') return;
  if (actor.role === 'bookkeeper') throw forbidden('A bookkeeper reads entries but does not change them.');

  const billed = onInvoice || entry.state === 'invoiced' || entry.state === 'squared';
  if (billed) {
    throw conflict(entry.state === 'squared' ? 'This entry is settled in a square-up and can no longer change.' : 'This entry is on an invoice or an invoice draft and can no longer change; delete the draft, or void the invoice, to free it.');
  }
  switch (action) {
    case 'edit':
      if (entry.state === 'approved') {
        throw conflict(actor.role === 'operator' ? 'This entry is approved; ask an owner or partner to reopen it.' : 'This entry is approved; reopen it before changing it.');
      }
      return;
    case 'submit':
      if (entry.state !== 'draft') throw conflict(`Only a draft can be submitted; this entry is ${entry.state}.`);
      return;
    case 'approve':
      if (!APPROVERS.has(actor.role)) throw forbidden('Only an owner or partner approves entries.');
      if (entry.state !== 'submitted') throw conflict(entry.state === 'draft' ? 'Submit the entry before approving it.' : `This entry is already ${entry.state}.`);
      return;
    case 'reopen':
      if (!APPROVERS.has(actor.role)) throw forbidden('Only an owner or partner reopens entries.');
      if (entry.state !== 'approved') throw conflict(`Only an approved entry is reopened; this one is ${entry.state}.`);
      return;
    case 'delete':
      if (entry.state !== 'draft') throw conflict('Only a draft can be deleted.');
      return;
  }
}

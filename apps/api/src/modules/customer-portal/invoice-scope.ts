import type { Actor } from '../../common/auth/actor.js';

/** Which invoices a caller may know exist; every invoice query takes one, so scoping is never forgotten. */
export interface InvoiceScope {
  operationId: string;
  /** A customer sees only the invoices addressed to their own party. */
  partyId: string | null;
  /** Customers see only documents that were issued to them (including ones voided since), never drafts. */
  issuedOnly: boolean;
}

// A customer sign-in that lost its party sees nothing rather than everything.
const NO_PARTY = '00000000-0000-0000-0000-000000000000';

export function invoiceScopeOf(actor: Actor): InvoiceScope {
  if (actor.role === 'customer') return { operationId: actor.operationId, partyId: actor.partyId ?? NO_PARTY, issuedOnly: true };
  return wholeOperation(actor.operationId);
}

/** Every invoice of the operation: for staff and for work the server does on its own (queued e-mails, webhooks). */
export function wholeOperation(operationId: string): InvoiceScope {
  return { operationId, partyId: null, issuedOnly: false };
}

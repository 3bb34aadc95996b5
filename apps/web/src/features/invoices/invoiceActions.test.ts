import { describe, expect, it } from 'vitest';
import { invoiceActionsFor } from './invoiceActions';

const open = { kind: 'invoice', status: 'issued', total: '1414.20', balance: '1414.20', amountPaid: '0.00', amountCredited: '0.00' } as const;

describe('what the invoice page offers', () => {
  it('lets the owner adjust, issue or delete a draft, and nothing else on it but the PDF', () => {
    const actions = invoiceActionsFor('owner', { ...open, status: 'draft', balance: '0.00' });
    expect(actions).toEqual({ editDraft: true, issue: true, deleteDraft: true, downloadPdf: true, send: false, recordPayment: false, creditNote: false, void: false, refund: false });
  });

  it('lets the owner send, take a payment, credit or void an open invoice', () => {
    expect(invoiceActionsFor('owner', open)).toMatchObject({ editDraft: false, send: true, recordPayment: true, creditNote: true, void: true });
  });

  it('offers no void once a payment is recorded, and no payment once it is paid, but still a credit note', () => {
    const partly = invoiceActionsFor('owner', { ...open, balance: '414.20', amountPaid: '1000.00' });
    expect(partly).toMatchObject({ recordPayment: true, void: false });
    const paid = invoiceActionsFor('owner', { ...open, balance: '0.00', amountPaid: '1414.20' });
    expect(paid).toMatchObject({ recordPayment: false, creditNote: true, void: false, send: true });
    const creditedInFull = invoiceActionsFor('owner', { ...open, balance: '0.00', amountCredited: '1414.20' });
    expect(creditedInFull).toMatchObject({ creditNote: false, void: false });
  });

  it('takes no payment on a credit note or a void invoice, yet refunds card money that reached a void one', () => {
    expect(invoiceActionsFor('owner', { ...open, kind: 'credit-note', total: '-100.00', balance: '0.00' })).toMatchObject({ recordPayment: false, creditNote: false });
    expect(invoiceActionsFor('owner', { ...open, status: 'void', balance: '0.00' })).toMatchObject({ recordPayment: false, send: false, void: false, refund: true });
  });

  it('gives the partner and the bookkeeper the PDF only', () => {
    for (const role of ['partner', 'bookkeeper'] as const) {
      expect(invoiceActionsFor(role, open)).toEqual({ editDraft: false, issue: false, deleteDraft: false, downloadPdf: true, send: false, recordPayment: false, creditNote: false, void: false, refund: false });
    }
  });
});

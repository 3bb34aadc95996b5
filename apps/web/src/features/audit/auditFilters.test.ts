import { describe, expect, it } from 'vitest';
import { describeAction, hasAuditFilters, readAuditFilters } from './auditFilters';

describe('audit log filters in the address', () => {
  it('keeps valid filters and drops values the server would refuse', () => {
    const good = readAuditFilters(new URLSearchParams('entityType=invoice&actorUserId=2b0c4c2e-8a55-4d8e-9a43-6a4f6d0c1f11&from=2025-05-01&to=2025-05-31'));
    expect(good).toEqual({ entityType: 'invoice', actorUserId: '2b0c4c2e-8a55-4d8e-9a43-6a4f6d0c1f11', from: '2025-05-01', to: '2025-05-31' });
    const bad = readAuditFilters(new URLSearchParams('entityType=passwords&actorUserId=1&from=May&to=2025-13'));
    expect(bad).toEqual({ entityType: undefined, actorUserId: undefined, from: undefined, to: undefined });
    expect(hasAuditFilters(bad)).toBe(false);
  });

  it('drops an end date before the start', () => {
    expect(readAuditFilters(new URLSearchParams('from=2025-06-01&to=2025-05-01'))).toMatchObject({ from: '2025-06-01', to: undefined });
  });
});

describe('action names', () => {
  it('reads as a sentence', () => {
    expect(describeAction('work-entry.approved')).toBe('Work entry approved');
    expect(describeAction('invoice.draft-deleted')).toBe('Invoice draft deleted');
    expect(describeAction('membership.updated')).toBe('Member and role updated');
    expect(describeAction('payment.card-received')).toBe('Payment card received');
  });
});

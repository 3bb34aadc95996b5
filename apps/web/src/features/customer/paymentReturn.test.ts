import { describe, expect, it } from 'vitest';
import { CONFIRM_WAIT_MS, paymentReturnStatus } from './paymentReturn';

describe('coming back from the card checkout', () => {
  it('waits for the confirmation while the balance is still owed', () => {
    expect(paymentReturnStatus({ checkout: 'success', balance: '1414.20', waitedMs: 1500 })).toBe('confirming');
  });

  it('shows the invoice paid once the server has recorded the payment', () => {
    expect(paymentReturnStatus({ checkout: 'success', balance: '0.00', waitedMs: 3000 })).toBe('paid');
  });

  it('says the confirmation is slow, rather than failed, after the wait', () => {
    expect(paymentReturnStatus({ checkout: 'success', balance: '1414.20', waitedMs: CONFIRM_WAIT_MS })).toBe('slow');
  });

  it('tells a payer who left the checkout that nothing was charged', () => {
    expect(paymentReturnStatus({ checkout: 'cancelled', balance: '1414.20', waitedMs: 0 })).toBe('cancelled');
    expect(paymentReturnStatus({ checkout: null, balance: '1414.20', waitedMs: 0 })).toBe('cancelled');
  });
});

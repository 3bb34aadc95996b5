import { describe, expect, it } from 'vitest';
import { canPay } from './canPay';

describe('paying by card', () => {
  it('is offered on an issued invoice with a balance', () => {
    expect(canPay({ kind: 'invoice', status: 'issued', balance: '0.01' })).toBe(true);
  });

  it('is not offered once paid, on a void invoice or on a credit note', () => {
    expect(canPay({ kind: 'invoice', status: 'issued', balance: '0.00' })).toBe(false);
    expect(canPay({ kind: 'invoice', status: 'void', balance: '120.00' })).toBe(false);
    expect(canPay({ kind: 'credit-note', status: 'issued', balance: '0.00' })).toBe(false);
  });
});

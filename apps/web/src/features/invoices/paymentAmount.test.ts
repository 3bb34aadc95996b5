import { describe, expect, it } from 'vitest';
import { paymentOverBalance } from './paymentAmount';

describe('payment amount against the balance', () => {
  it('accepts the whole balance or less', () => {
    expect(paymentOverBalance('1414.20', '1414.20')).toBeNull();
    expect(paymentOverBalance('500', '1414.20')).toBeNull();
  });

  it('refuses a cent more than the balance, compared exactly', () => {
    expect(paymentOverBalance('1414.21', '1414.20')).toBe('At most the open balance of $1,414.20.');
    expect(paymentOverBalance('0.30', '0.3')).toBeNull();
  });

  it('reads amounts typed with a dollar sign or thousands separators', () => {
    expect(paymentOverBalance('$1,500', '1414.20')).toBe('At most the open balance of $1,414.20.');
  });

  it('leaves text that is not a number to the schema', () => {
    expect(paymentOverBalance('a lot', '10.00')).toBeNull();
    expect(paymentOverBalance('', '10.00')).toBeNull();
  });
});

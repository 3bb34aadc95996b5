import { describe, expect, it } from 'vitest';
import { ApiError } from './api-error.js';
import { parseForm } from './form-encoding.js';

describe('parseForm', () => {
  it('nests bracketed keys into hashes and numbered keys into lists, as the Stripe SDK sends them', () => {
    const form = parseForm(
      'mode=payment&line_items[0][price_data][unit_amount]=124050&line_items[0][quantity]=1&line_items[1][quantity]=2&metadata[invoiceId]=inv_14&expand[0]=line_items',
    );
    expect(form).toEqual({
      mode: 'payment',
      line_items: [{ price_data: { unit_amount: '124050' }, quantity: '1' }, { quantity: '2' }],
      metadata: { invoiceId: 'inv_14' },
      expand: ['line_items'],
    });
  });

  it('decodes percent escapes, plus signs and encoded brackets', () => {
    expect(parseForm('success_url=http%3A%2F%2Flocalhost%3A3000%2Fpaid%3Fs%3D%7BCHECKOUT_SESSION_ID%7D&metadata%5Bnote%5D=north+field')).toEqual({
      success_url: 'http://localhost:3000/paid?s={CHECKOUT_SESSION_ID}',
      metadata: { note: 'north field' },
    });
  });

  it('appends for empty brackets, as curl users write expand[]', () => {
    expect(parseForm('expand[]=payment_intent&expand[]=line_items')).toEqual({ expand: ['payment_intent', 'line_items'] });
  });

  it('keeps numbered keys with gaps as a hash, so nothing is silently renumbered', () => {
    expect(parseForm('line_items[0][quantity]=1&line_items[2][quantity]=3')).toEqual({ line_items: { 0: { quantity: '1' }, 2: { quantity: '3' } } });
  });

  it('refuses a parameter given twice or as both a value and a hash, naming it', () => {
    expect(() => parseForm('currency=usd&currency=eur')).toThrow('The parameter currency was given more than once.');
    const both = (() => {
      try {
        parseForm('metadata=x&metadata[a]=b');
      } catch (error) {
        return error;
      }
    })();
    expect(both).toBeInstanceOf(ApiError);
    expect((both as ApiError).body).toMatchObject({ type: 'invalid_request_error', message: 'The parameter metadata is given both as a value and as a hash.' });
  });

  it('stores __proto__ as a parameter without touching any prototype', () => {
    const form = parseForm('metadata[__proto__][polluted]=yes');
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    expect(Object.keys(form.metadata as object)).toEqual(['__proto__']);
  });
});

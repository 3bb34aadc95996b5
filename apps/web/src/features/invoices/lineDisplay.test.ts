import { describe, expect, it } from 'vitest';
import type { InvoiceLineDto } from '@hitchbook/shared/schemas/invoices';
import { formatLineRate, lineView } from './lineDisplay';

function line(overrides: Partial<InvoiceLineDto>): InvoiceLineDto {
  return {
    id: 'l1',
    position: 1,
    kind: 'work',
    workEntryId: 'e1',
    workDate: '2026-05-02',
    description: 'Mowing (rotary)',
    fieldName: 'Brandvold Hayfield',
    workTypeName: 'Mowing (rotary)',
    quantity: '31.700',
    unit: 'acre',
    rate: '18.5000',
    amount: '586.45',
    ...overrides,
  };
}

describe('invoice lines as printed', () => {
  it('shows a work line with its day, field, quantity, rate and amount', () => {
    expect(lineView(line({}))).toEqual({
      id: 'l1',
      date: 'May 2, 2026',
      field: 'Brandvold Hayfield',
      what: 'Mowing (rotary)',
      detail: null,
      quantity: '31.7',
      unit: 'acre',
      rate: '$18.50',
      amount: '$586.45',
      isWork: true,
    });
  });

  it('names a travel or minimum line by its kind and keeps its own wording beside it', () => {
    const travel = lineView(line({ kind: 'travel', workEntryId: null, description: 'Travel', fieldName: null, workTypeName: null, quantity: '1.000', unit: 'trip', rate: '20.0000', amount: '20.00' }));
    expect(travel).toMatchObject({ what: 'Travel', detail: null, quantity: '1', unit: 'trip', rate: '$20.00', amount: '$20.00', isWork: false });
    const minimum = lineView(line({ kind: 'minimum', description: 'Minimum charge for Mowing (rotary)', quantity: null, unit: null, rate: null, amount: '12.50' }));
    expect(minimum).toMatchObject({ what: 'Minimum charge', detail: 'Minimum charge for Mowing (rotary)', quantity: null, rate: null });
  });

  it("names a line the owner added by its own wording", () => {
    const added = lineView(line({ kind: 'adjustment', workEntryId: null, workDate: null, description: 'Tarp for the bale stack', fieldName: null, workTypeName: null, quantity: '2.000', unit: 'each', rate: '12.5000', amount: '25.00' }));
    expect(added).toMatchObject({ what: 'Tarp for the bale stack', detail: null, quantity: '2', rate: '$12.50', amount: '$25.00', isWork: false });
  });

  it('prints a discount as a negative amount', () => {
    expect(lineView(line({ kind: 'discount', description: 'Neighbour discount', workDate: null, quantity: null, unit: null, rate: null, amount: '-25.00' })).amount).toBe('-$25.00');
  });

  it('keeps the places of a fine rate instead of rounding them to cents', () => {
    expect(formatLineRate('0.6525')).toBe('$0.6525');
    expect(formatLineRate('1250.0000')).toBe('$1,250.00');
  });
});

import { describe, expect, it } from 'vitest';
import type { InvoiceLineDto } from '@hitchbook/shared/schemas/invoices';
import { addedLines, currentDiscount, extraLinesWith, extraLinesWithout } from './draftEdits';

function line(id: string, overrides: Partial<InvoiceLineDto>): InvoiceLineDto {
  return {
    id,
    position: 1,
    kind: 'work',
    workEntryId: null,
    workDate: null,
    description: '',
    fieldName: null,
    workTypeName: null,
    quantity: null,
    unit: null,
    rate: null,
    amount: '0.00',
    ...overrides,
  };
}

const draft = {
  lines: [
    line('w1', { kind: 'work', workEntryId: 'e1', description: 'Mowing (rotary)', quantity: '31.700', unit: 'acre', rate: '18.5000', amount: '586.45' }),
    line('a1', { kind: 'adjustment', description: 'Hauled bales to the barn', quantity: '2.000', unit: 'load', rate: '14.0000', amount: '28.00' }),
    line('a2', { kind: 'adjustment', description: 'Twine', quantity: '1.000', unit: 'roll', rate: '32.5000', amount: '32.50' }),
    line('d1', { kind: 'discount', description: 'Good neighbour', amount: '-20.00' }),
  ],
};

describe('draft adjustments', () => {
  it('lists only the lines the owner added, never the priced work or the discount', () => {
    expect(addedLines(draft).map((l) => l.id)).toEqual(['a1', 'a2']);
  });

  it('adds a line after the ones already added, keeping them', () => {
    expect(extraLinesWith(draft, { description: 'Grease', quantity: '1', unit: 'tube', rate: '8' })).toEqual([
      { description: 'Hauled bales to the barn', quantity: '2.000', unit: 'load', rate: '14.0000' },
      { description: 'Twine', quantity: '1.000', unit: 'roll', rate: '32.5000' },
      { description: 'Grease', quantity: '1', unit: 'tube', rate: '8' },
    ]);
  });

  it('removes one added line and keeps the others', () => {
    expect(extraLinesWithout(draft, 'a1')).toEqual([{ description: 'Twine', quantity: '1.000', unit: 'roll', rate: '32.5000' }]);
  });

  it('reads the discount as printed, or none', () => {
    expect(currentDiscount(draft)).toEqual({ description: 'Good neighbour', amount: '-20.00' });
    expect(currentDiscount({ lines: draft.lines.slice(0, 1) })).toBeNull();
  });
});

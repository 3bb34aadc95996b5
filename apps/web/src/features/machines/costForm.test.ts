import { describe, expect, it } from 'vitest';
import { costEntryCreateSchema } from '@hitchbook/shared/schemas/machines';
import { costEntryPayload, type CostFormValues } from './costForm';

function fuelTicket(): CostFormValues {
  return {
    category: 'fuel',
    incurredOn: '2025-06-03',
    amount: '$1,312.40',
    gallons: '312.5',
    meterHours: '',
    vendor: 'Fenwold Co-op',
    paidByPartyId: '0b6f1c2e-5d1a-4c5e-9a55-2f0d9a3b1c01',
    improvementLifeYears: '4',
    receiptUploadId: '',
    notes: '',
  };
}

describe('cost entry payload', () => {
  it('sends the amount as typed, without the dollar sign or thousands commas', () => {
    const payload = costEntryPayload(fuelTicket());
    expect(payload.amount).toBe('1312.40');
    expect(costEntryCreateSchema.safeParse(payload).success).toBe(true);
  });

  it('drops gallons from a repair and the life from anything but an improvement', () => {
    const payload = costEntryPayload({ ...fuelTicket(), category: 'repair' });
    expect(payload.gallons).toBeNull();
    expect(payload.improvementLifeYears).toBeNull();
    expect(costEntryCreateSchema.safeParse(payload).success).toBe(true);
  });

  it('is refused for an improvement without the years it is written off over', () => {
    const result = costEntryCreateSchema.safeParse(costEntryPayload({ ...fuelTicket(), category: 'improvement', improvementLifeYears: '' }));
    expect(result.error?.issues.map((i) => i.path.join('.'))).toContain('improvementLifeYears');
  });

  it('attaches the uploaded receipt', () => {
    const receipt = '7d0c8c1e-1b7a-4d55-8f0e-6f3f0e6b9a10';
    expect(costEntryPayload({ ...fuelTicket(), receiptUploadId: receipt }).receiptUploadId).toBe(receipt);
  });
});

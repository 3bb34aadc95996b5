import type { CostCategory } from '@hitchbook/shared/actual-rate';
import type { CostEntryCreateInput } from '@hitchbook/shared/schemas/machines';

export interface CostFormValues {
  category: CostCategory;
  incurredOn: string;
  amount: string;
  gallons: string;
  meterHours: string;
  vendor: string;
  paidByPartyId: string;
  improvementLifeYears: string;
  receiptUploadId: string;
  notes: string;
}

const orNull = (value: string) => (value.trim() ? value.trim() : null);

/** Gallons belong to fuel and a write-off life to improvements; other categories send them empty. */
export function costEntryPayload(values: CostFormValues): CostEntryCreateInput {
  return {
    category: values.category,
    incurredOn: values.incurredOn,
    amount: values.amount.trim().replace(/^\$/, '').replaceAll(',', ''),
    gallons: values.category === 'fuel' ? orNull(values.gallons) : null,
    meterHours: orNull(values.meterHours),
    vendor: orNull(values.vendor),
    paidByPartyId: values.paidByPartyId,
    improvementLifeYears: values.category === 'improvement' ? orNull(values.improvementLifeYears) : null,
    receiptUploadId: values.receiptUploadId || null,
    notes: orNull(values.notes),
  };
}

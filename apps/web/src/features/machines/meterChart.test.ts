import { describe, expect, it } from 'vitest';
import type { MeterReadingDto } from '@hitchbook/shared/schemas/machines';
import { meterPoints } from './meterChart';

function reading(readAt: string, hours: string, offsetHours: string, kind: MeterReadingDto['kind'] = 'reading'): MeterReadingDto {
  const total = (Number(hours) + Number(offsetHours)).toFixed(1);
  return { id: readAt, readAt, hours, kind, offsetHours, totalHours: total, source: 'manual', workEntryId: null, note: null };
}

describe('meter chart points', () => {
  it('orders readings oldest first whatever order they came in', () => {
    const points = meterPoints([reading('2025-06-03T12:00:00Z', '120.0', '0'), reading('2025-05-01T12:00:00Z', '100.0', '0')]);
    expect(points.map((p) => p.totalHours)).toEqual([100, 120]);
  });

  it('keeps climbing across a replaced meter and marks the reset', () => {
    const points = meterPoints([
      reading('2025-04-01T12:00:00Z', '9500.0', '0'),
      reading('2025-05-01T12:00:00Z', '0.0', '9520.0', 'reset'),
      reading('2025-06-01T12:00:00Z', '40.0', '9520.0'),
    ]);
    expect(points.map((p) => p.totalHours)).toEqual([9500, 9520, 9560]);
    expect(points.map((p) => p.reset)).toEqual([false, true, false]);
  });
});

import { describe, expect, it } from 'vitest';
import type { DashboardChartDto } from '@hitchbook/shared/schemas/reports';
import { chartRows, hasValues, isTimeSeries, shortLabel } from './chartPoints';

const chart = (values: string[]): DashboardChartDto => ({
  key: 'hours-per-week',
  label: 'Machine hours per week',
  kind: 'bar',
  unit: 'hours',
  points: values.map((value, i) => ({ label: `2026-09-${String(14 + 7 * i).padStart(2, '0')}`, value })),
});

describe('dashboard charts', () => {
  it('shortens week dates and keeps names', () => {
    expect(shortLabel('2026-09-14')).toBe('14 Sep');
    expect(shortLabel('2026-01-05')).toBe('5 Jan');
    expect(shortLabel('Okonkwo Dairy')).toBe('Okonkwo Dairy');
  });

  it('plots the decimal strings as numbers', () => {
    expect(chartRows(chart(['18.00', '0.50']))).toEqual([
      { label: '14 Sep', value: 18 },
      { label: '21 Sep', value: 0.5 },
    ]);
  });

  it('knows a chart of zeros has nothing to show', () => {
    expect(hasValues(chart(['0.00', '0.00']))).toBe(false);
    expect(hasValues(chart(['0.00', '1.50']))).toBe(true);
  });
});

describe('chart layout', () => {
  it('runs weeks along the axis and lays names on their side', () => {
    expect(isTimeSeries(chart(['1.00', '2.00']))).toBe(true);
    expect(isTimeSeries({ ...chart([]), points: [{ label: 'Okonkwo Dairy', value: '6329.98' }] })).toBe(false);
  });
});

import { describe, expect, it } from 'vitest';
import type { CostPerHourPointDto, MachineRateRowDto } from '@hitchbook/shared/schemas/reports';
import { acceptableMachines, costPerHourChart, hoursPerYearChart, yearFromParam, yearOptions } from './yearEnd';

describe('year picker', () => {
  it('keeps a valid year from the URL and falls back to this year', () => {
    expect(yearFromParam('2025', 2026)).toBe(2025);
    expect(yearFromParam(null, 2026)).toBe(2026);
    expect(yearFromParam('2027', 2026)).toBe(2026);
    expect(yearFromParam('1999', 2026)).toBe(2026);
    expect(yearFromParam('2025.5', 2026)).toBe(2026);
  });

  it('offers the years with entries and this year, newest first, once each', () => {
    expect(yearOptions([2024, 2026, 2025], 2026)).toEqual([2026, 2025, 2024]);
    expect(yearOptions([], 2026)).toEqual([2026]);
  });
});

const zero = { fuel: '0.00', repair: '0.00', parts: '0.00', tires: '0.00', insurance: '0.00', taxes: '0.00', housing: '0.00', interest: '0.00', improvement: '0.00', total: '0.00' };

describe('cost per hour chart', () => {
  it('stacks only the categories some machine spent on', () => {
    const points: CostPerHourPointDto[] = [
      { ...zero, machineId: 'a', name: 'Tractor', fuel: '12.40', repair: '3.10', total: '15.50' },
      { ...zero, machineId: 'b', name: 'Disk', repair: '8.00', total: '8.00' },
    ];
    expect(costPerHourChart(points)).toEqual({
      categories: ['fuel', 'repair'],
      data: [
        { name: 'Tractor', fuel: 12.4, repair: 3.1 },
        { name: 'Disk', fuel: 0, repair: 8 },
      ],
    });
  });
});

describe('hours per year chart', () => {
  it('gives each machine a bar per year and leaves out machines that never worked', () => {
    const chart = hoursPerYearChart({
      years: [2025, 2026],
      machines: [
        { machineId: 'a', name: 'Tractor', hours: ['7.00', '159.60'] },
        { machineId: 'b', name: 'Idle cart', hours: ['0.00', '0.00'] },
      ],
    });
    expect(chart).toEqual({ years: ['2025', '2026'], data: [{ name: 'Tractor', '2025': 7, '2026': 159.6 }] });
  });
});

describe('accepting suggestions', () => {
  const row = (id: string, status: MachineRateRowDto['status'], suggested: boolean) =>
    ({ machineId: id, status, suggestedRate: suggested ? { perHour: '50.00', basis: 'actual', marginPct: '10' } : null }) as MachineRateRowDto;
  it('offers active machines with a suggested rate only', () => {
    expect(acceptableMachines([row('a', 'active', true), row('b', 'sold', true), row('c', 'active', false)]).map((r) => r.machineId)).toEqual(['a']);
  });
});

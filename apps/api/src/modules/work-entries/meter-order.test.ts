import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { fileMeterProblems, meterEndOrderIssue, type ReadingPoint } from './meter-order.js';

const reading = (readAt: string, hours: string, kind: 'reading' | 'reset' = 'reading', offsetHours = '0'): ReadingPoint => ({ readAt: new Date(readAt), hours, kind, offsetHours, source: 'manual' });

describe('meterEndOrderIssue', () => {
  it('accepts a meter end between its neighbours and names both values when it is not', () => {
    const before = reading('2025-06-01T18:00:00Z', '1250.0');
    const after = reading('2025-06-10T18:00:00Z', '1300.0');
    expect(meterEndOrderIssue(new Decimal('1270'), before, after)).toBeNull();
    expect(meterEndOrderIssue(new Decimal('1240'), before, after)).toBe("Meter end 1240.0 is below the machine's reading of 1250.0 on 2025-06-01 (read by hand); a meter does not run backwards.");
    expect(meterEndOrderIssue(new Decimal('1301'), before, after)).toContain('later reading of 1300.0 on 2025-06-10');
  });

  it('allows any reading on the old meter below the hours the machine had when the meter was replaced', () => {
    const before = reading('2025-06-01T18:00:00Z', '9400.0');
    const reset = reading('2025-07-01T18:00:00Z', '0.0', 'reset', '9450.0');
    expect(meterEndOrderIssue(new Decimal('9440'), before, reset)).toBeNull();
    expect(meterEndOrderIssue(new Decimal('9460'), before, reset)).toContain('9450.0 h the machine had when its meter was replaced');
  });
});

describe('fileMeterProblems', () => {
  it('checks rows against stored readings and against earlier days of the same file, and hands on the meter offset', () => {
    const stored = new Map([['t1', [reading('2025-05-05T18:00:00Z', '0.0', 'reset', '5000.0')]]]);
    const { problems, offsets } = fileMeterProblems(
      [
        { row: 2, machineId: 't1', workDate: '2025-05-06', meterEnd: new Decimal('10') },
        { row: 3, machineId: 't1', workDate: '2025-05-07', meterEnd: new Decimal('8') },
        { row: 4, machineId: 't1', workDate: '2025-05-07', meterEnd: new Decimal('12') },
        { row: 5, machineId: 't2', workDate: '2025-05-01', meterEnd: new Decimal('3') },
      ],
      stored,
    );
    expect(problems).toEqual([{ row: 3, reason: expect.stringContaining('below the meter end 10.0 of row 2 on 2025-05-06') }]);
    expect(offsets.get(2)).toBe('5000.0');
    expect(offsets.get(5)).toBe('0');
  });
});

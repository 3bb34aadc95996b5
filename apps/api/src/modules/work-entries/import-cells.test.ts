import { describe, expect, it } from 'vitest';
import { dateCell, NameIndex, numberCell } from './import-cells.js';

describe('dateCell', () => {
  it('reads ISO and US month/day/year dates and refuses impossible ones', () => {
    expect(dateCell('2025-06-03')).toEqual({ ok: true, value: '2025-06-03' });
    expect(dateCell('6/3/2025')).toEqual({ ok: true, value: '2025-06-03' });
    expect(dateCell('2/30/2025').ok).toBe(false);
    expect(dateCell('03.06.2025').ok).toBe(false);
  });
});

describe('numberCell', () => {
  it('reads thousands separators and a dollar sign on money, and refuses the rest', () => {
    const money = { min: 0, max: 1_000_000, decimals: 2, money: true };
    const amount = numberCell('$1,212.50', money);
    expect(amount.ok && amount.value.toFixed(2)).toBe('1212.50');
    expect(numberCell('12.345', money)).toEqual({ ok: false, reason: 'Use whole cents.' });
    expect(numberCell('1,21', money).ok).toBe(false);
    expect(numberCell('-3', { min: 0, max: 10, decimals: 1 }).ok).toBe(false);
    expect(numberCell('0', { min: 0, max: 10, decimals: 1, positive: true })).toEqual({ ok: false, reason: 'Must be more than 0.' });
  });
});

describe('NameIndex', () => {
  it('matches names and unit numbers ignoring case and spacing, and refuses an ambiguous one', () => {
    const index = new NameIndex([{ id: 'a', name: 'Red 7120', unit: 'T-3' }, { id: 'b', name: 'Home 40', unit: null }, { id: 'c', name: 'home  40', unit: null }], (m) => [m.name, m.unit], 'machine');
    expect(index.find('red 7120')).toMatchObject({ ok: true, value: { id: 'a' } });
    expect(index.find('t-3')).toMatchObject({ ok: true, value: { id: 'a' } });
    expect(index.find('HOME 40')).toEqual({ ok: false, reason: '2 machines are called "HOME 40"; rename one so the file can say which.' });
    expect(index.find('Blue 1')).toEqual({ ok: false, reason: 'No machine called "Blue 1" in this operation.' });
  });
});

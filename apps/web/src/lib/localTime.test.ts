import { afterEach, describe, expect, it } from 'vitest';
import { localDateIso, localInstantIso, localParts, weekOf } from './localTime';

const originalTz = process.env.TZ;

afterEach(() => {
  process.env.TZ = originalTz;
});

describe('local calendar days', () => {
  it('gives the day on the local clock', () => {
    expect(localDateIso(new Date(2025, 5, 3, 21, 45))).toBe('2025-06-03');
  });

  it('finds the Monday-to-Sunday week of a Sunday and of a Monday', () => {
    expect(weekOf(new Date(2025, 5, 8, 12))).toEqual({ from: '2025-06-02', to: '2025-06-08' });
    expect(weekOf(new Date(2025, 5, 2, 0, 5))).toEqual({ from: '2025-06-02', to: '2025-06-08' });
  });
});

describe('local instants', () => {
  it('writes the offset of the local zone on that day, daylight saving included', () => {
    process.env.TZ = 'America/Chicago';
    expect(localInstantIso('2025-06-03', '07:30')).toBe('2025-06-03T07:30:00-05:00');
    expect(localInstantIso('2025-01-15', '07:30')).toBe('2025-01-15T07:30:00-06:00');
  });

  it('answers null for a missing or impossible time', () => {
    expect(localInstantIso('2025-06-03', '')).toBeNull();
    expect(localInstantIso('2025-02-30', '07:30')).toBeNull();
    expect(localInstantIso('2025-06-03', '25:00')).toBeNull();
  });

  it('reads an instant back as the local day and time it was typed as', () => {
    process.env.TZ = 'America/Chicago';
    expect(localParts('2025-06-03T12:30:00Z')).toEqual({ day: '2025-06-03', time: '07:30' });
  });
});

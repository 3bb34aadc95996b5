import type { MeterReadingDto } from '@hitchbook/shared/schemas/machines';

export interface MeterPoint {
  /** Local day of the reading, for the axis. */
  day: string;
  /** Total hours over every meter the machine had; a number for plotting only. */
  totalHours: number;
  reset: boolean;
}

const DAY = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', year: '2-digit' });

/**
 * Readings oldest first, plotted by total hours: a replaced meter restarts near zero but the
 * machine's hours carry on, so the line never drops at a reset.
 */
export function meterPoints(readings: readonly MeterReadingDto[]): MeterPoint[] {
  return [...readings]
    .sort((a, b) => Date.parse(a.readAt) - Date.parse(b.readAt))
    .map((r) => ({ day: DAY.format(new Date(r.readAt)), totalHours: Number(r.totalHours), reset: r.kind === 'reset' }));
}

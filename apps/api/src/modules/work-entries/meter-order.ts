import { Decimal } from 'decimal.js';

// An hour meter only counts up. A single entry's meter end is checked and recorded by the fleet
// module's MeterReadingsService; a CSV import checks a whole file at once here with the same rule:
// not below the reading before, not above the reading after, and below the total hours the machine
// had when a later reset replaced the meter.

export interface ReadingPoint {
  readAt: Date;
  hours: string;
  kind: 'reading' | 'reset';
  /** Hours the machine had before this meter started. */
  offsetHours: string;
  source: string;
}

/**
 * When an entry's meter end was read: its end time, or for an entry logged by the day only the end
 * of that day, so the readings of earlier passes the same day count as before it.
 */
export function entryReadingTime(workDate: string, endedAt: Date | null): Date {
  return endedAt ?? new Date(`${workDate}T23:59:59.999Z`);
}

const SOURCES: Record<string, string> = {
  manual: 'read by hand',
  'work-entry': 'from a work entry',
  'cost-entry': 'from a cost entry',
  import: 'imported',
};

function describeReading(r: ReadingPoint): string {
  return `${new Decimal(r.hours).toFixed(1)} on ${r.readAt.toISOString().slice(0, 10)} (${SOURCES[r.source] ?? r.source})`;
}

/** Why a meter end breaks the order of the machine's readings, naming both values; null when it fits. */
export function meterEndOrderIssue(meterEnd: Decimal, before: ReadingPoint | undefined, after: ReadingPoint | undefined): string | null {
  if (before && meterEnd.lt(before.hours)) {
    return `Meter end ${meterEnd.toFixed(1)} is below the machine's reading of ${describeReading(before)}; a meter does not run backwards.`;
  }
  if (after && after.kind === 'reading' && meterEnd.gt(after.hours)) {
    return `Meter end ${meterEnd.toFixed(1)} is above the machine's later reading of ${describeReading(after)}; a meter does not run backwards.`;
  }
  const offset = new Decimal(before?.offsetHours ?? 0);
  if (after && after.kind === 'reset' && offset.plus(meterEnd).gt(after.offsetHours)) {
    return `Meter end ${meterEnd.toFixed(1)} is above the ${new Decimal(after.offsetHours).toFixed(1)} h the machine had when its meter was replaced on ${after.readAt.toISOString().slice(0, 10)}.`;
  }
  return null;
}

export interface FileMeterRow {
  row: number;
  machineId: string;
  workDate: string;
  meterEnd: Decimal;
}

/** The last index whose reading is at or before `at` (readings sorted oldest first), or -1. */
function lastAtOrBefore(readings: readonly ReadingPoint[], at: Date): number {
  let lo = 0;
  let hi = readings.length - 1;
  let found = -1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (readings[mid]!.readAt.getTime() <= at.getTime()) {
      found = mid;
      lo = mid + 1;
    } else hi = mid - 1;
  }
  return found;
}

/**
 * The meter-order rule for a whole file: each row's meter end against the machine's stored readings
 * (sorted oldest first), and against the rows of earlier days in the same file.
 */
export function fileMeterProblems(
  rows: readonly FileMeterRow[],
  readingsByMachine: ReadonlyMap<string, readonly ReadingPoint[]>,
): { problems: Array<{ row: number; reason: string }>; offsets: Map<number, string> } {
  const problems: Array<{ row: number; reason: string }> = [];
  // Each imported reading sits on the meter of the reading before it, so it carries that offset.
  const offsets = new Map<number, string>();
  for (const r of rows) {
    const readings = readingsByMachine.get(r.machineId) ?? [];
    const i = lastAtOrBefore(readings, entryReadingTime(r.workDate, null));
    const issue = meterEndOrderIssue(r.meterEnd, readings[i], readings[i + 1]);
    if (issue) problems.push({ row: r.row, reason: issue });
    offsets.set(r.row, readings[i]?.offsetHours ?? '0');
  }
  const byMachine = new Map<string, FileMeterRow[]>();
  for (const r of rows) byMachine.set(r.machineId, [...(byMachine.get(r.machineId) ?? []), r]);
  for (const machineRows of byMachine.values()) {
    const ordered = [...machineRows].sort((a, b) => a.workDate.localeCompare(b.workDate) || a.meterEnd.comparedTo(b.meterEnd));
    let highestEarlier: FileMeterRow | null = null;
    let dayHighest: FileMeterRow | null = null;
    let day = '';
    for (const r of ordered) {
      if (r.workDate !== day) {
        if (dayHighest && (!highestEarlier || dayHighest.meterEnd.gt(highestEarlier.meterEnd))) highestEarlier = dayHighest;
        day = r.workDate;
        dayHighest = null;
      }
      if (highestEarlier && r.meterEnd.lt(highestEarlier.meterEnd)) {
        problems.push({
          row: r.row,
          reason: `Meter end ${r.meterEnd.toFixed(1)} is below the meter end ${highestEarlier.meterEnd.toFixed(1)} of row ${highestEarlier.row} on ${highestEarlier.workDate}, an earlier day on the same machine.`,
        });
      }
      if (!dayHighest || r.meterEnd.gt(dayHighest.meterEnd)) dayHighest = r;
    }
  }
  return { problems: problems.sort((a, b) => a.row - b.row), offsets };
}

import type { Decimal } from 'decimal.js';
import { fixed, parseDecimalOrThrow, type DecimalInput } from './decimal.js';
import { acresPerHour, fieldOperationOrThrow } from './field-capacity.js';
import { MACHINE_CLASS_IDS, machineClassOrThrow } from './machine-classes.js';
import { LONG_ENTRY_HOURS } from './work-entry-limits.js';

// Plausibility checks of a logged work entry. They never refuse an entry: each
// finding is a warning the operator or the approving partner looks at.

export type WorkEntryWarningCode = 'above-field-capacity' | 'clock-overlap' | 'meter-overlap' | 'meter-gap' | 'long-entry';

export interface WorkEntryWarning {
  code: WorkEntryWarningCode;
  message: string;
}

export { LONG_ENTRY_HOURS };

export interface CheckedMachine {
  id: string;
  name: string;
  classId: string;
  kind: 'power' | 'self-propelled' | 'implement';
  widthFt: DecimalInput | null;
  /** The machine's own figures, used in place of the class's typical ones when set. */
  speedMph: DecimalInput | null;
  fieldEfficiencyPct: DecimalInput | null;
}

export interface CheckedEntry {
  /** Absent for an entry not stored yet. */
  id?: string;
  hours: DecimalInput;
  operatorHours?: DecimalInput | null;
  acres?: DecimalInput | null;
  startedAt?: Date | null;
  endedAt?: Date | null;
  meterStart?: DecimalInput | null;
  meterEnd?: DecimalInput | null;
  powerMachineId?: string | null;
  implementMachineId?: string | null;
}

/** Another entry of the same day; `label` names it in a message (for example its field). */
export interface NeighbourEntry extends CheckedEntry {
  id: string;
  label: string;
}

export interface CapacityFigures {
  acresPerHour: Decimal;
  widthFt: Decimal;
  speedMph: Decimal;
  efficiencyPct: Decimal;
}

/**
 * Effective field capacity of the machine that sets the working width: the implement, or a
 * self-propelled machine working alone. Null when the width is unknown or the class has no
 * field speed (tractors, carts, wagons) and the machine gives none of its own.
 */
export function workingCapacity(machine: CheckedMachine): CapacityFigures | null {
  if (machine.widthFt === null || !(MACHINE_CLASS_IDS as readonly string[]).includes(machine.classId)) return null;
  const machineClass = machineClassOrThrow(machine.classId);
  const ownSpeed = machine.speedMph ?? undefined;
  const ownEfficiency = machine.fieldEfficiencyPct ?? undefined;
  if (!machineClass.fieldOperation && (ownSpeed === undefined || ownEfficiency === undefined)) return null;
  const { speedMph, efficiencyPct } = fieldOperationOrThrow(machine.classId, { speedMph: ownSpeed, efficiencyPct: ownEfficiency });
  const widthFt = parseDecimalOrThrow(machine.widthFt, 'widthFt');
  if (widthFt.lte(0)) return null;
  return { acresPerHour: acresPerHour({ speedMph, widthFt, efficiencyPct }), widthFt, speedMph, efficiencyPct };
}

export function capacityMachineOf(power: CheckedMachine | null, implement: CheckedMachine | null): CheckedMachine | null {
  if (implement) return implement;
  return power?.kind === 'self-propelled' ? power : null;
}

export function fieldCapacityWarning(entry: CheckedEntry, machine: CheckedMachine | null): WorkEntryWarning | null {
  if (!machine || entry.acres == null) return null;
  const hours = parseDecimalOrThrow(entry.hours, 'hours');
  const acres = parseDecimalOrThrow(entry.acres, 'acres');
  if (hours.lte(0) || acres.lte(0)) return null;
  const capacity = workingCapacity(machine);
  if (!capacity) return null;
  const logged = acres.div(hours);
  if (logged.lte(capacity.acresPerHour)) return null;
  return {
    code: 'above-field-capacity',
    message:
      `${fixed(acres, 1)} acres in ${fixed(hours, 2)} h is ${fixed(logged, 1)} ac/h, above the ${fixed(capacity.acresPerHour, 1)} ac/h ` +
      `that ${machine.name} covers (${fixed(capacity.widthFt, 1)} ft at ${fixed(capacity.speedMph, 1)} mph, ${fixed(capacity.efficiencyPct, 0)} % field efficiency). ` +
      'Check the acres and the hours.',
  };
}

export function longEntryWarning(entry: CheckedEntry): WorkEntryWarning | null {
  const machineHours = parseDecimalOrThrow(entry.hours, 'hours');
  const operatorHours = entry.operatorHours == null ? machineHours : parseDecimalOrThrow(entry.operatorHours, 'operatorHours');
  const longest = machineHours.gt(operatorHours) ? machineHours : operatorHours;
  if (longest.lte(LONG_ENTRY_HOURS)) return null;
  return { code: 'long-entry', message: `${fixed(longest, 2)} h in one entry is more than ${LONG_ENTRY_HOURS} h; check the hours or split the work.` };
}

function sharesMachine(a: CheckedEntry, b: CheckedEntry): boolean {
  const mine = [a.powerMachineId, a.implementMachineId].filter(Boolean);
  return mine.length > 0 && [b.powerMachineId, b.implementMachineId].some((id) => id && mine.includes(id));
}

function meterRange(e: CheckedEntry): { start: Decimal; end: Decimal } | null {
  if (e.meterStart == null || e.meterEnd == null) return null;
  return { start: parseDecimalOrThrow(e.meterStart, 'meterStart'), end: parseDecimalOrThrow(e.meterEnd, 'meterEnd') };
}

/**
 * Overlaps and gaps against the same machine's other entries that day. Clock gaps are breaks and
 * travel, so only clock overlaps are flagged; on the power unit's hour meter a gap is machine time no
 * entry accounts for, and an overlap is time logged twice.
 */
export function sameDayWarnings(entry: CheckedEntry, others: readonly NeighbourEntry[]): WorkEntryWarning[] {
  const warnings: WorkEntryWarning[] = [];
  const neighbours = others.filter((o) => o.id !== entry.id && sharesMachine(entry, o));

  if (entry.startedAt && entry.endedAt) {
    const start = entry.startedAt.getTime();
    const end = entry.endedAt.getTime();
    const clash = neighbours.filter((o) => o.startedAt && o.endedAt && o.startedAt.getTime() < end && start < o.endedAt.getTime());
    if (clash.length > 0) {
      warnings.push({ code: 'clock-overlap', message: `The clock times overlap ${describe(clash)} on the same machine that day.` });
    }
  }

  const mine = meterRange(entry);
  if (mine && entry.powerMachineId) {
    const onMeter = neighbours
      .filter((o) => o.powerMachineId === entry.powerMachineId)
      .map((o) => ({ o, range: meterRange(o) }))
      .filter((x): x is { o: NeighbourEntry; range: { start: Decimal; end: Decimal } } => x.range !== null);
    const overlapping = onMeter.filter(({ range }) => range.start.lt(mine.end) && mine.start.lt(range.end));
    if (overlapping.length > 0) {
      warnings.push({
        code: 'meter-overlap',
        message: `Meter ${fixed(mine.start, 1)}–${fixed(mine.end, 1)} overlaps ${describe(overlapping.map((x) => x.o))} on the same power unit that day.`,
      });
    } else {
      const before = onMeter.filter(({ range }) => range.end.lte(mine.start)).sort((a, b) => b.range.end.comparedTo(a.range.end))[0];
      const after = onMeter.filter(({ range }) => range.start.gte(mine.end)).sort((a, b) => a.range.start.comparedTo(b.range.start))[0];
      if (before && mine.start.gt(before.range.end)) {
        warnings.push(meterGap(before.range.end, mine.start, `after ${before.o.label}`));
      }
      if (after && after.range.start.gt(mine.end)) {
        warnings.push(meterGap(mine.end, after.range.start, `before ${after.o.label}`));
      }
    }
  }
  return warnings;
}

function meterGap(from: Decimal, to: Decimal, where: string): WorkEntryWarning {
  return {
    code: 'meter-gap',
    message: `The meter ran ${fixed(to.minus(from), 1)} h (${fixed(from, 1)} to ${fixed(to, 1)}) ${where} with no entry logged; log that time or check the readings.`,
  };
}

function describe(entries: readonly NeighbourEntry[]): string {
  const labels = entries.map((e) => e.label);
  return labels.length === 1 ? `another entry (${labels[0]})` : `${labels.length} other entries (${labels.join(', ')})`;
}

export interface PlausibilityInput {
  entry: CheckedEntry;
  power: CheckedMachine | null;
  implement: CheckedMachine | null;
  sameDay: readonly NeighbourEntry[];
}

export function plausibilityWarnings({ entry, power, implement, sameDay }: PlausibilityInput): WorkEntryWarning[] {
  return [fieldCapacityWarning(entry, capacityMachineOf(power, implement)), longEntryWarning(entry), ...sameDayWarnings(entry, sameDay)].filter(
    (w): w is WorkEntryWarning => w !== null,
  );
}

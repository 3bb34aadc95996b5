/**
 * A year of the invented outfit's work entries: family work on the households' own and rented ground,
 * custom mowing for the two neighbours, and ditch mowing for the Fenwold Township road district. Every
 * date, field and figure is made up. The entries fit the fleet part's monthly meter readings: each
 * month's entries on a tractor run up its meter from that month's first reading without passing the
 * next, and every meter end is stored as a reading of its own.
 */
import { and, asc, eq } from 'drizzle-orm';
import { Dec } from '@hitchbook/shared/decimal';
import { workingCapacity } from '@hitchbook/shared/work-entry-checks';
import type { DemoPart } from '../seed.js';
import { fields, machines, meterReadings, workEntries, workTypes, type NewWorkEntry } from '../schema/index.js';

type Decimal = InstanceType<typeof Dec>;

/** A small seeded generator, so every seed run invents the same entries. */
function random(seed: number) {
  let s = seed >>> 0;
  const next = () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let r = Math.imul(s ^ (s >>> 15), 1 | s);
    r ^= r + Math.imul(r ^ (r >>> 7), 61 | r);
    return ((r ^ (r >>> 14)) >>> 0) / 4294967296;
  };
  return {
    chance: (p: number) => next() < p,
    int: (low: number, high: number) => low + Math.floor(next() * (high - low + 1)),
    pick: <T>(items: readonly T[]): T => items[Math.floor(next() * items.length)]!,
  };
}

type Operator = 'operator@hitchbook.test' | 'partner@hitchbook.test' | 'owner@hitchbook.test';
type Ground = 'crop' | 'hay' | 'roadside' | 'any';

/** What a kind of work needs: the implement it hitches, the ground it runs on, how it is measured. */
interface Job {
  workType: string;
  implement: string | null;
  ground: Ground;
  /** Hourly work (carts, clearing, hauling) logs no acres. */
  measure: 'acres' | 'hours' | 'loads';
  notes?: readonly string[];
}

const JOBS: Record<string, Job> = {
  planting: { workType: 'planting', implement: '16-row planter', ground: 'crop', measure: 'acres' },
  anhydrous: { workType: 'anhydrous-application', implement: '13-knife NH3 bar', ground: 'crop', measure: 'acres', notes: ['Hoses and valves checked, water jug full before starting'] },
  cultivating: { workType: 'field-cultivating', implement: '36-ft field cultivator', ground: 'crop', measure: 'acres' },
  disking: { workType: 'disking', implement: '24-ft tandem disk', ground: 'crop', measure: 'acres' },
  spraying: { workType: 'spraying', implement: '90-ft sprayer', ground: 'crop', measure: 'acres' },
  drilling: { workType: 'drilling', implement: '15-ft grain drill', ground: 'crop', measure: 'acres', notes: ['Cover crop rye'] },
  cart: { workType: 'grain-cart', implement: '1000-bu grain cart', ground: 'crop', measure: 'hours' },
  mowing: { workType: 'mowing-rotary', implement: '15-ft batwing cutter', ground: 'hay', measure: 'acres', notes: ['Walked the field for wire and stones first'] },
  ditches: { workType: 'roadside-mowing', implement: '7-ft roadside cutter', ground: 'roadside', measure: 'acres', notes: ['Signs out, beacon on, mowed with traffic'] },
  brush: { workType: 'brush-clearing', implement: '15-ft batwing cutter', ground: 'hay', measure: 'hours', notes: ['Fence-line brush and volunteer trees'] },
  hauling: { workType: 'hauling', implement: null, ground: 'any', measure: 'loads', notes: ['Grain to the Pike Hollow elevator', 'Lime from the quarry pile'] },
  harvest: { workType: 'other', implement: null, ground: 'crop', measure: 'acres', notes: ['Harvest, corn', 'Harvest, soybeans'] },
};

/** Which power unit does which work in which calendar month (0 = January), and who usually runs it. */
const ROSTER: ReadonlyArray<{ machine: string; operators: readonly Operator[]; months: Readonly<Record<number, readonly string[]>> }> = [
  { machine: 'Orwin 7R', operators: ['owner@hitchbook.test', 'operator@hitchbook.test'], months: { 3: ['anhydrous', 'planting'], 4: ['planting', 'cultivating'], 9: ['disking'], 10: ['anhydrous', 'disking'] } },
  { machine: 'Harlan 5105', operators: ['operator@hitchbook.test'], months: { 0: ['hauling'], 1: ['hauling'], 2: ['hauling'], 3: ['cultivating'], 4: ['cultivating', 'spraying'], 5: ['spraying'], 6: ['spraying'], 7: ['spraying'], 8: ['cart'], 9: ['cart'], 10: ['cart', 'disking'], 11: ['hauling'] } },
  { machine: 'Old 1486', operators: ['partner@hitchbook.test'], months: { 2: ['disking'], 3: ['drilling', 'disking'], 8: ['drilling'], 9: ['hauling'], 10: ['hauling'] } },
  { machine: 'Tavin’s 65', operators: ['operator@hitchbook.test'], months: { 0: ['brush'], 1: ['brush'], 2: ['brush'], 4: ['mowing', 'ditches'], 5: ['mowing', 'ditches'], 6: ['mowing', 'ditches'], 7: ['mowing', 'ditches'], 8: ['mowing', 'ditches'], 10: ['brush'], 11: ['brush'] } },
  { machine: 'Brakkefield C-890', operators: ['partner@hitchbook.test', 'owner@hitchbook.test'], months: { 8: ['harvest'], 9: ['harvest'], 10: ['harvest'] } },
];

/** Meadow, set-aside and strips the cutter runs on; the rest is row-crop ground. */
const HAY_GROUND = /hay|crp|set-aside|pasture|levee|windbreak|slope/i;

/** Entries after this many days ago still wait for a partner's approval. */
const UNAPPROVED_DAYS = 21;
/** Of a month's meter hours, roughly this share is logged against fields; the rest is road and yard time. */
const LOGGED_SHARE = 0.8;

const iso = (d: Date) => d.toISOString().slice(0, 10);
const DAY_MS = 86_400_000;
/** Hours to the tenth; rounding a pass up keeps its acres per hour within the machine's capacity. */
const tenthsUp = (d: Decimal) => d.toDecimalPlaces(1, Dec.ROUND_UP);
const tenthsDown = (d: Decimal) => d.toDecimalPlaces(1, Dec.ROUND_DOWN);

export const seedWork: DemoPart = async (tx, ctx) => {
  const { operationId } = ctx;
  const rnd = random(20250602);
  const now = new Date();
  const user = (email: Operator) => ctx.userIds.get(email)!;

  const machineRows = await tx.select().from(machines).where(eq(machines.operationId, operationId));
  const fieldRows = await tx.select().from(fields).where(eq(fields.operationId, operationId));
  const typeRows = await tx.select({ id: workTypes.id, key: workTypes.key }).from(workTypes).where(eq(workTypes.operationId, operationId));
  const machineByName = new Map(machineRows.map((m) => [m.name, m]));
  const typeId = new Map(typeRows.map((t) => [t.key, t.id]));

  const ground: Record<Ground, typeof fieldRows> = {
    crop: fieldRows.filter((f) => f.kind === 'field' && !HAY_GROUND.test(f.name)),
    hay: fieldRows.filter((f) => f.kind === 'field' && HAY_GROUND.test(f.name)),
    roadside: fieldRows.filter((f) => f.kind === 'roadside'),
    any: fieldRows.filter((f) => f.kind === 'field'),
  };
  const households = new Set(['elders', 'parents', 'son'].map((k) => ctx.partyIds.get(k)!));
  // Custom ground is billed to the neighbour who owns it, road stretches to the road district, family
  // ground to its household, and ground the outfit rents to the household that farms it.
  const billTo = (f: (typeof fieldRows)[number]) => {
    if (f.kind === 'roadside' || f.farmLabel?.startsWith('Custom:')) return f.ownerPartyId!;
    return f.ownerPartyId && households.has(f.ownerPartyId) ? f.ownerPartyId : ctx.partyIds.get('parents')!;
  };

  const entries: Array<NewWorkEntry & { operationId: string }> = [];
  const readingOffsets: string[] = [];
  const hitchedTo = new Map<string, string>();

  for (const plan of ROSTER) {
    const power = machineByName.get(plan.machine);
    if (!power) continue;
    const readings = await tx
      .select()
      .from(meterReadings)
      .where(and(eq(meterReadings.operationId, operationId), eq(meterReadings.machineId, power.id)))
      .orderBy(asc(meterReadings.readAt), asc(meterReadings.createdAt));

    for (let k = 0; k + 1 < readings.length; k++) {
      const from = readings[k]!;
      const to = readings[k + 1]!;
      // Hours the meter ran between the two readings, across a replaced meter too.
      const ran = to.kind === 'reset' ? new Dec(to.offsetHours).minus(from.offsetHours).minus(from.hours) : new Dec(to.hours).minus(from.hours);
      // The fleet part reads the meters on the evening before each month starts.
      const month = new Date(from.readAt.getTime() + 6 * 60 * 60 * 1000);
      const jobs = plan.months[month.getUTCMonth()];
      if (!jobs || ran.lte(0)) continue;

      let budget = tenthsDown(ran.times(LOGGED_SHARE));
      // Spread over the month: no single pass takes more than about a tenth of it.
      const passCap = Dec.max(new Dec(1), tenthsDown(budget.div(10)));
      let meter = new Dec(from.hours);
      for (let day = 2; budget.gte(1) && day <= 27; day += rnd.int(1, 3)) {
        const dayStart = Date.UTC(month.getUTCFullYear(), month.getUTCMonth(), day);
        // Every reading the day's entries record must fall between the month's two meter readings.
        if (dayStart <= from.readAt.getTime() || dayStart + DAY_MS >= to.readAt.getTime() || dayStart + DAY_MS > now.getTime()) continue;
        const workDate = iso(new Date(dayStart));
        const passes = rnd.int(1, 2);
        // Two passes a day carry clock times, so their two meter readings have an order in time.
        const withClock = passes > 1 || rnd.chance(0.5);
        let clock = new Date(`${workDate}T13:00:00Z`);
        for (let pass = passes; pass > 0 && budget.gte(1); pass--) {
          const job = JOBS[rnd.pick(jobs)]!;
          const implement = job.implement ? machineByName.get(job.implement) : undefined;
          // An implement is hitched to one tractor a day.
          const hitch = implement ? `${implement.id} ${workDate}` : null;
          if (hitch && (hitchedTo.get(hitch) ?? power.id) !== power.id) continue;
          if (hitch) hitchedTo.set(hitch, power.id);
          const field = rnd.pick(ground[job.ground].length > 0 ? ground[job.ground] : ground.any);
          const capacity = workingCapacity(implement ?? power);
          let hours: Decimal;
          let acres: Decimal | null = null;
          if (job.measure === 'acres' && capacity) {
            // A pass over the whole field at 70 to 95 % of the machine's capacity, or what the month has left.
            acres = new Dec(field.acres);
            hours = Dec.max(new Dec('0.5'), tenthsUp(acres.div(capacity.acresPerHour.times(rnd.int(70, 95)).div(100))));
            if (hours.gt(budget) || hours.gt(passCap) || hours.gt(12)) {
              hours = Dec.min(budget, passCap, new Dec(12));
              acres = hours.times(capacity.acresPerHour).times('0.8').toDecimalPlaces(1);
            }
          } else {
            hours = Dec.min(budget, passCap, new Dec(rnd.int(30, 90)).div(10));
          }
          const operator = rnd.pick(plan.operators);
          const end = meter.plus(hours);
          const startedAt = withClock ? clock : null;
          const endedAt = withClock ? new Date(clock.getTime() + hours.times(3_600_000).toNumber()) : null;
          const approved = now.getTime() - dayStart > UNAPPROVED_DAYS * DAY_MS;
          entries.push({
            operationId,
            workDate,
            operatorUserId: user(operator),
            fieldId: field.id,
            workTypeId: typeId.get(job.workType)!,
            powerMachineId: power.id,
            implementMachineId: implement?.id ?? null,
            meterStart: meter.toFixed(1),
            meterEnd: end.toFixed(1),
            startedAt,
            endedAt,
            hours: hours.toFixed(2),
            operatorHours: hours.toFixed(2),
            acres: acres?.toFixed(3) ?? null,
            miles: field.kind === 'roadside' ? field.lengthMiles : null,
            loads: job.measure === 'loads' ? String(rnd.int(3, 9)) : null,
            fuelGallons: power.ptoHp && rnd.chance(0.3) ? hours.times(power.ptoHp).times('0.03').toDecimalPlaces(1).toFixed(1) : null,
            billToPartyId: billTo(field),
            notes: job.notes && rnd.chance(0.4) ? rnd.pick(job.notes) : null,
            state: approved ? 'approved' : 'submitted',
            submittedAt: new Date(`${workDate}T23:00:00Z`),
            approvedAt: approved ? new Date(dayStart + 3 * DAY_MS) : null,
            approvedBy: approved ? user(rnd.pick(['partner@hitchbook.test', 'owner@hitchbook.test'] as const)) : null,
            createdBy: user(operator),
          });
          readingOffsets.push(from.offsetHours);
          meter = end;
          budget = budget.minus(hours);
          if (endedAt) clock = endedAt;
        }
      }
    }
  }

  // Today's passes, still drafts on the operator's phone: hours only, the meter read later.
  const today = iso(now);
  const cutter = machineByName.get('15-ft batwing cutter');
  const mowingTractor = machineByName.get('Tavin’s 65');
  const recent: NewWorkEntry[] = ground.hay.slice(0, 3).map((field, i) => ({
    operationId,
    workDate: today,
    operatorUserId: user('operator@hitchbook.test'),
    fieldId: field.id,
    workTypeId: typeId.get(i === 2 ? 'brush-clearing' : 'mowing-rotary')!,
    powerMachineId: mowingTractor?.id ?? null,
    implementMachineId: cutter?.id ?? null,
    hours: ['2.50', '3.00', '1.75'][i]!,
    operatorHours: ['2.50', '3.00', '1.75'][i]!,
    acres: i === 2 ? null : new Dec(field.acres).div(2).toFixed(3),
    billToPartyId: billTo(field),
    notes: i === 0 ? 'Half done; back tomorrow for the wet end' : null,
    state: 'draft',
    createdBy: user('operator@hitchbook.test'),
  }));

  // One pass logged with the whole field's acres in too short a time: the approver sees its warning.
  const hayNorth = fieldRows.find((f) => f.name === 'Okonkwo Hay North');
  if (hayNorth && mowingTractor && cutter) {
    recent.push({
      operationId,
      workDate: iso(new Date(now.getTime() - 2 * DAY_MS)),
      operatorUserId: user('operator@hitchbook.test'),
      fieldId: hayNorth.id,
      workTypeId: typeId.get('mowing-rotary')!,
      powerMachineId: mowingTractor.id,
      implementMachineId: cutter.id,
      hours: '1.50',
      operatorHours: '1.50',
      acres: hayNorth.acres,
      billToPartyId: billTo(hayNorth),
      notes: 'Typed the whole field; only the north end was cut',
      state: 'submitted',
      submittedAt: new Date(now.getTime() - 2 * DAY_MS),
      createdBy: user('operator@hitchbook.test'),
    });
  }

  const stored: { id: string }[] = [];
  for (let i = 0; i < entries.length; i += 500) {
    stored.push(...(await tx.insert(workEntries).values(entries.slice(i, i + 500)).returning({ id: workEntries.id })));
  }
  if (recent.length > 0) await tx.insert(workEntries).values(recent);

  const readings = entries.map((e, i) => ({
    operationId,
    machineId: e.powerMachineId!,
    readAt: e.endedAt ?? new Date(`${e.workDate}T23:59:59.999Z`),
    hours: e.meterEnd!,
    offsetHours: readingOffsets[i]!,
    source: 'work-entry' as const,
    workEntryId: stored[i]!.id,
    createdBy: e.createdBy,
  }));
  for (let i = 0; i < readings.length; i += 500) await tx.insert(meterReadings).values(readings.slice(i, i + 500));
};

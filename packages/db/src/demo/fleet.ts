/**
 * The invented outfit's machines, owners, meter readings, a year of costs, fields, road stretches in
 * Fenwold Township and the default work types. Every make, model, place and number here is made up.
 * Dates run over the twelve months before the day the seed runs, so the demo always shows a live year.
 */
import type { Decimal } from 'decimal.js';
import { Dec } from '@hitchbook/shared/decimal';
import { machineClassOrThrow, type MachineClassId } from '@hitchbook/shared/machine-classes';
import { toMoneyString } from '@hitchbook/shared/money';
import { roadStripAcres } from '@hitchbook/shared/units';
import { defaultWorkTypeRows } from '@hitchbook/shared/work-types';
import type { DemoContext, DemoPart } from '../seed.js';
import { costEntries, fields, machineShares, machines, meterReadings, workTypes, type NewCostEntry } from '../schema/index.js';

type Household = 'elders' | 'parents' | 'son';
type ShareSet = readonly (readonly [Household, string])[];
type Category = NewCostEntry['category'];

export interface DemoMachine {
  name: string;
  classId: MachineClassId;
  make: string;
  model: string;
  year: number;
  ptoHp?: string;
  widthFt?: string;
  listPrice: string;
  purchasePrice: string;
  purchaseDate: string;
  hoursAtPurchase?: string;
  status?: 'active' | 'sold' | 'retired';
  owners: ShareSet;
  /** A change of ownership some months before the seed runs. */
  ownersLater?: { monthsAgo: number; shares: ShareSet };
  /** Engines only: the hour meter a year ago, hours run in a year, and the month its meter was replaced. */
  meter?: { yearAgo: number; hoursPerYear: number; replacedMonth?: number };
  /** Capital work written off over several years. */
  improvement?: { amount: string; lifeYears: number; note: string };
  notes?: string;
}

export const DEMO_MACHINES: readonly DemoMachine[] = [
  { name: 'Old 1486', classId: 'tractor-2wd', make: 'Harlan', model: '1486', year: 1984, ptoHp: '105', listPrice: '96000', purchasePrice: '31500', purchaseDate: '1984-03-20', owners: [['elders', '100']], meter: { yearAgo: 9412.6, hoursPerYear: 260, replacedMonth: 6 }, notes: 'Meter head replaced this year; the offset carries the old hours.' },
  { name: 'Harlan 5105', classId: 'tractor-mfwd', make: 'Harlan', model: '5105', year: 2008, ptoHp: '130', listPrice: '132000', purchasePrice: '96500', purchaseDate: '2008-03-03', owners: [['elders', '100']], ownersLater: { monthsAgo: 8, shares: [['elders', '66.6667'], ['parents', '33.3333']] }, meter: { yearAgo: 6120.4, hoursPerYear: 410 } },
  { name: 'Orwin 7R', classId: 'tractor-mfwd', make: 'Orwin', model: '7R 225', year: 2019, ptoHp: '225', listPrice: '312000', purchasePrice: '262500', purchaseDate: '2019-11-20', hoursAtPurchase: '45', owners: [['parents', '100']], meter: { yearAgo: 2388.1, hoursPerYear: 520 } },
  { name: 'Tavin’s 65', classId: 'tractor-2wd', make: 'Brisling', model: 'T65', year: 1999, ptoHp: '65', listPrice: '58000', purchasePrice: '18500', purchaseDate: '2017-05-02', hoursAtPurchase: '3180', owners: [['son', '100']], meter: { yearAgo: 5902.3, hoursPerYear: 380 }, notes: 'Mowing tractor; bought used.' },
  { name: 'Harlan 3010', classId: 'tractor-2wd', make: 'Harlan', model: '3010', year: 1972, ptoHp: '60', listPrice: '54000', purchasePrice: '7200', purchaseDate: '1979-06-01', status: 'sold', owners: [['elders', '100']], notes: 'Sold at the neighbourhood sale.' },
  { name: 'Brakkefield C-890', classId: 'combine-sp', make: 'Brakkefield', model: 'C-890', year: 2012, ptoHp: '320', widthFt: '30', listPrice: '540000', purchasePrice: '238000', purchaseDate: '2018-07-15', hoursAtPurchase: '1450', owners: [['parents', '50'], ['elders', '50']], meter: { yearAgo: 2911.8, hoursPerYear: 190 }, improvement: { amount: '14800', lifeYears: 5, note: 'Rotor and concave rebuild' } },
  { name: '15-ft batwing cutter', classId: 'rotary-mower', make: 'Calder & Voss', model: 'BW15', year: 2016, widthFt: '15', listPrice: '26500', purchasePrice: '21800', purchaseDate: '2016-04-20', owners: [['son', '100']] },
  { name: '7-ft roadside cutter', classId: 'rotary-mower', make: 'Calder & Voss', model: 'RS7', year: 2020, widthFt: '7', listPrice: '7400', purchasePrice: '6400', purchaseDate: '2020-05-11', owners: [['son', '100']], notes: 'Offset hitch for ditches; chain guards fitted.' },
  { name: '24-ft tandem disk', classId: 'tandem-disk', make: 'Tamsen', model: 'TD24', year: 2001, widthFt: '24', listPrice: '76000', purchasePrice: '33500', purchaseDate: '2001-02-09', owners: [['elders', '100']] },
  { name: '36-ft field cultivator', classId: 'field-cultivator', make: 'Tamsen', model: 'FC36', year: 2014, widthFt: '36', listPrice: '91000', purchasePrice: '74900', purchaseDate: '2014-03-14', owners: [['parents', '100']] },
  { name: '16-row planter', classId: 'row-crop-planter', make: 'Calder & Voss', model: 'P16', year: 2017, widthFt: '40', listPrice: '204000', purchasePrice: '168000', purchaseDate: '2017-02-27', owners: [['parents', '50'], ['son', '50']], improvement: { amount: '9600', lifeYears: 6, note: 'Electric drive row units' } },
  { name: '15-ft grain drill', classId: 'grain-drill', make: 'Orwin', model: 'GD15', year: 2005, widthFt: '15', listPrice: '66000', purchasePrice: '41200', purchaseDate: '2005-08-30', owners: [['elders', '100']] },
  { name: '90-ft sprayer', classId: 'boom-sprayer', make: 'Brakkefield', model: 'S90', year: 2013, widthFt: '90', listPrice: '64000', purchasePrice: '52800', purchaseDate: '2013-04-02', owners: [['parents', '100']] },
  { name: '13-knife NH3 bar', classId: 'anhydrous-applicator', make: 'Tamsen', model: 'NH13', year: 2010, widthFt: '32.5', listPrice: '43000', purchasePrice: '36200', purchaseDate: '2010-03-25', owners: [['parents', '66.6667'], ['son', '33.3333']] },
  { name: '1000-bu grain cart', classId: 'grain-cart', make: 'Calder & Voss', model: 'GC1000', year: 2015, listPrice: '61000', purchasePrice: '49500', purchaseDate: '2015-08-18', owners: [['parents', '100']] },
];

type Landlord = Household | 'neighbourA' | 'neighbourB';

/** [farm label, landlord or owner, [field name, acres]...] */
const FARMS: readonly (readonly [string, Landlord, readonly (readonly [string, string])[]])[] = [
  ['Home Place', 'parents', [['Home East', '78.4'], ['Home West', '61.2'], ['Yard Lot', '12.5'], ['Creek Field', '44.8'], ['Windbreak Strip', '18.0'], ['Orchard Corner', '9.6']]],
  ['North Quarter', 'elders', [['NQ Northeast', '38.9'], ['NQ Northwest', '40.2'], ['NQ South Half', '79.5'], ['Sump Hole', '22.7'], ['Fence-line Forty', '39.8']]],
  ['River Bottom', 'elders', [['Bottom Upper', '64.3'], ['Bottom Lower', '71.9'], ['Oxbow', '28.4'], ['Levee Strip', '15.2'], ['Sandbar Ten', '10.1']]],
  ['Schoolhouse Section', 'parents', [['Schoolhouse NE', '155.6'], ['Schoolhouse NW', '148.2'], ['Schoolhouse South 80', '80.0'], ['Bell Tower Piece', '24.3']]],
  ['Tavin’s Eighty', 'son', [['T80 East', '41.0'], ['T80 West', '38.6'], ['Hay Slope', '19.4']]],
  ['Brandvold Lease', 'neighbourA', [['Brandvold Home 60', '59.7'], ['Pike Hollow Flat', '87.3'], ['Pasture Break', '33.1'], ['Hollow Creek Piece', '26.8'], ['Brandvold North', '112.4']]],
  ['Okonkwo Rental', 'neighbourB', [['Saltlick East', '66.6'], ['Saltlick West', '58.2'], ['Dairy Barn Forty', '40.5'], ['Silage Ground', '35.9']]],
  ['Custom: Brandvold', 'neighbourA', [['Brandvold Set-aside', '46.0'], ['Brandvold Hayfield', '31.7']]],
  ['Custom: Okonkwo', 'neighbourB', [['Okonkwo Hay North', '29.3'], ['Okonkwo Hay South', '33.8'], ['Okonkwo CRP Strip', '18.5']]],
  ['Gravel Pit Parcel', 'parents', [['Pit Edge', '14.2'], ['Quarry Road Piece', '27.7'], ['Highline Field', '52.6']]],
];

export const DEMO_FIELD_NAMES: readonly string[] = FARMS.flatMap(([, , list]) => list.map(([name]) => name));

/** Road stretches the township pays to have mowed: [name, road, from, to, miles, mowing width in feet]. */
export const DEMO_ROAD_STRETCHES: readonly (readonly [string, string, string, string, string, string])[] = [
  ['Pike Hollow Road ditches', 'Pike Hollow Road', 'County Road 9', 'Saltlick Lane', '2.4', '10'],
  ['Saltlick Lane ditches', 'Saltlick Lane', 'Commons Street', 'Tarrow Creek bridge', '1.6', '8'],
  ['Township Road 14 ditches', 'Township Road 14', 'County Road 9', 'the county line', '3.1', '12'],
];

// Share of a year's machine hours by calendar month for a row-crop and hay outfit (invented).
const MONTH_WEIGHTS = [1, 1, 3, 10, 14, 8, 6, 6, 10, 14, 6, 2];
const WEIGHT_TOTAL = MONTH_WEIGHTS.reduce((a, b) => a + b, 0);

/** A small seeded generator, so every seed run invents the same numbers. */
function random(seed: number) {
  let s = seed >>> 0;
  const next = () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let r = Math.imul(s ^ (s >>> 15), 1 | s);
    r ^= r + Math.imul(r ^ (r >>> 7), 61 | r);
    return ((r ^ (r >>> 14)) >>> 0) / 4294967296;
  };
  return {
    int: (low: number, high: number) => low + Math.floor(next() * (high - low + 1)),
    pick: <T>(items: readonly T[]): T => items[Math.floor(next() * items.length)]!,
  };
}

const iso = (d: Date) => d.toISOString().slice(0, 10);
const monthStart = (base: Date, monthsBack: number) => new Date(Date.UTC(base.getUTCFullYear(), base.getUTCMonth() - monthsBack, 1));
const dayIn = (month: Date, day: number) => iso(new Date(Date.UTC(month.getUTCFullYear(), month.getUTCMonth(), day)));

const VENDORS: Record<Category, readonly string[]> = {
  fuel: ['Pike Hollow Co-op', 'Fenwold Farm Supply card lock'],
  repair: ['Saltlick Implement', 'Quarry Road Ag Repair', 'Own shop'],
  parts: ['Saltlick Implement', 'Fenwold Farm Supply'],
  tires: ['Quarry Road Tire'],
  insurance: ['Township Mutual Insurance'],
  taxes: ['County Treasurer'],
  housing: ['Machine shed share'],
  interest: ['Fenwold Farm Credit'],
  improvement: ['Saltlick Implement'],
};

export const seedFleet: DemoPart = async (tx, ctx) => {
  const rnd = random(20250401);
  const now = new Date();
  // Thirteen month starts, a year ago through this month; the meter is read on the evening before each.
  const months = Array.from({ length: 13 }, (_, i) => monthStart(now, 12 - i));
  const readingTime = (i: number) => new Date(months[i]!.getTime() - 6 * 60 * 60 * 1000);
  const party = (key: Landlord) => ctx.partyIds.get(key)!;
  const createdBy = ctx.userIds.get('owner@hitchbook.test') ?? null;
  const { operationId } = ctx;

  await tx.insert(workTypes).values(defaultWorkTypeRows(operationId));

  const machineRows = await tx
    .insert(machines)
    .values(
      DEMO_MACHINES.map((m) => ({
        operationId,
        name: m.name,
        classId: m.classId,
        kind: machineClassOrThrow(m.classId).kind,
        make: m.make,
        model: m.model,
        year: m.year,
        serialNumber: `${m.make.slice(0, 3).toUpperCase()}${m.year}${String(rnd.int(10000, 99999))}`,
        unitNumber: null,
        ptoHp: m.ptoHp ?? null,
        fuelType: m.ptoHp ? ('diesel' as const) : null,
        widthFt: m.widthFt ?? null,
        listPrice: m.listPrice,
        purchasePrice: m.purchasePrice,
        purchaseDate: m.purchaseDate,
        hoursAtPurchase: m.hoursAtPurchase ?? '0',
        status: m.status ?? 'active',
        notes: m.notes ?? null,
      })),
    )
    .returning({ id: machines.id, name: machines.name });
  const machineId = new Map(machineRows.map((r) => [r.name, r.id]));

  const shares = DEMO_MACHINES.flatMap((m) => {
    const sets: [string, ShareSet][] = [[m.purchaseDate, m.owners]];
    if (m.ownersLater) sets.push([iso(monthStart(now, m.ownersLater.monthsAgo)), m.ownersLater.shares]);
    return sets.flatMap(([effectiveFrom, set]) =>
      set.map(([household, sharePct]) => ({ operationId, machineId: machineId.get(m.name)!, partyId: party(household), sharePct, effectiveFrom, createdBy })),
    );
  });
  await tx.insert(machineShares).values(shares);

  const readings: (typeof meterReadings.$inferInsert)[] = [];
  const costs: (typeof costEntries.$inferInsert)[] = [];
  const cost = (m: DemoMachine, category: Category, incurredOn: string, amount: Decimal | string, extra: Partial<typeof costEntries.$inferInsert> = {}) =>
    costs.push({
      operationId,
      machineId: machineId.get(m.name)!,
      category,
      incurredOn,
      amount: toMoneyString(amount),
      vendor: rnd.pick(VENDORS[category]),
      paidByPartyId: party(rnd.pick(m.owners)[0]),
      createdBy,
      ...extra,
    });
  // Costs fall in the eleven whole months before this one, so none is dated after today.
  const pastMonth = () => months[rnd.int(0, 11)]!;

  for (const m of DEMO_MACHINES) {
    if (m.status === 'sold') continue;
    const id = machineId.get(m.name)!;
    const purchase = new Dec(m.purchasePrice);
    if (m.meter && m.ptoHp) {
      let meter = new Dec(m.meter.yearAgo);
      let offset = new Dec(0);
      readings.push({ operationId, machineId: id, readAt: readingTime(0), hours: meter.toFixed(1), offsetHours: '0', createdBy });
      for (let i = 1; i < months.length; i++) {
        const month = months[i - 1]!.getUTCMonth();
        const run = new Dec(m.meter.hoursPerYear).times(MONTH_WEIGHTS[month]!).div(WEIGHT_TOTAL).times(rnd.int(85, 115)).div(100).toDecimalPlaces(1);
        const readAt = readingTime(i);
        if (i === m.meter.replacedMonth) {
          // The old head stopped; the new one starts near zero and the offset keeps the machine's total.
          offset = offset.plus(meter).plus(run);
          meter = new Dec(0);
          readings.push({ operationId, machineId: id, readAt, hours: '0.0', kind: 'reset', offsetHours: offset.toFixed(1), note: 'Meter head replaced', createdBy });
        } else {
          meter = meter.plus(run);
          readings.push({ operationId, machineId: id, readAt, hours: meter.toFixed(1), offsetHours: offset.toFixed(1), createdBy });
        }
        if (run.gt(0)) {
          // Fuel at about 0.044 gal per PTO hp-hour, lighter or heavier with the month's work.
          const gallons = run.times(m.ptoHp).times('0.044').times(rnd.int(60, 85)).div(100).toDecimalPlaces(1);
          const price = new Dec(rnd.int(329, 389)).div(100);
          cost(m, 'fuel', dayIn(months[i - 1]!, rnd.int(5, 25)), gallons.times(price), { gallons: gallons.toFixed(1) });
        }
      }
    }
    const engine = Boolean(m.ptoHp);
    for (let n = rnd.int(1, engine ? 3 : 2); n > 0; n--) {
      cost(m, 'repair', dayIn(pastMonth(), rnd.int(2, 27)), String(rnd.int(engine ? 400 : 120, engine ? 3800 : 1600)), { notes: rnd.pick(['Hydraulic hose and fittings', 'Bearings', 'Electrical fault', 'Seals and service', 'Welding']) });
    }
    for (let n = rnd.int(1, 3); n > 0; n--) cost(m, 'parts', dayIn(pastMonth(), rnd.int(2, 27)), `${rnd.int(18, 420)}.${String(rnd.int(0, 99)).padStart(2, '0')}`);
    // Insurance near 0.55 % of purchase, property tax on power units, a share of the shed.
    cost(m, 'insurance', dayIn(months[1]!, 15), purchase.times('0.0055'));
    if (engine) cost(m, 'taxes', dayIn(months[4]!, 28), purchase.times('0.002'));
    cost(m, 'housing', dayIn(months[2]!, 1), String(rnd.int(120, 480)), { paidByPartyId: party('elders'), notes: 'Share of the home-place machine shed' });
    if (m.classId === 'tractor-mfwd') cost(m, 'tires', dayIn(pastMonth(), rnd.int(2, 27)), String(rnd.int(2900, 6800)), { notes: 'Pair of rear radials' });
    if (m.improvement) {
      cost(m, 'improvement', dayIn(months[3]!, 12), m.improvement.amount, { improvementLifeYears: m.improvement.lifeYears, notes: m.improvement.note });
    }
  }
  const newest = DEMO_MACHINES.find((m) => m.name === 'Orwin 7R')!;
  cost(newest, 'interest', dayIn(months[6]!, 1), '6120.00', { paidByPartyId: party('parents'), notes: 'Machinery loan interest' });

  if (readings.length > 0) await tx.insert(meterReadings).values(readings);
  await tx.insert(costEntries).values(costs);
  await tx.insert(fields).values([...farmFields(ctx), ...roadStretches(ctx)]);
};

function farmFields(ctx: DemoContext) {
  return FARMS.flatMap(([farmLabel, owner, list]) =>
    list.map(([name, acres]) => ({ operationId: ctx.operationId, kind: 'field' as const, name, acres, farmLabel, ownerPartyId: ctx.partyIds.get(owner)! })),
  );
}

function roadStretches(ctx: DemoContext) {
  return DEMO_ROAD_STRETCHES.map(([name, roadName, roadFrom, roadTo, lengthMiles, widthFt]) => ({
    operationId: ctx.operationId,
    kind: 'roadside' as const,
    name,
    roadName,
    roadFrom,
    roadTo,
    lengthMiles,
    widthFt,
    acres: roadStripAcres(lengthMiles, widthFt).toFixed(3),
    farmLabel: 'Fenwold Township roads',
    ownerPartyId: ctx.partyIds.get('township')!,
    notes: 'Both ditches, one pass each side; township traffic-control rules apply.',
  }));
}

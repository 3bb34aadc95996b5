import type { Decimal } from 'decimal.js';
import { z } from 'zod';
import { Dec } from '../decimal.js';
import { hasEngine, MACHINE_CLASS_IDS, machineClassOrThrow } from '../machine-classes.js';
import { decimalInput, wholeNumberInput } from './decimal-input.js';

const percentInput = () => decimalInput({ atLeast: 0, atMost: 100 });
const priceInput = () => decimalInput({ above: 0 });
const centsInput = () => decimalInput({ atLeast: 0, wholeCents: true });

function enumInput<const T extends readonly [string, ...string[]]>(values: T) {
  return z.enum(values, {
    error: (issue) => (issue.input === undefined ? 'Required' : `Use one of: ${values.join(', ')}`),
  });
}

// POST /api/estimates/machine-cost
export const machineCostRequestSchema = z
  .strictObject({
    machineClass: enumInput(MACHINE_CLASS_IDS),
    listPrice: priceInput(),
    purchasePrice: priceInput(),
    yearsOwned: wholeNumberInput({ atLeast: 1, atMost: 50 }),
    // 8,760 is every hour of the year.
    hoursPerYear: decimalInput({ above: 0, atMost: 8760 }),
    ageAtPurchase: wholeNumberInput({ atLeast: 0, atMost: 100 }).default(0),
    hoursAtPurchase: decimalInput({ atLeast: 0 }).default(new Dec(0)),
    interestRatePct: percentInput(),
    tihPct: percentInput().default(new Dec(1)),
    salvageValue: decimalInput({ atLeast: 0 }).nullable().default(null),
    ptoHp: decimalInput({ above: 0 }).optional(),
    fuelType: enumInput(['diesel', 'gasoline', 'lpg']).default('diesel'),
    fuelPricePerGallon: priceInput().optional(),
    lubePct: percentInput().default(new Dec(15)),
    laborWagePerHour: decimalInput({ atLeast: 0 }).default(new Dec(0)),
    // Labour hours per machine hour: below 1 would pay less time than the machine ran.
    laborFactor: decimalInput({ atLeast: 1, atMost: 3 }).default(new Dec('1.1')),
    method: enumInput(['capital-recovery', 'straight-line']),
  })
  .superRefine((request, ctx) => {
    if (request.purchasePrice.gt(request.listPrice)) {
      ctx.addIssue({
        code: 'custom',
        path: ['purchasePrice'],
        message: 'The purchase price is above the list price of an equivalent new machine',
      });
    }
    if (request.salvageValue !== null && request.salvageValue.gt(request.purchasePrice)) {
      ctx.addIssue({
        code: 'custom',
        path: ['salvageValue'],
        message: 'The salvage value is above the purchase price',
      });
    }
    const machineClass = machineClassOrThrow(request.machineClass);
    if (hasEngine(machineClass)) {
      for (const field of ['ptoHp', 'fuelPricePerGallon'] as const) {
        if (request[field] === undefined) {
          ctx.addIssue({ code: 'custom', path: [field], message: `Required for a machine with an engine (${machineClass.label})` });
        }
      }
    } else if (request.ptoHp !== undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['ptoHp'],
        message: 'An implement has no engine: leave ptoHp out and cost the fuel on the tractor',
      });
    }
  });

export type MachineCostRequestInput = z.input<typeof machineCostRequestSchema>;
export type MachineCostRequest = z.output<typeof machineCostRequestSchema>;

// POST /api/estimates/field-capacity
export type FieldPass =
  | { system: 'imperial'; widthFt: Decimal; speedMph: Decimal; efficiencyPct: Decimal }
  | { system: 'metric'; widthM: Decimal; speedKmh: Decimal; efficiencyPct: Decimal };

export const fieldCapacityRequestSchema = z
  .strictObject({
    widthFt: decimalInput({ above: 0 }).optional(),
    speedMph: decimalInput({ above: 0 }).optional(),
    widthM: decimalInput({ above: 0 }).optional(),
    speedKmh: decimalInput({ above: 0 }).optional(),
    efficiencyPct: decimalInput({ above: 0, atMost: 100 }),
  })
  .transform((request, ctx): FieldPass => {
    const { widthFt, speedMph, widthM, speedKmh, efficiencyPct } = request;
    const metricGiven = widthM !== undefined || speedKmh !== undefined;
    if (metricGiven && (widthFt !== undefined || speedMph !== undefined)) {
      ctx.issues.push({
        code: 'custom',
        path: [widthM !== undefined ? 'widthM' : 'speedKmh'],
        message: 'Give either widthFt and speedMph or widthM and speedKmh, not a mix',
        input: request,
      });
      return z.NEVER;
    }
    if (metricGiven && widthM !== undefined && speedKmh !== undefined) {
      return { system: 'metric', widthM, speedKmh, efficiencyPct };
    }
    if (!metricGiven && widthFt !== undefined && speedMph !== undefined) {
      return { system: 'imperial', widthFt, speedMph, efficiencyPct };
    }
    const needed = metricGiven ? { widthM, speedKmh } : { widthFt, speedMph };
    for (const [field, value] of Object.entries(needed)) {
      if (value === undefined) ctx.issues.push({ code: 'custom', path: [field], message: 'Required', input: request });
    }
    return z.NEVER;
  });

export type FieldCapacityRequestInput = z.input<typeof fieldCapacityRequestSchema>;
export type FieldCapacityRequest = z.output<typeof fieldCapacityRequestSchema>;

// POST /api/estimates/break-even
export const breakEvenRequestSchema = z
  .strictObject({
    annualFixedCost: decimalInput({ above: 0 }),
    customRatePerAcre: priceInput(),
    variableCostPerAcre: decimalInput({ atLeast: 0 }),
  })
  .superRefine((request, ctx) => {
    if (request.customRatePerAcre.lte(request.variableCostPerAcre)) {
      ctx.addIssue({
        code: 'custom',
        path: ['customRatePerAcre'],
        message: 'The custom rate must be above your variable cost per acre; otherwise hiring is always cheaper',
      });
    }
  });

export type BreakEvenRequestInput = z.input<typeof breakEvenRequestSchema>;
export type BreakEvenRequest = z.output<typeof breakEvenRequestSchema>;

// POST /api/estimates/joint-ownership
export const jointOwnershipRequestSchema = z
  .strictObject({
    members: z
      .array(
        z.strictObject({
          id: z.string({ error: 'Required' }).trim().min(1, 'Required').max(100),
          ownershipPct: percentInput(),
          // Hours or acres, the same measure for every member.
          use: decimalInput({ atLeast: 0 }).optional(),
        }),
      )
      .min(2, 'A jointly used machine needs at least two members')
      .max(50),
    costs: z
      .array(
        z.strictObject({
          label: z.string({ error: 'Required' }).trim().min(1, 'Required').max(200),
          amount: centsInput(),
          paidBy: z.record(z.string(), centsInput()),
        }),
      )
      .max(200),
    settleBy: enumInput(['use', 'ownership']),
  })
  .superRefine((request, ctx) => {
    const ids = new Set<string>();
    request.members.forEach((member, index) => {
      if (ids.has(member.id)) {
        ctx.addIssue({ code: 'custom', path: ['members', index, 'id'], message: `"${member.id}" appears twice` });
      }
      ids.add(member.id);
      if (request.settleBy === 'use' && member.use === undefined) {
        ctx.addIssue({ code: 'custom', path: ['members', index, 'use'], message: 'Required when settling by use' });
      }
    });

    const ownership = request.members.reduce<Decimal>((sum, member) => sum.plus(member.ownershipPct), new Dec(0));
    if (!ownership.eq(100)) {
      ctx.addIssue({
        code: 'custom',
        path: ['members'],
        message: `Ownership must add up to 100 %; it adds up to ${ownership.toString()} %`,
      });
    }
    const use = request.members.reduce<Decimal>((sum, member) => sum.plus(member.use ?? 0), new Dec(0));
    if (request.settleBy === 'use' && use.isZero()) {
      ctx.addIssue({ code: 'custom', path: ['members'], message: 'Settling by use needs some use recorded' });
    }

    request.costs.forEach((cost, index) => {
      let paid = new Dec(0);
      for (const [memberId, amount] of Object.entries(cost.paidBy)) {
        if (!ids.has(memberId)) {
          ctx.addIssue({
            code: 'custom',
            path: ['costs', index, 'paidBy', memberId],
            message: `"${memberId}" is not one of the members`,
          });
        }
        paid = paid.plus(amount);
      }
      if (!paid.eq(cost.amount)) {
        ctx.addIssue({
          code: 'custom',
          path: ['costs', index, 'paidBy'],
          message: `Payments add up to ${paid.toFixed(2)}, not the amount ${cost.amount.toFixed(2)}`,
        });
      }
    });
  });

export type JointOwnershipRequestInput = z.input<typeof jointOwnershipRequestSchema>;
export type JointOwnershipRequest = z.output<typeof jointOwnershipRequestSchema>;

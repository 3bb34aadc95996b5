import type { Decimal } from 'decimal.js';
import { breakEvenAcresOrThrow } from './break-even.js';
import { poolCosts, type ShareBasis } from './cost-sharing.js';
import { fixed } from './decimal.js';
import { ComputationError } from './errors.js';
import { acresPerHour, acresToHectares, hectaresPerHour, hectaresToAcres } from './field-capacity.js';
import {
  hasEngine,
  MACHINE_CLASSES,
  machineClassOrThrow,
  remainingValueCoefficientsOrThrow,
  type MachineClass,
} from './machine-classes.js';
import { COST_BREAKDOWN_KEYS, estimateMachineCost, type CostBreakdown, type EngineInputs } from './machine-cost.js';
import { toMoneyString } from './money.js';
import type {
  BreakEvenRequest,
  FieldCapacityRequest,
  JointOwnershipRequest,
  MachineCostRequest,
} from './schemas/estimates.js';
import { squareUpOrThrow } from './settlement.js';

// Route-shaped functions for /api/estimates: each takes the parsed request of
// its schema in ./schemas/estimates and returns the response body exactly as
// the API contract writes it, decimals as strings at the documented places.

// The contract's fields plus the class's typical speed and field efficiency, which the estimate screens offer as defaults.
export type MachineClassResponse = Pick<MachineClass, 'id' | 'label' | 'kind' | 'rf1' | 'rf2' | 'lifeHours' | 'remainingValue' | 'fieldOperation'>;

// GET /api/estimates/machine-classes
export function listMachineClasses(): MachineClassResponse[] {
  return MACHINE_CLASSES.map(({ id, label, kind, rf1, rf2, lifeHours, remainingValue, fieldOperation }) => ({
    id,
    label,
    kind,
    rf1,
    rf2,
    lifeHours,
    remainingValue: Array.isArray(remainingValue) ? remainingValue.map((row) => ({ ...row })) : { ...remainingValue },
    fieldOperation,
  }));
}

export type CostBreakdownResponse = Record<keyof CostBreakdown, string>;

export interface MachineCostResponse {
  remainingValuePct: string;
  salvageValue: string;
  capitalRecoveryFactor: string;
  fuelGallonsPerHour: string;
  perYear: CostBreakdownResponse;
  perHour: CostBreakdownResponse;
}

function moneyBreakdown(breakdown: CostBreakdown): CostBreakdownResponse {
  const response = {} as CostBreakdownResponse;
  for (const key of COST_BREAKDOWN_KEYS) response[key] = toMoneyString(breakdown[key]);
  return response;
}

function engineOrThrow(machineClass: MachineClass, request: MachineCostRequest): EngineInputs | null {
  if (!hasEngine(machineClass)) return null;
  if (request.ptoHp === undefined || request.fuelPricePerGallon === undefined) {
    throw new ComputationError('invalid-argument', `${machineClass.label}: give ptoHp and fuelPricePerGallon`);
  }
  return { ptoHp: request.ptoHp, fuelType: request.fuelType, fuelPricePerGallon: request.fuelPricePerGallon };
}

// POST /api/estimates/machine-cost
export function machineCostEstimate(request: MachineCostRequest): MachineCostResponse {
  const machineClass = machineClassOrThrow(request.machineClass);
  const estimate = estimateMachineCost({
    repairFactors: { rf1: machineClass.rf1, rf2: machineClass.rf2 },
    remainingValue: remainingValueCoefficientsOrThrow(machineClass, request.ptoHp ?? null),
    listPrice: request.listPrice,
    purchasePrice: request.purchasePrice,
    yearsOwned: request.yearsOwned,
    hoursPerYear: request.hoursPerYear,
    ageAtPurchase: request.ageAtPurchase,
    hoursAtPurchase: request.hoursAtPurchase,
    interestRatePct: request.interestRatePct,
    tihPct: request.tihPct,
    salvageValue: request.salvageValue,
    engine: engineOrThrow(machineClass, request),
    lubePct: request.lubePct,
    laborWagePerHour: request.laborWagePerHour,
    laborFactor: request.laborFactor,
    method: request.method,
  });
  return {
    remainingValuePct: fixed(estimate.remainingValuePct, 2),
    salvageValue: fixed(estimate.salvageValue, 2),
    capitalRecoveryFactor: fixed(estimate.capitalRecoveryFactor, 6),
    fuelGallonsPerHour: fixed(estimate.fuelGallonsPerHour, 3),
    perYear: moneyBreakdown(estimate.perYear),
    perHour: moneyBreakdown(estimate.perHour),
  };
}

export interface FieldCapacityResponse {
  acresPerHour: string;
  hectaresPerHour: string;
}

// POST /api/estimates/field-capacity
export function fieldCapacityEstimate(request: FieldCapacityRequest): FieldCapacityResponse {
  let acres: Decimal;
  let hectares: Decimal;
  if (request.system === 'imperial') {
    acres = acresPerHour(request);
    hectares = acresToHectares(acres);
  } else {
    hectares = hectaresPerHour(request);
    acres = hectaresToAcres(hectares);
  }
  return { acresPerHour: fixed(acres, 3), hectaresPerHour: fixed(hectares, 3) };
}

export interface BreakEvenResponse {
  breakEvenAcres: string;
}

// POST /api/estimates/break-even
export function breakEvenEstimate(request: BreakEvenRequest): BreakEvenResponse {
  return { breakEvenAcres: fixed(breakEvenAcresOrThrow(request), 2) };
}

export interface JointOwnershipResponse {
  totalCost: string;
  members: { id: string; share: string; paid: string; balance: string }[];
  transfers: { from: string; to: string; amount: string }[];
}

// POST /api/estimates/joint-ownership
export function jointOwnershipEstimate(request: JointOwnershipRequest): JointOwnershipResponse {
  const memberIds = request.members.map((member) => member.id);
  const basis: ShareBasis =
    request.settleBy === 'use'
      ? { by: 'use', users: request.members.map((member) => ({ householdId: member.id, use: member.use ?? 0 })) }
      : { by: 'ownership', owners: request.members.map((member) => ({ householdId: member.id, ownershipPct: member.ownershipPct })) };
  const squareUp = squareUpOrThrow(memberIds, [poolCosts('Machine costs', request.costs, basis)]);
  return {
    totalCost: toMoneyString(squareUp.totalCost),
    members: squareUp.households.map((row) => ({
      id: row.householdId,
      share: toMoneyString(row.share),
      paid: toMoneyString(row.paid),
      balance: toMoneyString(row.balance),
    })),
    transfers: squareUp.transfers.map((transfer) => ({
      from: transfer.from,
      to: transfer.to,
      amount: toMoneyString(transfer.amount),
    })),
  };
}

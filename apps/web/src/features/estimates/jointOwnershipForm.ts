import { Decimal } from 'decimal.js';
import { isDecimalString } from '@hitchbook/shared/decimal';
import type { JointOwnershipRequestInput } from '@hitchbook/shared/schemas/estimates';

export interface MemberRow {
  /** Stable row key for React; the member's name is what the request calls its id. */
  key: string;
  name: string;
  ownershipPct: string;
  use: string;
}

export interface CostRow {
  key: string;
  label: string;
  amount: string;
  /** What each member paid towards this cost, in the order of the member rows. */
  paid: string[];
}

export interface JointOwnershipValues {
  members: MemberRow[];
  costs: CostRow[];
  settleBy: 'use' | 'ownership';
}

let nextKey = 0;
export function rowKey(prefix: string): string {
  nextKey += 1;
  return `${prefix}${nextKey}`;
}

export function newMember(name: string): MemberRow {
  return { key: rowKey('m'), name, ownershipPct: '', use: '' };
}

export function newCost(memberCount: number, label = ''): CostRow {
  return { key: rowKey('c'), label, amount: '', paid: Array.from({ length: memberCount }, () => '') };
}

export function initialJointOwnership(): JointOwnershipValues {
  return {
    members: [newMember('Household 1'), newMember('Household 2')],
    costs: [newCost(2, 'Depreciation and interest'), newCost(2, 'Repairs')],
    settleBy: 'use',
  };
}

/** Sum of the fields that already hold a number; half-typed ones count as nothing yet. */
export function sumOfTyped(texts: readonly string[]): Decimal {
  return texts.reduce((sum, text) => (isDecimalString(text.trim()) ? sum.plus(text.trim()) : sum), new Decimal(0));
}

/** A blank field is left out, so the schema says "Required" rather than "not a number". */
const typed = (text: string): string | undefined => (text.trim() === '' ? undefined : text.trim());

export function toJointOwnershipRequest(values: JointOwnershipValues): JointOwnershipRequestInput {
  const ids = values.members.map((m) => m.name.trim());
  // Required fields may still be blank while typing; the schema check before sending names them.
  return {
    members: values.members.map((m, i) => ({
      id: ids[i] ?? '',
      ownershipPct: typed(m.ownershipPct) as string,
      use: typed(m.use),
    })),
    costs: values.costs.map((c) => ({
      label: c.label.trim(),
      amount: typed(c.amount) as string,
      // A blank payment means the member paid nothing towards this cost.
      paidBy: Object.fromEntries(ids.map((id, i) => [id, c.paid[i]?.trim() || '0'])),
    })),
    settleBy: values.settleBy,
  };
}

/**
 * The request keys payments by member name; the form keeps them by member position.
 * "costs.0.paidBy.North place" becomes "costs.0.paid.1"; a rule about a whole cost's
 * payments goes under its amount.
 */
export function jointOwnershipIssuePath(path: string, values: JointOwnershipValues): string {
  const byMember = /^costs\.(\d+)\.paidBy\.(.+)$/.exec(path);
  if (byMember) {
    const index = values.members.findIndex((m) => m.name.trim() === byMember[2]);
    return index >= 0 ? `costs.${byMember[1]}.paid.${index}` : `costs.${byMember[1]}.amount`;
  }
  const wholeCost = /^costs\.(\d+)\.paidBy$/.exec(path);
  if (wholeCost) return `costs.${wholeCost[1]}.amount`;
  return path.replace(/^members\.(\d+)\.id$/, 'members.$1.name');
}

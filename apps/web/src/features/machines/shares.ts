import { Decimal } from 'decimal.js';
import type { Role } from '@hitchbook/shared/roles';
import { FULL_OWNERSHIP_PCT, type MachineSharesDto } from '@hitchbook/shared/schemas/machines';
import { isDecimalString } from '@hitchbook/shared/decimal';

export interface ShareLineValues {
  partyId: string;
  sharePct: string;
}

export interface SharesTally {
  /** The sum of the shares typed so far; blank or unreadable lines count as nothing. */
  total: Decimal;
  /** True when every line holds a number and together they make exactly 100 %. */
  complete: boolean;
  /** What is still missing (positive) or over (negative). */
  remaining: Decimal;
}

/** Adds the shares as typed, exactly, so "33.3333 + 66.6667" is seen as 100 and not as 99.99999. */
export function tallyShares(lines: readonly ShareLineValues[]): SharesTally {
  let total = new Decimal(0);
  let allNumbers = lines.length > 0;
  for (const line of lines) {
    const text = line.sharePct.trim();
    if (isDecimalString(text)) total = total.plus(text);
    else allNumbers = false;
  }
  const remaining = new Decimal(FULL_OWNERSHIP_PCT).minus(total);
  return { total, complete: allNumbers && remaining.isZero(), remaining };
}

/** A stored share ("50.0000") as a person would type it ("50"). */
export function plainSharePct(value: string): string {
  return new Decimal(value).toDecimalPlaces(4).toString();
}

/** Shares as the server prints them ("33.3333") and as a person reads them ("33.3333 %", "50 %"). */
export function formatSharePct(value: string): string {
  return `${plainSharePct(value)} %`;
}

/**
 * The server's rule for changing a machine, its owners and its costs: the owner always; a partner
 * while its household holds a share in the set in force today or in one dated later.
 */
export function mayChangeMachine(role: Role, partyId: string | null, shares: MachineSharesDto | undefined): boolean {
  if (role === 'owner') return true;
  if (role !== 'partner' || !partyId || !shares) return false;
  const from = shares.current?.effectiveFrom ?? '';
  return shares.history.some((set) => set.effectiveFrom >= from && set.shares.some((s) => s.partyId === partyId));
}

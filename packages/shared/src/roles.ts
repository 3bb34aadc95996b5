/** The five roles a member of an operation can hold. */
export const ROLES = ['owner', 'partner', 'operator', 'bookkeeper', 'customer'] as const;
export type Role = (typeof ROLES)[number];

/** Roles that may see money figures (rates, costs, invoices, estimates). */
export const MONEY_ROLES: readonly Role[] = ['owner', 'partner', 'bookkeeper'];

/** Roles whose members belong to the family outfit itself rather than being billed by it. */
export const STAFF_ROLES: readonly Role[] = ['owner', 'partner', 'operator', 'bookkeeper'];

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}

import type { Role } from '@hitchbook/shared/roles';

export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Owner',
  partner: 'Partner',
  operator: 'Operator',
  bookkeeper: 'Bookkeeper',
  customer: 'Customer',
};

/** One line per role, shown where an owner picks a role for someone. */
export const ROLE_DESCRIPTIONS: Record<Role, string> = {
  owner: 'Runs the account: everything, including users, rates and invoices.',
  partner: 'Another household in the family outfit: logs and approves work, squares up.',
  operator: 'Works in the cab: logs own work, sees assigned machines and fields, no money figures.',
  bookkeeper: "The family's accountant: reads everything with money, changes nothing.",
  customer: 'A neighbour, township or landowner: sees and pays only their own invoices.',
};

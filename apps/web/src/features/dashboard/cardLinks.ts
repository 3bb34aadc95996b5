import type { Role } from '@hitchbook/shared/roles';
import { accessTo, type AreaKey } from '../../lib/areas';
import { paths } from '../../lib/paths';

interface CardTarget {
  area: AreaKey;
  href: string;
  label: string;
}

/** Where each dashboard figure's work is done; a card whose key is not here is a figure only. */
const TARGETS: Record<string, CardTarget> = {
  'entries-waiting': { area: 'work', href: paths.work.entries({ state: 'submitted' }), label: 'Review the entries' },
  'my-drafts': { area: 'work', href: paths.work.entries({ state: 'draft' }), label: 'Finish my drafts' },
  'my-submitted': { area: 'work', href: paths.work.entries({ state: 'submitted' }), label: 'See my entries' },
  'unbilled-work': { area: 'invoices', href: paths.invoices(), label: 'Go to invoices' },
  'overdue-invoices': { area: 'invoices', href: paths.invoices({ state: 'overdue' }), label: 'See the overdue invoices' },
  'refunds-due': { area: 'invoices', href: paths.invoices(), label: 'Go to invoices' },
  'open-invoices': { area: 'myInvoices', href: paths.myInvoices(), label: 'See my invoices' },
  'open-balance': { area: 'myInvoices', href: paths.myInvoices(), label: 'Pay an invoice' },
  'square-up-balance': { area: 'squareUps', href: paths.squareUps(), label: 'Open the square-up' },
  'meter-readings-due': { area: 'machines', href: paths.machines(), label: 'Go to the machines' },
  households: { area: 'parties', href: paths.parties({ kind: 'household' }), label: 'See the households' },
  customers: { area: 'parties', href: paths.parties({ kind: 'customer' }), label: 'See the customers' },
  members: { area: 'users', href: paths.users(), label: 'See who can sign in' },
  invitations: { area: 'users', href: paths.users(), label: 'See the invitations' },
};

/** The link a card carries for this role, or null when the role cannot open the area behind it. */
export function cardLink(key: string, role: Role): { href: string; label: string } | null {
  const target = TARGETS[key];
  if (!target || !accessTo(role, target.area)) return null;
  return { href: target.href, label: target.label };
}

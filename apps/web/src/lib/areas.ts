import type { Role } from '@hitchbook/shared/roles';
import { paths } from './paths';

/** `view` shows an area; `manage` also shows its create, edit and remove controls. */
export type Access = 'view' | 'manage';

export interface AreaLink {
  label: string;
  href: string;
}

export interface Area {
  key: string;
  label: string;
  href: string;
  access: Partial<Record<Role, Access>>;
  /** Sub-pages shown under the area in the navigation; the area's own href is the first. */
  links?: readonly AreaLink[];
}

const everyone = { owner: 'manage', partner: 'manage', operator: 'manage', bookkeeper: 'manage', customer: 'manage' } as const;

/**
 * Which role sees which part of the app, in navigation order. The server enforces the same
 * rules on every request; this map only decides what to show. A new area is one entry here and its
 * icon in the navigation (MainNav). The icons live there so that pages needing only the access rules
 * (the cab page's start) do not load them.
 */
export const AREAS = [
  { key: 'dashboard', label: 'Dashboard', href: paths.dashboard(), access: everyone },
  {
    key: 'work',
    label: 'Work',
    href: paths.work.entries(),
    // An operator manages only their own entries; the server scopes every read and write to them.
    access: { owner: 'manage', partner: 'manage', operator: 'manage', bookkeeper: 'view' },
  },
  {
    key: 'machines',
    label: 'Machines',
    href: paths.machines(),
    access: { owner: 'manage', partner: 'manage', operator: 'view', bookkeeper: 'view' },
  },
  {
    key: 'fields',
    label: 'Fields',
    href: paths.fields(),
    access: { owner: 'manage', partner: 'manage', operator: 'view', bookkeeper: 'view' },
  },
  {
    key: 'squareUps',
    label: 'Square-up',
    href: paths.squareUps(),
    // Owner and partner open, record and close periods; the bookkeeper reads and exports them.
    access: { owner: 'manage', partner: 'manage', bookkeeper: 'view' },
  },
  {
    key: 'yearEnd',
    label: 'Year-end',
    href: paths.yearEnd(),
    // Only the owner turns suggested rates into next year's family rate sheet.
    access: { owner: 'manage', partner: 'view', bookkeeper: 'view' },
  },
  {
    key: 'invoices',
    label: 'Invoices',
    href: paths.invoices(),
    // Drafting, issuing, payments and refunds are the owner's; partner and bookkeeper read and download, as the server allows.
    access: { owner: 'manage', partner: 'view', bookkeeper: 'view' },
  },
  {
    key: 'rates',
    label: 'Rates',
    href: paths.rateSheets(),
    access: { owner: 'manage', partner: 'view', bookkeeper: 'view' },
  },
  {
    key: 'estimates',
    label: 'Estimates',
    href: paths.estimates.machineRate(),
    // Estimates store nothing, but they are money figures, so operators and customers do not see them.
    access: { owner: 'manage', partner: 'manage', bookkeeper: 'manage' },
    links: [
      { label: 'Machine-hour rate', href: paths.estimates.machineRate() },
      { label: 'Own or hire', href: paths.estimates.ownOrHire() },
      { label: 'Joint ownership planner', href: paths.estimates.jointOwnership() },
    ],
  },
  {
    key: 'parties',
    label: 'Parties',
    href: paths.parties(),
    access: { owner: 'manage', partner: 'manage', bookkeeper: 'view' },
  },
  { key: 'users', label: 'Users', href: paths.users(), access: { owner: 'manage', bookkeeper: 'view' } },
  // Read only, for everyone who may see it: the log is never edited.
  { key: 'audit', label: 'Audit log', href: paths.audit(), access: { owner: 'view', bookkeeper: 'view' } },
  // A customer sees only the invoices addressed to them; the server scopes every read to their party.
  { key: 'myInvoices', label: 'My invoices', href: paths.myInvoices(), access: { customer: 'manage' } },
  { key: 'account', label: 'Account', href: paths.account(), access: everyone },
] as const satisfies readonly Area[];

export type AreaKey = (typeof AREAS)[number]['key'];

export function accessTo(role: Role, key: AreaKey): Access | null {
  const area: Area | undefined = AREAS.find((a) => a.key === key);
  return area?.access[role] ?? null;
}

export function areasFor(role: Role): Area[] {
  return AREAS.filter((area: Area) => area.access[role] !== undefined);
}

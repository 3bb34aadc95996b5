type Query = Record<string, string | number | undefined | null>;

function withQuery(path: string, query?: Query): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query ?? {})) {
    if (value !== undefined && value !== null && value !== '') params.set(key, String(value));
  }
  const search = params.toString();
  return search ? `${path}?${search}` : path;
}

export type ListQuery = {
  page?: number;
  pageSize?: number;
  sort?: string;
  q?: string;
};

export type MachineListQuery = ListQuery & { status?: string; kind?: string; classId?: string; ownerPartyId?: string };

export type FieldListQuery = ListQuery & { kind?: string; farmLabel?: string; ownerPartyId?: string; archived?: string };

/** The work-entries table's filters, as the API names them. */
export type WorkEntryListQuery = {
  page?: number;
  pageSize?: number;
  sort?: string;
  dateFrom?: string;
  dateTo?: string;
  machineId?: string;
  fieldId?: string;
  operatorUserId?: string;
  billToPartyId?: string;
  workTypeId?: string;
  state?: string;
};

/** The invoice list's filters, as the API names them (`from`/`to` filter on the issue date). */
export type InvoiceListQuery = ListQuery & { partyId?: string; state?: string; from?: string; to?: string };

export type RateSheetListQuery = ListQuery & { relationship?: string; archived?: string };

/** Every in-app link is built here, so a route can move without hunting for hand-written URLs. */
export const paths = {
  dashboard: () => '/',
  signIn: (query?: { next?: string }) => withQuery('/sign-in', query),
  forgotPassword: () => '/forgot-password',
  resetPassword: (query?: { token?: string }) => withQuery('/reset-password', query),
  acceptInvite: (query?: { token?: string }) => withQuery('/accept-invite', query),
  account: () => '/account',
  parties: (query?: ListQuery & { kind?: 'household' | 'customer' }) => withQuery('/parties', query),
  users: (query?: ListQuery) => withQuery('/users', query),
  audit: (query?: { entityType?: string; actorUserId?: string; from?: string; to?: string; page?: number }) => withQuery('/audit', query),
  machines: (query?: MachineListQuery) => withQuery('/machines', query),
  newMachine: () => '/machines/new',
  machine: (id: string) => `/machines/${id}`,
  editMachine: (id: string) => `/machines/${id}/edit`,
  fields: (query?: FieldListQuery) => withQuery('/fields', query),
  newField: (query?: { kind?: 'field' | 'roadside' }) => withQuery('/fields/new', query),
  editField: (id: string) => `/fields/${id}/edit`,
  work: {
    entries: (query?: WorkEntryListQuery) => withQuery('/work', query),
    log: () => '/work/log',
    editEntry: (id: string) => `/work/${id}/edit`,
    import: () => '/work/import',
  },
  squareUps: () => '/square-ups',
  squareUp: (id: string) => `/square-ups/${id}`,
  yearEnd: (query?: { year?: number }) => withQuery('/year-end', query),
  rateSheets: (query?: RateSheetListQuery) => withQuery('/rates', query),
  newRateSheet: () => '/rates/new',
  rateSheet: (id: string) => `/rates/${id}`,
  editRateSheet: (id: string) => `/rates/${id}/edit`,
  invoices: (query?: InvoiceListQuery) => withQuery('/invoices', query),
  newInvoice: () => '/invoices/new',
  invoice: (id: string) => `/invoices/${id}`,
  myInvoices: (query?: ListQuery) => withQuery('/my-invoices', query),
  myInvoice: (id: string) => `/my-invoices/${id}`,
  /** The link the invoice e-mail carries and the page card checkout returns to (the API builds the same). */
  payInvoice: (id: string, query?: { checkout?: string }) => withQuery(`/pay/${id}`, query),
  estimates: {
    machineRate: () => '/estimates/machine-rate',
    ownOrHire: () => '/estimates/own-or-hire',
    jointOwnership: () => '/estimates/joint-ownership',
  },
} as const;

/**
 * Only same-app paths are accepted as a place to return to after signing in, so a crafted
 * link cannot bounce a user to another site.
 */
export function safeNextPath(next: string | null | undefined): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return paths.dashboard();
  return next;
}

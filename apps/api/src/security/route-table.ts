import { randomUUID } from 'node:crypto';
import { throwaway, type Caller, type SecurityWorld } from './security-world.fixture.js';

/**
 * Who may call what, written out by hand for every route. It is deliberately not read from the
 * @Roles() decorators: a route whose decorator drifts from this table, and a route with no row here,
 * both fail the test.
 */
export type Staff = Exclude<Caller, 'anonymous'>;
const OWNER: Staff[] = ['owner'];
const OWNER_PARTNER: Staff[] = ['owner', 'partner'];
const MONEY_READERS: Staff[] = ['owner', 'partner', 'bookkeeper'];
const STAFF_READERS: Staff[] = ['owner', 'partner', 'operator', 'bookkeeper'];
const LOGGERS: Staff[] = ['owner', 'partner', 'operator'];
const INVOICE_READERS: Staff[] = ['owner', 'partner', 'bookkeeper', 'customer'];
export const EVERYONE: Staff[] = ['owner', 'partner', 'operator', 'bookkeeper', 'customer'];

export interface Row {
  /** Callers the route serves; 'public' routes answer every caller alike. */
  allow: Staff[] | 'public';
  /** The path with real ids; given the caller, so a call that uses up its row gets its own. */
  path: (w: SecurityWorld, caller: Caller) => string | Promise<string>;
  /** The status an allowed caller gets: 2xx for reads and bodiless actions, 400 for writes sent a probe body. */
  ok: number;
  /** Allowed callers the route answers differently, each with its reason beside it. */
  okFor?: Partial<Record<Staff, number>>;
}

/** A body every strict schema refuses, so an allowed write reaches validation and changes nothing. */
export const PROBE = { matrixProbe: true };

export const ROWS: Record<string, Row> = {
  'GET /api/health': { allow: 'public', path: () => '/api/health', ok: 200 },
  'POST /api/auth/login': { allow: 'public', path: () => '/api/auth/login', ok: 400 },
  // The cookie routes refuse a request without the app header before anything else.
  'POST /api/auth/refresh': { allow: 'public', path: () => '/api/auth/refresh', ok: 403 },
  'POST /api/auth/logout': { allow: 'public', path: () => '/api/auth/logout', ok: 403 },
  'POST /api/auth/password-reset/request': { allow: 'public', path: () => '/api/auth/password-reset/request', ok: 400 },
  'POST /api/auth/password-reset/confirm': { allow: 'public', path: () => '/api/auth/password-reset/confirm', ok: 400 },
  'GET /api/auth/invitations/:token': { allow: 'public', path: () => `/api/auth/invitations/${randomUUID()}`, ok: 404 },
  'POST /api/auth/invitations/accept': { allow: 'public', path: () => '/api/auth/invitations/accept', ok: 400 },
  'POST /api/payments/stripe-webhook': { allow: 'public', path: () => '/api/payments/stripe-webhook', ok: 400 },

  'GET /api/auth/me': { allow: EVERYONE, path: () => '/api/auth/me', ok: 200 },
  'POST /api/auth/password': { allow: EVERYONE, path: () => '/api/auth/password', ok: 400 },
  'GET /api/dashboard': { allow: EVERYONE, path: () => '/api/dashboard', ok: 200 },

  'GET /api/users': { allow: ['owner', 'bookkeeper'], path: () => '/api/users', ok: 200 },
  'GET /api/audit': { allow: ['owner', 'bookkeeper'], path: () => '/api/audit', ok: 200 },
  'POST /api/users/invitations': { allow: OWNER, path: () => '/api/users/invitations', ok: 400 },
  'PATCH /api/users/:membershipId': { allow: OWNER, path: (w) => `/api/users/${w.ids.membership}`, ok: 400 },
  'DELETE /api/users/:membershipId': { allow: OWNER, path: async (w, c) => `/api/users/${c === 'owner' ? await throwaway.membership(w) : w.ids.membership}`, ok: 204 },

  'GET /api/parties': { allow: STAFF_READERS, path: () => '/api/parties', ok: 200 },
  'GET /api/parties/:id': { allow: STAFF_READERS, path: (w) => `/api/parties/${w.ids.party}`, ok: 200 },
  'POST /api/parties': { allow: OWNER_PARTNER, path: () => '/api/parties', ok: 400 },
  'PATCH /api/parties/:id': { allow: OWNER_PARTNER, path: (w) => `/api/parties/${w.ids.party}`, ok: 400 },

  'GET /api/machines': { allow: STAFF_READERS, path: () => '/api/machines', ok: 200 },
  'GET /api/machines/export.csv': { allow: STAFF_READERS, path: () => '/api/machines/export.csv', ok: 200 },
  'GET /api/machines/:id': { allow: STAFF_READERS, path: (w) => `/api/machines/${w.ids.machine}`, ok: 200 },
  'GET /api/machines/:id/summary': { allow: STAFF_READERS, path: (w) => `/api/machines/${w.ids.machine}/summary`, ok: 200 },
  'POST /api/machines': { allow: OWNER_PARTNER, path: () => '/api/machines', ok: 400 },
  'PATCH /api/machines/:id': { allow: OWNER_PARTNER, path: (w) => `/api/machines/${w.ids.machine}`, ok: 400 },
  'DELETE /api/machines/:id': { allow: OWNER_PARTNER, path: async (w, c) => `/api/machines/${OWNER_PARTNER.includes(c as Staff) ? await throwaway.machine(w) : w.ids.machine}`, ok: 204 },
  'GET /api/machines/:id/costs': { allow: MONEY_READERS, path: (w) => `/api/machines/${w.ids.machine}/costs`, ok: 200 },
  'GET /api/machines/:id/costs/export.csv': { allow: MONEY_READERS, path: (w) => `/api/machines/${w.ids.machine}/costs/export.csv`, ok: 200 },
  'GET /api/machines/:id/costs/:costId': { allow: MONEY_READERS, path: (w) => `/api/machines/${w.ids.machine}/costs/${w.ids.cost}`, ok: 200 },
  'POST /api/machines/:id/costs': { allow: OWNER_PARTNER, path: (w) => `/api/machines/${w.ids.machine}/costs`, ok: 400 },
  'PATCH /api/machines/:id/costs/:costId': { allow: OWNER_PARTNER, path: (w) => `/api/machines/${w.ids.machine}/costs/${w.ids.cost}`, ok: 400 },
  'DELETE /api/machines/:id/costs/:costId': {
    allow: OWNER_PARTNER,
    path: async (w, c) => `/api/machines/${w.ids.machine}/costs/${OWNER_PARTNER.includes(c as Staff) ? await throwaway.cost(w) : w.ids.cost}`,
    ok: 204,
  },
  'GET /api/machines/:id/shares': { allow: STAFF_READERS, path: (w) => `/api/machines/${w.ids.machine}/shares`, ok: 200 },
  'PUT /api/machines/:id/shares': { allow: OWNER_PARTNER, path: (w) => `/api/machines/${w.ids.machine}/shares`, ok: 400 },
  'GET /api/machines/:id/meter-readings': { allow: STAFF_READERS, path: (w) => `/api/machines/${w.ids.machine}/meter-readings`, ok: 200 },
  'POST /api/machines/:id/meter-readings': { allow: LOGGERS, path: (w) => `/api/machines/${w.ids.machine}/meter-readings`, ok: 400 },

  'GET /api/fields': { allow: STAFF_READERS, path: () => '/api/fields', ok: 200 },
  'GET /api/fields/export.csv': { allow: STAFF_READERS, path: () => '/api/fields/export.csv', ok: 200 },
  'GET /api/fields/:id': { allow: STAFF_READERS, path: (w) => `/api/fields/${w.ids.field}`, ok: 200 },
  'POST /api/fields': { allow: OWNER_PARTNER, path: () => '/api/fields', ok: 400 },
  'PATCH /api/fields/:id': { allow: OWNER_PARTNER, path: (w) => `/api/fields/${w.ids.field}`, ok: 400 },

  'GET /api/work-types': { allow: STAFF_READERS, path: () => '/api/work-types', ok: 200 },
  'GET /api/work-types/:id': { allow: STAFF_READERS, path: (w) => `/api/work-types/${w.ids.workType}`, ok: 200 },
  'POST /api/work-types': { allow: OWNER_PARTNER, path: () => '/api/work-types', ok: 400 },
  'PATCH /api/work-types/:id': { allow: OWNER_PARTNER, path: (w) => `/api/work-types/${w.ids.workType}`, ok: 400 },

  'GET /api/work-entries': { allow: STAFF_READERS, path: () => '/api/work-entries', ok: 200 },
  'GET /api/work-entries/export.csv': { allow: STAFF_READERS, path: () => '/api/work-entries/export.csv', ok: 200 },
  'POST /api/work-entries/import': { allow: OWNER_PARTNER, path: () => '/api/work-entries/import', ok: 400 },
  'GET /api/work-entries/:id': { allow: STAFF_READERS, path: (w) => `/api/work-entries/${w.ids.entry}`, ok: 200 },
  'POST /api/work-entries': { allow: LOGGERS, path: () => '/api/work-entries', ok: 400 },
  'PATCH /api/work-entries/:id': { allow: LOGGERS, path: (w) => `/api/work-entries/${w.ids.entry}`, ok: 400 },
  'POST /api/work-entries/:id/submit': { allow: LOGGERS, path: (w) => `/api/work-entries/${w.ids.entry}/submit`, ok: 400 },
  'POST /api/work-entries/:id/approve': { allow: OWNER_PARTNER, path: (w) => `/api/work-entries/${w.ids.entry}/approve`, ok: 400 },
  'POST /api/work-entries/:id/reopen': { allow: OWNER_PARTNER, path: (w) => `/api/work-entries/${w.ids.entry}/reopen`, ok: 400 },
  'GET /api/work-entries/:id/photos': { allow: STAFF_READERS, path: (w) => `/api/work-entries/${w.ids.entry}/photos`, ok: 200 },
  'GET /api/work-entries/:id/photos/:uploadId': { allow: STAFF_READERS, path: (w) => `/api/work-entries/${w.ids.entry}/photos/${w.ids.photo}`, ok: 200 },
  // Multipart without a file: refused at validation.
  'POST /api/work-entries/:id/photos': { allow: LOGGERS, path: (w) => `/api/work-entries/${w.ids.entry}/photos`, ok: 400 },
  'DELETE /api/work-entries/:id/photos/:uploadId': {
    allow: LOGGERS,
    path: async (w, c) => `/api/work-entries/${w.ids.entry}/photos/${LOGGERS.includes(c as Staff) ? await throwaway.photo(w) : w.ids.photo}`,
    ok: 204,
  },
  'DELETE /api/work-entries/:id': { allow: LOGGERS, path: async (w, c) => `/api/work-entries/${LOGGERS.includes(c as Staff) ? await throwaway.entry(w) : w.ids.entry}`, ok: 204 },

  'GET /api/rate-sheets': { allow: MONEY_READERS, path: () => '/api/rate-sheets', ok: 200 },
  'GET /api/rate-sheets/in-force': { allow: MONEY_READERS, path: (w) => `/api/rate-sheets/in-force?partyId=${w.ids.party}&date=2025-05-01`, ok: 200 },
  'GET /api/rate-sheets/:id': { allow: MONEY_READERS, path: (w) => `/api/rate-sheets/${w.ids.rateSheet}`, ok: 200 },
  'POST /api/rate-sheets': { allow: OWNER, path: () => '/api/rate-sheets', ok: 400 },
  'PATCH /api/rate-sheets/:id': { allow: OWNER, path: (w) => `/api/rate-sheets/${w.ids.rateSheet}`, ok: 400 },
  'DELETE /api/rate-sheets/:id': { allow: OWNER, path: async (w, c) => `/api/rate-sheets/${c === 'owner' ? await throwaway.rateSheet(w) : w.ids.rateSheet}`, ok: 200 },

  'GET /api/invoices': { allow: INVOICE_READERS, path: () => '/api/invoices', ok: 200 },
  'GET /api/invoices/:id': { allow: INVOICE_READERS, path: (w) => `/api/invoices/${w.ids.invoice}`, ok: 200 },
  'GET /api/invoices/:id/pdf': { allow: INVOICE_READERS, path: (w) => `/api/invoices/${w.ids.invoice}/pdf`, ok: 200 },
  'GET /api/invoices/:id/payments': { allow: INVOICE_READERS, path: (w) => `/api/invoices/${w.ids.invoice}/payments`, ok: 200 },
  'POST /api/invoices/drafts': { allow: OWNER, path: () => '/api/invoices/drafts', ok: 400 },
  'PATCH /api/invoices/:id': { allow: OWNER, path: (w) => `/api/invoices/${w.ids.draftInvoice}`, ok: 400 },
  'DELETE /api/invoices/:id': { allow: OWNER, path: async (w, c) => `/api/invoices/${c === 'owner' ? await throwaway.draftInvoice(w) : w.ids.draftInvoice}`, ok: 204 },
  'POST /api/invoices/:id/issue': { allow: OWNER, path: (w) => `/api/invoices/${w.ids.draftInvoice}/issue`, ok: 400 },
  'POST /api/invoices/:id/void': { allow: OWNER, path: (w) => `/api/invoices/${w.ids.invoice}/void`, ok: 400 },
  'POST /api/invoices/:id/credit-notes': { allow: OWNER, path: (w) => `/api/invoices/${w.ids.invoice}/credit-notes`, ok: 400 },
  'POST /api/invoices/:id/send': { allow: OWNER, path: (w) => `/api/invoices/${w.ids.invoice}/send`, ok: 400 },
  'POST /api/invoices/:id/payments': { allow: OWNER, path: (w) => `/api/invoices/${w.ids.invoice}/payments`, ok: 400 },
  'POST /api/invoices/:id/payments/:paymentId/refund': { allow: OWNER, path: (w) => `/api/invoices/${w.ids.otherInvoice}/payments/${w.ids.payment}/refund`, ok: 400 },
  'POST /api/invoices/:id/checkout': { allow: ['owner', 'customer'], path: (w) => `/api/invoices/${w.ids.invoice}/checkout`, ok: 400 },

  'GET /api/square-ups': { allow: MONEY_READERS, path: () => '/api/square-ups', ok: 200 },
  'POST /api/square-ups': { allow: OWNER_PARTNER, path: () => '/api/square-ups', ok: 400 },
  'GET /api/square-ups/:id': { allow: MONEY_READERS, path: (w) => `/api/square-ups/${w.ids.squareUp}`, ok: 200 },
  'GET /api/square-ups/:id/statement': { allow: MONEY_READERS, path: (w) => `/api/square-ups/${w.ids.squareUp}/statement`, ok: 200 },
  'GET /api/square-ups/:id/statement/lines': { allow: MONEY_READERS, path: (w) => `/api/square-ups/${w.ids.squareUp}/statement/lines?household=${w.fx.households[0]}`, ok: 200 },
  'GET /api/square-ups/:id/statement.csv': { allow: MONEY_READERS, path: (w) => `/api/square-ups/${w.ids.squareUp}/statement.csv`, ok: 200 },
  'GET /api/square-ups/:id/statement.pdf': { allow: MONEY_READERS, path: (w) => `/api/square-ups/${w.ids.squareUp}/statement.pdf`, ok: 200 },
  'POST /api/square-ups/:id/close': {
    allow: OWNER_PARTNER,
    path: async (w, c) => `/api/square-ups/${OWNER_PARTNER.includes(c as Staff) ? await throwaway.openSquareUp(w, c === 'owner' ? 2021 : 2022) : w.ids.squareUp}/close`,
    ok: 200,
  },
  'POST /api/square-ups/:id/transfers/:transferId/paid': { allow: OWNER_PARTNER, path: (w) => `/api/square-ups/${w.ids.squareUp}/transfers/${w.ids.transfer}/paid`, ok: 400 },

  'GET /api/estimates/machine-classes': { allow: MONEY_READERS, path: () => '/api/estimates/machine-classes', ok: 200 },
  'POST /api/estimates/machine-cost': { allow: MONEY_READERS, path: () => '/api/estimates/machine-cost', ok: 400 },
  'POST /api/estimates/field-capacity': { allow: MONEY_READERS, path: () => '/api/estimates/field-capacity', ok: 400 },
  'POST /api/estimates/break-even': { allow: MONEY_READERS, path: () => '/api/estimates/break-even', ok: 400 },
  'POST /api/estimates/joint-ownership': { allow: MONEY_READERS, path: () => '/api/estimates/joint-ownership', ok: 400 },

  'GET /api/reports/machine-rates': { allow: MONEY_READERS, path: () => '/api/reports/machine-rates?year=2025', ok: 200 },
  'GET /api/reports/machine-rates.csv': { allow: MONEY_READERS, path: () => '/api/reports/machine-rates.csv?year=2025', ok: 200 },
  'GET /api/reports/machine-rates.pdf': { allow: MONEY_READERS, path: () => '/api/reports/machine-rates.pdf?year=2025', ok: 200 },
  'POST /api/reports/machine-rates/accept': { allow: OWNER, path: () => '/api/reports/machine-rates/accept', ok: 400 },
  'GET /api/reports/machine-hours': { allow: MONEY_READERS, path: () => '/api/reports/machine-hours?year=2025', ok: 200 },
  'GET /api/reports/custom-income': { allow: MONEY_READERS, path: () => '/api/reports/custom-income?year=2025', ok: 200 },
  'GET /api/reports/custom-income.csv': { allow: MONEY_READERS, path: () => '/api/reports/custom-income.csv?year=2025', ok: 200 },

  'POST /api/uploads': { allow: LOGGERS, path: () => '/api/uploads', ok: 400 },
  // The file is a cost receipt: money papers are hidden from the operator as if they did not exist.
  'GET /api/uploads/:id': { allow: STAFF_READERS, path: (w) => `/api/uploads/${w.ids.upload}`, ok: 200, okFor: { operator: 404 } },
};

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

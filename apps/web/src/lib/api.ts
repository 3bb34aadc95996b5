import type { LoginResponse, SessionUser } from '@hitchbook/shared/schemas/auth';

/** One field-level problem reported by the server, with the dotted path of the field. */
export interface ApiIssue {
  path: string;
  message: string;
}

/** Any failed call: status 0 means the server could not be reached at all. */
export class ApiError extends Error {
  readonly status: number;
  readonly issues: ApiIssue[];

  constructor(status: number, message: string, issues: ApiIssue[] = []) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.issues = issues;
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

export interface Session {
  accessToken: string;
  /** Epoch milliseconds when the access token stops being accepted. */
  expiresAt: number;
  user: SessionUser;
}

/** Holds the signed-in session in memory only: a reload restores it through the refresh cookie. */
export interface SessionStore {
  get(): Session | null;
  set(session: Session | null): void;
  subscribe(listener: () => void): () => void;
}

export function createSessionStore(): SessionStore {
  let current: Session | null = null;
  const listeners = new Set<() => void>();
  return {
    get: () => current,
    set(session) {
      current = session;
      for (const listener of listeners) listener();
    },
    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
  };
}

type QueryValue = string | number | boolean | null | undefined;

export interface RequestOptions {
  body?: unknown;
  query?: Record<string, QueryValue>;
  signal?: AbortSignal;
  /** Public auth routes send no bearer token, and a 401 from them is an answer, not an expiry. */
  anonymous?: boolean;
  headers?: Record<string, string>;
}

export interface ApiClientOptions {
  sessionStore: SessionStore;
  fetch?: typeof fetch;
  baseUrl?: string;
  now?: () => number;
}

/** The refresh and logout routes refuse requests without this header, which a cross-site form cannot set. */
const CSRF_HEADER = { 'X-Requested-With': 'hitchbook' } as const;

const FALLBACK_MESSAGES: Record<number, string> = {
  0: "Can't reach the Hitchbook server. Check the connection and try again.",
  401: 'Please sign in again.',
  403: "Your role can't do that.",
  404: 'Not found.',
  409: 'Someone changed this in the meantime. Reload and try again.',
  413: 'That is too large to upload.',
  429: 'Too many attempts. Wait a minute and try again.',
  503: "The server can't reach its database right now. Try again in a few minutes.",
};

function fallbackMessage(status: number): string {
  return FALLBACK_MESSAGES[status] ?? 'Something went wrong on the server. Try again.';
}

function buildUrl(baseUrl: string, path: string, query?: Record<string, QueryValue>): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query ?? {})) {
    if (value !== undefined && value !== null && value !== '') params.set(key, String(value));
  }
  const search = params.toString();
  return `${baseUrl}${path}${search ? `?${search}` : ''}`;
}

function readIssues(raw: unknown): ApiIssue[] {
  if (!Array.isArray(raw)) return [];
  return raw.flatMap((item): ApiIssue[] => {
    if (typeof item !== 'object' || item === null) return [];
    const { path, message } = item as { path?: unknown; message?: unknown };
    const dotted = Array.isArray(path) ? path.join('.') : typeof path === 'string' ? path : '';
    return typeof message === 'string' ? [{ path: dotted, message }] : [];
  });
}

async function toApiError(response: Response): Promise<ApiError> {
  let body: unknown = null;
  if ((response.headers.get('content-type') ?? '').includes('json')) {
    body = await response.json().catch(() => null);
  }
  const raw = typeof body === 'object' && body !== null ? (body as Record<string, unknown>) : {};
  const message = Array.isArray(raw.message)
    ? raw.message.filter((m) => typeof m === 'string').join(' ')
    : typeof raw.message === 'string'
      ? raw.message
      : '';
  return new ApiError(response.status, message || fallbackMessage(response.status), readIssues(raw.issues));
}

async function readBody<T>(response: Response): Promise<T> {
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  return (text ? JSON.parse(text) : undefined) as T;
}

export function createApiClient(options: ApiClientOptions) {
  const { sessionStore } = options;
  const fetchImpl = options.fetch ?? ((input, init) => globalThis.fetch(input, init));
  const baseUrl = options.baseUrl ?? '';
  const now = options.now ?? Date.now;
  let refreshInFlight: Promise<Session | null> | null = null;

  function toSession(body: LoginResponse): Session {
    return { accessToken: body.accessToken, expiresAt: now() + body.expiresIn * 1000, user: body.user };
  }

  async function send(method: string, path: string, opts: RequestOptions, token: string | null) {
    const headers: Record<string, string> = { Accept: 'application/json', ...opts.headers };
    if (opts.body !== undefined) headers['Content-Type'] = 'application/json';
    if (token) headers.Authorization = `Bearer ${token}`;
    try {
      return await fetchImpl(buildUrl(baseUrl, path, opts.query), {
        method,
        headers,
        body: opts.body === undefined ? undefined : JSON.stringify(opts.body),
        credentials: 'same-origin',
        signal: opts.signal,
      });
    } catch (error) {
      if (opts.signal?.aborted) throw error;
      throw new ApiError(0, fallbackMessage(0));
    }
  }

  async function runRefresh(): Promise<Session | null> {
    const response = await send('POST', '/api/auth/refresh', { anonymous: true, headers: CSRF_HEADER }, null);
    if (response.status === 401) {
      sessionStore.set(null);
      return null;
    }
    if (!response.ok) throw await toApiError(response);
    const session = toSession(await readBody<LoginResponse>(response));
    sessionStore.set(session);
    return session;
  }

  /**
   * Exchanges the refresh cookie for a new access token. Concurrent callers share one request,
   * because the server rotates the cookie and a second parallel refresh would present a spent one.
   */
  function refreshSession(): Promise<Session | null> {
    refreshInFlight ??= runRefresh().finally(() => {
      refreshInFlight = null;
    });
    return refreshInFlight;
  }

  async function request<T>(method: string, path: string, opts: RequestOptions = {}): Promise<T> {
    const token = opts.anonymous ? null : (sessionStore.get()?.accessToken ?? null);
    let response = await send(method, path, opts, token);
    if (response.status === 401 && !opts.anonymous) {
      // Another request may already have refreshed while this one was in flight.
      const current = sessionStore.get()?.accessToken ?? null;
      const fresh = current && current !== token ? current : (await refreshSession())?.accessToken;
      if (!fresh) throw new ApiError(401, fallbackMessage(401));
      response = await send(method, path, opts, fresh);
      if (response.status === 401) sessionStore.set(null);
    }
    if (!response.ok) throw await toApiError(response);
    return readBody<T>(response);
  }

  async function signIn(path: string, body: unknown): Promise<Session> {
    const session = toSession(await request<LoginResponse>('POST', path, { body, anonymous: true }));
    sessionStore.set(session);
    return session;
  }

  async function signOut(): Promise<void> {
    try {
      await request<void>('POST', '/api/auth/logout', { anonymous: true, headers: CSRF_HEADER });
    } finally {
      sessionStore.set(null);
    }
  }

  return {
    request,
    get: <T>(path: string, opts?: Omit<RequestOptions, 'body'>) => request<T>('GET', path, opts),
    post: <T>(path: string, body?: unknown, opts?: RequestOptions) => request<T>('POST', path, { ...opts, body }),
    patch: <T>(path: string, body?: unknown, opts?: RequestOptions) => request<T>('PATCH', path, { ...opts, body }),
    delete: <T = void>(path: string, opts?: RequestOptions) => request<T>('DELETE', path, opts),
    refreshSession,
    signIn,
    signOut,
  };
}

export type ApiClient = ReturnType<typeof createApiClient>;

export const sessionStore = createSessionStore();

/** The one client the app uses; tests build their own with a fake fetch. */
export const api = createApiClient({ sessionStore });

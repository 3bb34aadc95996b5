import { api, ApiError, sessionStore, type ApiIssue } from './api';

// Files go up as multipart and come down as blobs, which the JSON client does not do. Both
// still carry the in-memory bearer token and share the client's single-flight refresh, so a
// plain <a href> (which would carry no token) is never used for a protected file.

/** A failed upload, with the parsed body for routes that report details beside the error. */
export class FileTransferError extends ApiError {
  readonly body: unknown;

  constructor(status: number, message: string, issues: ApiIssue[], body: unknown) {
    super(status, message, issues);
    this.name = 'FileTransferError';
    this.body = body;
  }
}

const FALLBACK: Record<number, string> = {
  0: "Can't reach the Hitchbook server. Check the connection and try again.",
  401: 'Please sign in again.',
  403: "Your role can't do that.",
  413: 'That file is too large to upload.',
  429: 'Too many attempts. Wait a minute and try again.',
};

function parseJson(text: string): unknown {
  try {
    return text ? JSON.parse(text) : null;
  } catch {
    return null;
  }
}

/** The error an upload or download answered with, read the same way the JSON client reads one. */
export function transferErrorFrom(status: number, text: string): FileTransferError {
  const body = parseJson(text);
  const raw = typeof body === 'object' && body !== null ? (body as Record<string, unknown>) : {};
  const message = typeof raw.message === 'string' && raw.message ? raw.message : (FALLBACK[status] ?? 'Something went wrong on the server. Try again.');
  const issues: ApiIssue[] = Array.isArray(raw.issues)
    ? raw.issues.flatMap((item): ApiIssue[] => {
        if (typeof item !== 'object' || item === null) return [];
        const { path, message: text } = item as { path?: unknown; message?: unknown };
        const dotted = Array.isArray(path) ? path.join('.') : typeof path === 'string' ? path : '';
        return typeof text === 'string' ? [{ path: dotted, message: text }] : [];
      })
    : [];
  return new FileTransferError(status, message, issues, body);
}

/** The file name a download was given by the server, or the fallback when it named none. */
export function fileNameFromDisposition(header: string | null, fallback: string): string {
  if (!header) return fallback;
  const encoded = /filename\*=UTF-8''([^;]+)/i.exec(header);
  if (encoded?.[1]) {
    try {
      return decodeURIComponent(encoded[1].trim());
    } catch {
      // A malformed escape falls through to the plain name.
    }
  }
  const plain = /filename="([^"]+)"/i.exec(header) ?? /filename=([^;]+)/i.exec(header);
  return plain?.[1]?.trim() || fallback;
}

function withQuery(path: string, query?: Record<string, string | undefined>): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query ?? {})) if (value) params.set(key, value);
  const search = params.toString();
  return search ? `${path}?${search}` : path;
}

async function freshTokenAfter(rejected: string | null): Promise<string | null> {
  const current = sessionStore.get()?.accessToken ?? null;
  if (current && current !== rejected) return current;
  return (await api.refreshSession())?.accessToken ?? null;
}

export interface UploadOptions {
  path: string;
  query?: Record<string, string | undefined>;
  /** Form fields sent before the file (the server reads them in order). */
  fields?: Record<string, string>;
  file: File;
  /** Share of the bytes sent so far, 0 to 1. */
  onProgress?: (sent: number) => void;
  signal?: AbortSignal;
}

function sendOnce<T>(options: UploadOptions, token: string | null): Promise<{ status: number; body: T; text: string }> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', withQuery(options.path, options.query));
    xhr.setRequestHeader('Accept', 'application/json');
    if (token) xhr.setRequestHeader('Authorization', `Bearer ${token}`);
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable && event.total > 0) options.onProgress?.(event.loaded / event.total);
    };
    xhr.onload = () => resolve({ status: xhr.status, body: parseJson(xhr.responseText) as T, text: xhr.responseText });
    xhr.onerror = () => reject(transferErrorFrom(0, ''));
    xhr.onabort = () => reject(new DOMException('The upload was cancelled.', 'AbortError'));
    options.signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    const form = new FormData();
    for (const [key, value] of Object.entries(options.fields ?? {})) form.append(key, value);
    form.append('file', options.file, options.file.name);
    xhr.send(form);
  });
}

/**
 * Sends one file as multipart/form-data with upload progress (fetch reports none). A 401 gets
 * one retry with a refreshed token; any other failure throws a FileTransferError.
 */
export async function uploadFile<T>(options: UploadOptions): Promise<T> {
  const token = sessionStore.get()?.accessToken ?? null;
  let answer = await sendOnce<T>(options, token);
  if (answer.status === 401) {
    const fresh = await freshTokenAfter(token);
    if (!fresh) throw transferErrorFrom(401, '');
    options.onProgress?.(0);
    answer = await sendOnce<T>(options, fresh);
  }
  if (answer.status < 200 || answer.status >= 300) throw transferErrorFrom(answer.status, answer.text);
  return answer.body;
}

async function fetchBlob(path: string, token: string | null): Promise<Response> {
  try {
    return await fetch(path, { headers: token ? { Authorization: `Bearer ${token}` } : {}, credentials: 'same-origin' });
  } catch {
    throw transferErrorFrom(0, '');
  }
}

async function fetchWithSession(url: string): Promise<Response> {
  const token = sessionStore.get()?.accessToken ?? null;
  let response = await fetchBlob(url, token);
  if (response.status === 401) {
    const fresh = await freshTokenAfter(token);
    if (!fresh) throw transferErrorFrom(401, '');
    response = await fetchBlob(url, fresh);
  }
  if (!response.ok) throw transferErrorFrom(response.status, await response.text());
  return response;
}

/** A protected file's bytes, for showing in the page (an image's object URL) rather than saving. */
export async function fetchFile(path: string): Promise<Blob> {
  return (await fetchWithSession(path)).blob();
}

/** Fetches a protected file with the session's token and hands it to the browser as a download. */
export async function downloadFile(path: string, query: Record<string, string | undefined> | undefined, fallbackName: string): Promise<void> {
  const response = await fetchWithSession(withQuery(path, query));
  const blob = await response.blob();
  const objectUrl = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = objectUrl;
  link.download = fileNameFromDisposition(response.headers.get('content-disposition'), fallbackName);
  document.body.append(link);
  link.click();
  link.remove();
  // The browser has taken its copy once the click is handled.
  setTimeout(() => URL.revokeObjectURL(objectUrl), 1000);
}

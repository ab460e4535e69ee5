import type { ApiErrorBody } from '@shared/schemas/errors';
import { paths } from './paths';

/** An API answer that was not 2xx, carrying the server's code, message and field messages. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string> = {},
  ) {
    super(message);
  }
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

interface RequestOptions {
  body?: unknown;
  query?: Record<string, string | number | boolean | undefined>;
  signal?: AbortSignal;
  /** Skip the redirect to sign-in on 401 (used by the session probe itself). */
  allowUnauthenticated?: boolean;
}

function buildUrl(path: string, query?: RequestOptions['query']) {
  const url = new URL(`/api${path}`, window.location.origin);
  for (const [k, v] of Object.entries(query ?? {})) if (v !== undefined) url.searchParams.set(k, String(v));
  return url.pathname + url.search;
}

/** Same-origin JSON calls with the session cookie and the CSRF header on every state-changing call. */
export async function apiRequest<T>(method: Method, path: string, opts: RequestOptions = {}): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  let body: BodyInit | undefined;
  if (method !== 'GET') headers['X-Requested-With'] = 'blockpost';
  if (opts.body instanceof FormData) body = opts.body;
  else if (opts.body !== undefined) {
    headers['Content-Type'] = 'application/json';
    body = JSON.stringify(opts.body);
  }
  let res: Response;
  try {
    res = await fetch(buildUrl(path, opts.query), { method, headers, body, credentials: 'same-origin', signal: opts.signal });
  } catch (error) {
    if ((error as Error).name === 'AbortError') throw error;
    throw new ApiError(0, 'network', 'Blockpost cannot be reached. Check your connection; nothing you typed is lost.');
  }
  if (res.status === 204) return undefined as T;
  const data: unknown = await res.json().catch(() => null);
  if (!res.ok) {
    const err = (data as ApiErrorBody | null)?.error;
    if (res.status === 401 && !opts.allowUnauthenticated && !window.location.pathname.startsWith(paths.signIn)) {
      const back = window.location.pathname + window.location.search;
      window.location.assign(`${paths.signIn}?next=${encodeURIComponent(back)}`);
    }
    throw new ApiError(res.status, err?.code ?? 'http_error', err?.message ?? `The server answered ${res.status}.`, err?.fields);
  }
  return data as T;
}

export const api = {
  get: <T>(path: string, opts?: RequestOptions) => apiRequest<T>('GET', path, opts),
  post: <T>(path: string, body?: unknown, opts?: RequestOptions) => apiRequest<T>('POST', path, { ...opts, body }),
  patch: <T>(path: string, body?: unknown, opts?: RequestOptions) => apiRequest<T>('PATCH', path, { ...opts, body }),
  put: <T>(path: string, body?: unknown, opts?: RequestOptions) => apiRequest<T>('PUT', path, { ...opts, body }),
  delete: <T>(path: string, opts?: RequestOptions) => apiRequest<T>('DELETE', path, opts),
};

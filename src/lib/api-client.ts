// One fetch wrapper for the JSON API: same-origin cookies, JSON in and out, and a typed error
// that carries the HTTP status and the server's body so the viewer can pick the right page.
import type { ApiError } from '#shared/api';

export class ApiRequestError extends Error {
  constructor(
    readonly status: number,
    readonly body: ApiError | null,
    readonly url: string,
  ) {
    super(body?.message ?? `The server answered ${status} for ${url}`);
    this.name = 'ApiRequestError';
  }
}

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: unknown;
  signal?: AbortSignal;
}

export function withQuery(path: string, params: Record<string, string | number | undefined | null>): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (value !== undefined && value !== null && value !== '') search.set(key, String(value));
  }
  const text = search.toString();
  return text ? `${path}?${text}` : path;
}

export async function apiRequest<T>(url: string, options: RequestOptions = {}): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (options.body !== undefined) headers['Content-Type'] = 'application/json';
  const method = options.method ?? 'GET';
  const response = await fetch(url, {
    method,
    headers,
    body: options.body === undefined ? undefined : JSON.stringify(options.body),
    credentials: 'same-origin',
    signal: options.signal,
  });
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  let data: unknown = null;
  if (text) {
    try {
      data = JSON.parse(text);
    } catch {
      data = null;
    }
  }
  if (!response.ok) {
    const body = isApiError(data) ? data : null;
    throw new ApiRequestError(response.status, body, url);
  }
  return data as T;
}

function isApiError(x: unknown): x is ApiError {
  return typeof x === 'object' && x !== null && typeof (x as ApiError).error === 'string' && typeof (x as ApiError).message === 'string';
}

export function statusOf(error: unknown): number | null {
  if (error instanceof ApiRequestError) return error.status;
  if (typeof error === 'object' && error !== null && 'status' in error && typeof error.status === 'number') return error.status;
  return null;
}

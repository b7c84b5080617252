/**
 * The one API client. Every call:
 *  - sends the session cookie and the cross-site request header (CSRF_HEADER: CSRF_VALUE);
 *  - turns the error shape `{ error: { code, message, fields? } }` into a typed ApiError;
 *  - on 401 (except from sign-in and the "who am I" probe) sends the user to the sign-in page,
 *    keeping where they were in `?next=`.
 * Responses can be checked against a contract schema from src/contracts.
 */
import type { ZodType, z } from 'zod';
import { apiErrorBody, CSRF_HEADER, CSRF_VALUE } from '../contracts/errors';

export const API_BASE = '/api';

/** A failed API call, with the server's machine-readable code and per-field messages. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields: Record<string, string>;
  /** Extra data some errors carry (for example the current record on a conflict). */
  readonly current: unknown;

  constructor(status: number, code: string, message: string, fields: Record<string, string> = {}, current?: unknown) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.fields = fields;
    this.current = current;
  }
}

export const isApiError = (e: unknown): e is ApiError => e instanceof ApiError;

/** Paths whose 401 is an answer, not an expired session. */
const NO_REDIRECT_ON_401 = ['/auth/login', '/auth/me'];

type UnauthorizedHandler = (next: string) => void;
let onUnauthorized: UnauthorizedHandler = (next) => {
  window.location.assign(signInHref(next));
};

/** The app installs a handler that clears the session cache and navigates with the router. */
export function setUnauthorizedHandler(handler: UnauthorizedHandler) {
  onUnauthorized = handler;
}

/** Where the user is now, as a `next` value. */
export function currentLocation(): string {
  return `${window.location.pathname}${window.location.search}${window.location.hash}`;
}

/** Only same-site paths are followed after sign-in (no `//other.site` or absolute URLs). */
export function safeNext(next: string | null | undefined): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return '/';
  if (next.startsWith('/sign-in')) return '/';
  return next;
}

export function signInHref(next?: string): string {
  const target = safeNext(next);
  return target === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(target)}`;
}

export type RequestOptions<S extends ZodType | undefined = undefined> = {
  method?: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
  body?: unknown;
  /** A contract schema the answer must match. */
  schema?: S;
  signal?: AbortSignal;
  /** Non-2xx statuses whose body is a normal answer (for example 503 from /health). */
  acceptStatus?: number[];
};

type Result<S> = S extends ZodType ? z.output<S> : unknown;

export async function apiRequest<S extends ZodType | undefined = undefined>(
  path: string,
  opts: RequestOptions<S> = {},
): Promise<Result<S>> {
  const headers: Record<string, string> = { Accept: 'application/json', [CSRF_HEADER]: CSRF_VALUE };
  let body: BodyInit | undefined;
  if (opts.body instanceof FormData) body = opts.body;
  else if (opts.body !== undefined) {
    headers['Content-Type'] = 'application/json';
    body = JSON.stringify(opts.body);
  }

  let res: Response;
  try {
    res = await fetch(`${API_BASE}${path}`, {
      method: opts.method ?? 'GET',
      headers,
      body,
      credentials: 'same-origin',
      signal: opts.signal,
    });
  } catch (e) {
    if ((e as Error)?.name === 'AbortError') throw e;
    throw new ApiError(0, 'network', 'Cannot reach the Spoolwright server. Check the connection and try again.');
  }

  const json = parseJson(res.status === 204 ? '' : await res.text());

  if (!res.ok && !opts.acceptStatus?.includes(res.status)) {
    throw failure(path, res.status, res.statusText, json);
  }
  return checkAnswer(path, res.status, json, opts.schema);
}

function parseJson(text: string): unknown {
  if (!text) return undefined;
  try {
    return JSON.parse(text);
  } catch {
    return undefined;
  }
}

/** The ApiError of a failed answer; a 401 (outside sign-in and "who am I") also starts the sign-in detour. */
function failure(path: string, status: number, statusText: string, json: unknown): ApiError {
  const parsed = apiErrorBody.safeParse(json);
  const err = parsed.success
    ? new ApiError(status, parsed.data.error.code, parsed.data.error.message, parsed.data.error.fields ?? {}, parsed.data.error.current)
    : new ApiError(status, status >= 500 ? 'internal' : 'unknown', `The server answered ${status} ${statusText}`.trim());
  if (status === 401 && !NO_REDIRECT_ON_401.some((p) => path.startsWith(p))) {
    onUnauthorized(currentLocation());
  }
  return err;
}

function checkAnswer<S extends ZodType | undefined>(path: string, status: number, json: unknown, schema: S | undefined): Result<S> {
  if (schema) {
    const checked = schema.safeParse(json);
    if (!checked.success) {
      throw new ApiError(status, 'contract', `The server's answer to ${path} did not match the contract`);
    }
    return checked.data as Result<S>;
  }
  return json as Result<S>;
}

export type UploadOptions<S extends ZodType | undefined = undefined> = {
  schema?: S;
  signal?: AbortSignal;
  /** Called as the request body goes out: bytes sent so far and in all (the multipart total). */
  onProgress?: (sent: number, total: number) => void;
};

/**
 * POSTs a FormData (multipart) body with upload progress. Same headers, errors and 401 handling
 * as apiRequest; it uses XMLHttpRequest only because fetch reports no upload progress.
 */
export function apiUpload<S extends ZodType | undefined = undefined>(path: string, form: FormData, opts: UploadOptions<S> = {}): Promise<Result<S>> {
  return new Promise<Result<S>>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `${API_BASE}${path}`);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.setRequestHeader(CSRF_HEADER, CSRF_VALUE);
    if (opts.onProgress) {
      const report = opts.onProgress;
      xhr.upload.onprogress = (e) => report(e.loaded, e.lengthComputable ? e.total : 0);
    }
    const abort = () => xhr.abort();
    opts.signal?.addEventListener('abort', abort, { once: true });
    xhr.onload = () => {
      opts.signal?.removeEventListener('abort', abort);
      const json = parseJson(xhr.status === 204 ? '' : xhr.responseText);
      if (xhr.status < 200 || xhr.status >= 300) return reject(failure(path, xhr.status, xhr.statusText, json));
      try {
        resolve(checkAnswer(path, xhr.status, json, opts.schema));
      } catch (e) {
        reject(e);
      }
    };
    xhr.onerror = () => reject(new ApiError(0, 'network', 'Cannot reach the Spoolwright server. Check the connection and try again.'));
    xhr.onabort = () => reject(new DOMException('The upload was stopped', 'AbortError'));
    xhr.send(form);
  });
}

/** Shorthands. */
export const api = {
  get: <S extends ZodType | undefined = undefined>(path: string, opts: Omit<RequestOptions<S>, 'method' | 'body'> = {}) =>
    apiRequest(path, { ...opts, method: 'GET' }),
  post: <S extends ZodType | undefined = undefined>(path: string, body?: unknown, opts: Omit<RequestOptions<S>, 'method' | 'body'> = {}) =>
    apiRequest(path, { ...opts, method: 'POST', body }),
  patch: <S extends ZodType | undefined = undefined>(path: string, body?: unknown, opts: Omit<RequestOptions<S>, 'method' | 'body'> = {}) =>
    apiRequest(path, { ...opts, method: 'PATCH', body }),
  delete: <S extends ZodType | undefined = undefined>(path: string, opts: Omit<RequestOptions<S>, 'method' | 'body'> = {}) =>
    apiRequest(path, { ...opts, method: 'DELETE' }),
};

/** A readable sentence for any thrown value. */
export function errorMessage(e: unknown): string {
  if (e instanceof Error) return e.message;
  return 'Something went wrong';
}

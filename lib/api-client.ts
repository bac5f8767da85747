/**
 * The one client for the app's own API (/api/*): JSON in and out, a deadline on every call, and
 * every failure as one ApiError carrying the server's status, code, message and field errors.
 * The offline sync engine keeps its own transport (lib/offline/browser.ts); next-auth's endpoints
 * go through lib/auth-client.ts.
 */
import { readErrorBody, type FieldErrors } from '@/lib/contracts/errors';

export class ApiError extends Error {
  constructor(
    /** The HTTP status; 0 when no answer came (no connection, or the deadline passed). */
    readonly status: number,
    /** The server's code (`invalid-input`, `not-found`…), or `offline`, `timeout`, `bad-response`. */
    readonly code: string,
    message: string,
    readonly fields?: FieldErrors,
  ) {
    super(message);
    this.name = 'ApiError';
  }

  /** No answer at all: the request may or may not have reached the server. */
  get unanswered() {
    return this.status === 0;
  }
}

export const OFFLINE_MESSAGE = 'No connection to Vineward. Nothing was changed; try again when you are back online.';
export const TIMEOUT_MESSAGE = 'Vineward did not answer in time. Try again in a moment.';

/** A phone on one bar of signal can take a while; past this the person is told rather than left waiting. */
export const DEFAULT_DEADLINE_MS = 30_000;

export interface ApiOptions {
  /** The caller's own cancellation (React Query passes one). Aborting it rethrows its AbortError. */
  signal?: AbortSignal;
  deadlineMs?: number;
  headers?: Record<string, string>;
  /** The message when the server's answer carries none (a proxy's HTML page, an empty 502). */
  fallback?: string;
}

export type SendMethod = 'POST' | 'PUT' | 'PATCH' | 'DELETE';

function deadlineSignal(ms: number, signal?: AbortSignal) {
  const timeout = AbortSignal.timeout(ms);
  return signal ? AbortSignal.any([signal, timeout]) : timeout;
}

async function request<T>(method: 'GET' | SendMethod, url: string, body: unknown, options: ApiOptions = {}): Promise<T> {
  const headers: Record<string, string> = { accept: 'application/json', ...options.headers };
  if (body !== undefined) headers['content-type'] = 'application/json';
  let res: Response;
  let text: string;
  try {
    res = await fetch(url, {
      method,
      headers,
      body: body === undefined ? undefined : JSON.stringify(body),
      signal: deadlineSignal(options.deadlineMs ?? DEFAULT_DEADLINE_MS, options.signal),
    });
    text = await res.text();
  } catch (err) {
    if (options.signal?.aborted) throw err;
    if (err instanceof DOMException && err.name === 'TimeoutError') throw new ApiError(0, 'timeout', TIMEOUT_MESSAGE);
    throw new ApiError(0, 'offline', OFFLINE_MESSAGE);
  }
  let data: unknown;
  let parsed = true;
  try {
    data = text ? JSON.parse(text) : undefined;
  } catch {
    parsed = false;
  }
  if (!res.ok) {
    const error = readErrorBody(parsed ? data : null);
    throw new ApiError(res.status, error.code ?? 'http-' + res.status, error.message ?? options.fallback ?? `The server answered ${res.status}.`, error.fields);
  }
  // A 200 that is not JSON is a captive portal or a proxy's page, not our answer.
  if (!parsed)
    throw new ApiError(res.status, 'bad-response', options.fallback ?? 'The answer was not from Vineward. Try again when you have a steady connection.');
  return data as T;
}

/** GETs JSON from our own API. */
export function apiGet<T>(url: string, options?: ApiOptions): Promise<T> {
  return request<T>('GET', url, undefined, options);
}

/** Sends a change (a JSON body when one is given); resolves with the JSON answer, undefined for an empty one. */
export function apiSend<T = unknown>(method: SendMethod, url: string, body?: unknown, options?: ApiOptions): Promise<T> {
  return request<T>(method, url, body, options);
}

/** The message to show for a failed call: the server's, or the caller's words for no connection. */
export function problemText(err: unknown, offline = OFFLINE_MESSAGE) {
  if (err instanceof ApiError) return err.unanswered && err.code === 'offline' ? offline : err.message;
  return offline;
}

/**
 * Sends a file as the request body and reports upload progress (0–1), which fetch cannot do.
 * Resolves with the JSON answer; rejects with ApiError like apiSend.
 */
export function uploadFile<T>(url: string, file: Blob, contentType: string, onProgress: (fraction: number) => void): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.setRequestHeader('content-type', contentType);
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      let data: unknown = null;
      try {
        data = JSON.parse(xhr.responseText);
      } catch {
        // Answered with something other than JSON: reported below by status.
      }
      if (xhr.status >= 200 && xhr.status < 300) return resolve(data as T);
      const error = readErrorBody(data);
      reject(new ApiError(xhr.status, error.code ?? 'http-' + xhr.status, error.message ?? `The server answered ${xhr.status}; try again.`, error.fields));
    };
    xhr.onerror = () => reject(new ApiError(0, 'offline', 'The upload did not reach Vineward. Nothing was changed; try again.'));
    xhr.send(file);
  });
}

import 'server-only';

/** Every error a person can get back, with its HTTP status. */
export const ERROR_STATUS = {
  unauthenticated: 401,
  forbidden: 403,
  // A change sent from another site's page (lib/server/boundary.ts).
  'cross-site': 403,
  'not-found': 404,
  conflict: 409,
  gone: 410,
  'invalid-input': 422,
  'payload-too-large': 413,
  'unsupported-media-type': 415,
  'rate-limited': 429,
  'bad-request': 400,
  unavailable: 503,
} as const;

export type ErrorCode = keyof typeof ERROR_STATUS;

export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly fields?: Record<string, string[]>,
    readonly headers?: Record<string, string>,
  ) {
    super(message);
    this.name = 'AppError';
  }

  get status() {
    return ERROR_STATUS[this.code];
  }
}

export function errorBody(code: string, message: string, fields?: Record<string, string[]>) {
  return { error: fields ? { code, message, fields } : { code, message } };
}

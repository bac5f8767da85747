/** The one error shape every route answers with (lib/server/http.ts writes it, lib/api-client.ts reads it). */
export type FieldErrors = Record<string, string[]>;

export interface ErrorBody {
  error: { code: string; message: string; fields?: FieldErrors };
}

/** Reads an error body defensively: an answer from a proxy or a crash may be anything. */
export function readErrorBody(data: unknown): Partial<ErrorBody['error']> {
  const error = (data as { error?: unknown } | null)?.error;
  if (!error || typeof error !== 'object') return {};
  const { code, message, fields } = error as Record<string, unknown>;
  return {
    code: typeof code === 'string' ? code : undefined,
    message: typeof message === 'string' ? message : undefined,
    fields: fields && typeof fields === 'object' ? (fields as FieldErrors) : undefined,
  };
}

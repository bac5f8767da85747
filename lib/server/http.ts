import 'server-only';
import { NextResponse, type NextRequest } from 'next/server';
import { z, type ZodType } from 'zod';
import type { Permission } from '@/lib/roles';
import { requireMember, type Member } from '@/lib/server/auth/guard';
import { AppError, errorBody } from '@/lib/server/errors';
import { asUnavailable } from '@/lib/server/unavailable';

type Params = Record<string, string | string[]>;

interface Context<B> {
  req: NextRequest;
  params: Params;
  body: B;
}

const MAX_JSON_BYTES = 1_000_000;

export function fieldErrors(error: z.ZodError) {
  const fields: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.join('.') || '_';
    (fields[key] ??= []).push(issue.message);
  }
  return fields;
}

export function errorResponse(err: unknown): NextResponse {
  if (err instanceof AppError) {
    return NextResponse.json(errorBody(err.code, err.message, err.fields), { status: err.status, headers: err.headers });
  }
  if (err instanceof z.ZodError) {
    return NextResponse.json(errorBody('invalid-input', 'Some fields are not valid.', fieldErrors(err)), { status: 422 });
  }
  // A database or mail server that is down or slow: 503 with Retry-After, not 500.
  const unavailable = asUnavailable(err);
  if (unavailable) return errorResponse(unavailable);
  console.error(err);
  return NextResponse.json(errorBody('internal', 'Something went wrong on our side. Nothing you sent was lost; try again.'), {
    status: 500,
  });
}

async function readBody<B>(req: NextRequest, schema: ZodType<B> | undefined, maxBytes: number): Promise<B> {
  if (!schema) return undefined as B;
  const length = Number(req.headers.get('content-length') ?? 0);
  if (length > maxBytes) throw new AppError('payload-too-large', `The request is larger than ${maxBytes} bytes.`);
  const text = await req.text();
  if (text.length > maxBytes) throw new AppError('payload-too-large', `The request is larger than ${maxBytes} bytes.`);
  let json: unknown;
  try {
    json = text ? JSON.parse(text) : {};
  } catch {
    throw new AppError('bad-request', 'The request body is not valid JSON.');
  }
  return schema.parse(json);
}

/**
 * Wraps a route handler: checks the session, organisation and role, parses the JSON body with
 * zod, and turns every error into `{ error: { code, message, fields? } }` with its status.
 */
export function memberRoute<B = undefined>(
  options: { permission?: Permission; body?: ZodType<B>; maxBytes?: number },
  fn: (member: Member, ctx: Context<B>) => Promise<unknown>,
) {
  return async (req: NextRequest, segment: { params: Promise<Params> }) => {
    try {
      const member = await requireMember(options.permission ?? 'read');
      const body = await readBody(req, options.body, options.maxBytes ?? MAX_JSON_BYTES);
      const result = await fn(member, { req, params: await segment.params, body });
      return result instanceof Response ? result : NextResponse.json(result);
    } catch (err) {
      return errorResponse(err);
    }
  };
}

/** For the few routes that anyone may call (health, invitation acceptance). */
export function publicRoute<B = undefined>(
  options: { body?: ZodType<B>; maxBytes?: number },
  fn: (ctx: Context<B>) => Promise<unknown>,
) {
  return async (req: NextRequest, segment: { params: Promise<Params> }) => {
    try {
      const body = await readBody(req, options.body, options.maxBytes ?? MAX_JSON_BYTES);
      const result = await fn({ req, params: await segment.params, body });
      return result instanceof Response ? result : NextResponse.json(result);
    } catch (err) {
      return errorResponse(err);
    }
  };
}

export type ActionState = { ok: boolean; message?: string; fields?: Record<string, string[]> };

/** The server-action twin of memberRoute: same guard, same schema, errors as form state. */
export function memberAction<B>(
  permission: Permission,
  schema: ZodType<B>,
  fn: (member: Member, input: B) => Promise<string | void>,
) {
  return async (_prev: ActionState, form: FormData): Promise<ActionState> => {
    try {
      const member = await requireMember(permission);
      const parsed = schema.safeParse(Object.fromEntries(form));
      if (!parsed.success) return { ok: false, message: 'Some fields are not valid.', fields: fieldErrors(parsed.error) };
      const message = await fn(member, parsed.data);
      return { ok: true, message: message ?? undefined };
    } catch (err) {
      if (err instanceof AppError) return { ok: false, message: err.message, fields: err.fields };
      console.error(err);
      return { ok: false, message: 'Something went wrong on our side; try again.' };
    }
  };
}

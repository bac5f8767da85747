import 'server-only';
import { NextResponse, type NextRequest } from 'next/server';
import { z, type ZodType } from 'zod';
import type { ActionState, Contract, RawAnswer, Sendable } from '@/lib/contracts/http';
import type { Permission } from '@/lib/roles';
import { requireMember, type Member } from '@/lib/server/auth/guard';
import { assertContentType, assertSameOrigin, isMutation, JSON_TYPE, readLimited, readLimitedText } from '@/lib/server/boundary';
import { AppError, errorBody } from '@/lib/server/errors';
import { asUnavailable } from '@/lib/server/unavailable';

type Params = Record<string, string | string[]>;

interface Context<B, P, Q> {
  req: NextRequest;
  params: P;
  query: Q;
  body: B;
}

interface RouteOptions<B, P, Q> {
  /** The JSON body's schema; without one the route takes no body (or reads its own, see `accepts`). */
  body?: ZodType<B>;
  /** Media types of a body the handler reads itself (with readLimited); JSON otherwise. */
  accepts?: readonly string[];
  maxBytes?: number;
  /** Path parameters: every id is a UUID (lib/validation/params.ts), so a bad one is 422, never 500. */
  params?: ZodType<P>;
  /** The query string as one flat object (the last value of a repeated key). */
  query?: ZodType<Q>;
}

/**
 * What a handler may return for the contract its options name: for `responds<R>()`, R itself (Dates
 * where R has ISO text) or NextResponse.json of it; for `answersRaw`, any Response it builds.
 */
type Answer<R> = [R] extends [RawAnswer] ? Response : Sendable<R> | NextResponse<Sendable<R>>;

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

async function readBody<B>(req: NextRequest, options: RouteOptions<B, unknown, unknown>): Promise<B> {
  if (!options.body) {
    // A route that reads no body takes none: a byte of one is refused rather than ignored.
    if (!options.accepts) await readLimited(req, 0, () => new AppError('payload-too-large', 'This request takes no body.'));
    return undefined as B;
  }
  const text = await readLimitedText(req, options.maxBytes ?? MAX_JSON_BYTES);
  let json: unknown;
  try {
    json = text ? JSON.parse(text) : {};
  } catch {
    throw new AppError('bad-request', 'The request body is not valid JSON.');
  }
  return options.body.parse(json);
}

/** The checks every route makes before its handler runs, in order: cheapest and most telling first. */
async function prepare<B, P, Q>(
  req: NextRequest,
  segment: { params: Promise<Params> },
  options: RouteOptions<B, P, Q>,
  guard: () => Promise<unknown>,
  fromBrowserPages: boolean,
) {
  const mutation = isMutation(req);
  if (mutation) {
    if (fromBrowserPages) assertSameOrigin(req);
    assertContentType(req, options.accepts ?? [JSON_TYPE], !!options.body);
  }
  await guard();
  const rawParams = await segment.params;
  const params = (options.params ? options.params.parse(rawParams) : rawParams) as P;
  const query = (options.query ? options.query.parse(Object.fromEntries(req.nextUrl.searchParams)) : undefined) as Q;
  const body = mutation ? await readBody(req, options) : (undefined as B);
  return { req, params, query, body };
}

/**
 * Wraps a route handler: refuses changes sent from other sites and bodies of the wrong type, checks
 * the session, organisation and role, parses path parameters, query and JSON body with zod (the body
 * read with a byte limit), and turns every error into `{ error: { code, message, fields? } }`.
 */
export function memberRoute<B = undefined, P = Params, Q = undefined, R = never>(
  options: RouteOptions<B, P, Q> & { permission?: Permission; response: Contract<R> },
  fn: (member: Member, ctx: Context<B, P, Q>) => Promise<Answer<NoInfer<R>>>,
) {
  return async (req: NextRequest, segment: { params: Promise<Params> }) => {
    try {
      let member: Member | undefined;
      const ctx = await prepare(req, segment, options, async () => (member = await requireMember(options.permission ?? 'read')), true);
      const result = await fn(member!, ctx);
      return result instanceof Response ? result : NextResponse.json(result);
    } catch (err) {
      return errorResponse(err);
    }
  };
}

/**
 * For the few routes that anyone may call (health, invitation acceptance, unsubscribe). They carry
 * no session, so a foreign page gains nothing by sending them; bodies are bounded all the same.
 */
export function publicRoute<B = undefined, P = Params, Q = undefined, R = never>(
  options: RouteOptions<B, P, Q> & { response: Contract<R> },
  fn: (ctx: Context<B, P, Q>) => Promise<Answer<NoInfer<R>>>,
) {
  return async (req: NextRequest, segment: { params: Promise<Params> }) => {
    try {
      const ctx = await prepare(req, segment, options, async () => undefined, false);
      const result = await fn(ctx);
      return result instanceof Response ? result : NextResponse.json(result);
    } catch (err) {
      return errorResponse(err);
    }
  };
}

export type { ActionState };

/** The server-action twin of memberRoute: same guard, same schema, errors as form state. */
export function memberAction<B>(permission: Permission, schema: ZodType<B>, fn: (member: Member, input: B) => Promise<string | void>) {
  return async (_prev: ActionState, form: FormData): Promise<ActionState> => {
    try {
      const member = await requireMember(permission);
      const parsed = schema.safeParse(Object.fromEntries(form));
      if (!parsed.success) return { ok: false, message: 'Some fields are not valid.', fields: fieldErrors(parsed.error) };
      const message = await fn(member, parsed.data);
      return { ok: true, message: message ?? undefined };
    } catch (err) {
      const known = err instanceof AppError ? err : asUnavailable(err);
      if (known) return { ok: false, message: known.message, fields: known.fields };
      console.error(err);
      return { ok: false, message: 'Something went wrong on our side; try again.' };
    }
  };
}

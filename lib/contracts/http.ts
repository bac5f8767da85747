/**
 * How a route names what it answers: `memberRoute({ response: responds<FlagList>() }, fn)` makes a
 * handler that returns another shape fail to compile, and the client reads the same type. Every
 * route names one: a JSON contract, or `answersRaw` for a body it builds itself.
 */
export interface Contract<R> {
  /** Never set: carries R for the compiler, both ways, so a wider or narrower answer is refused. */
  readonly __response?: (r: R) => R;
}

export const responds = <R>(): Contract<R> => ({});

declare const raw: unique symbol;
/** What a route answers when it is not JSON: a CSV, a photo, a redirect, an empty 204. */
export interface RawAnswer {
  readonly [raw]: true;
}

/** The contract of a route that builds its own Response (CSV, image, redirect, 204). */
export const answersRaw = responds<RawAnswer>();

/**
 * What the server may hand over for a wire type: a Date where the wire has its ISO string, since
 * JSON.stringify writes one as the other.
 */
export type Sendable<T> = T extends string
  ? T | Date
  : T extends readonly (infer U)[]
    ? readonly Sendable<U>[]
    : T extends object
      ? { [K in keyof T]: Sendable<T[K]> }
      : T;

/** What a server action gives back to `useActionState`. */
export type ActionState = { ok: boolean; message?: string; fields?: Record<string, string[]> };

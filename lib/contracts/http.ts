/**
 * How a route names what it answers: `memberRoute({ response: responds<FlagList>() }, fn)` makes a
 * handler that returns another shape fail to compile, and the client reads the same type.
 */
export interface Contract<R> {
  /** Never set: carries R for the compiler, both ways, so a wider or narrower answer is refused. */
  readonly __response?: (r: R) => R;
}

export const responds = <R>(): Contract<R> => ({});

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

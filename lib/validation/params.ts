/**
 * Path and query parameters, parsed by memberRoute/publicRoute (`params`, `query`): an id that is
 * not a UUID is answered 422 with the parameter named, before any query runs.
 */
import { z } from 'zod';

export const uuidOf = (what: string) => z.uuid(`Must be the id of ${what}`);

/** `[id]` routes; other segments (row and vine numbers) pass through as text for the handler. */
export const idParams = (what: string) => z.object({ id: uuidOf(what) });
export const blockIdParams = z.object({ blockId: uuidOf('a block') });
export const blockRowParams = z.object({ id: uuidOf('a block'), row: z.string() });
export const blockSlotParams = z.object({ id: uuidOf('a block'), row: z.string(), position: z.string() });
export const positionParams = z.object({ positionId: uuidOf('a vine position') });

export const blockQuery = z.object({ blockId: uuidOf('a block').optional() });

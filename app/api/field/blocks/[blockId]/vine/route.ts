import { z } from 'zod';
import type { FieldVineHistory } from '@/lib/contracts/field';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { fieldVineHistory } from '@/lib/server/services/field';
import { blockIdParams } from '@/lib/validation/params';

const query = z.object({ row: z.coerce.number().int().min(1), position: z.coerce.number().int().min(1) });

export const GET = memberRoute({ params: blockIdParams, query, response: responds<FieldVineHistory>() }, async (member, { params, query: { row, position } }) =>
  fieldVineHistory(member, params.blockId, row, position),
);

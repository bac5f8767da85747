import type { DoneRows } from '@/lib/contracts/field';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { loadDoneRows } from '@/lib/server/services/row-work';
import { blockIdParams } from '@/lib/validation/params';

/** Rows done end to end this season, per pass: the phone keeps the last copy for use without signal. */
export const GET = memberRoute({ params: blockIdParams, response: responds<DoneRows>() }, async (member, { params }) => loadDoneRows(member, params.blockId));

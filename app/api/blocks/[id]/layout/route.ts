import { readLimitedText } from '@/lib/server/boundary';
import { AppError } from '@/lib/server/errors';
import type { LayoutImportAnswer } from '@/lib/contracts/blocks';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { importLayout } from '@/lib/server/services/blocks';
import { LAYOUT_LIMITS } from '@/lib/validation/block';
import { idParams } from '@/lib/validation/params';

const megabytes = (bytes: number) => `${Number((bytes / 1024 / 1024).toFixed(1))} MB`;

function tooLarge(bytes: number, exact: boolean) {
  return new AppError(
    'payload-too-large',
    `The file is ${exact ? '' : 'more than '}${megabytes(bytes)}; a layout file can be at most ${megabytes(LAYOUT_LIMITS.maxCsvBytes)} ` +
      `(${LAYOUT_LIMITS.maxRows.toLocaleString('en-US')} rows of ${LAYOUT_LIMITS.maxVinesPerRow.toLocaleString('en-US')} vines). Nothing was changed.`,
  );
}

/**
 * `POST /api/blocks/:id/layout?mode=preview` checks a layout CSV (the request body, text/csv) and
 * answers what it would change; `?mode=apply` makes the change in one transaction.
 */
export const POST = memberRoute(
  { permission: 'manage-organisation', params: idParams('a block'), accepts: ['text/csv'], response: responds<LayoutImportAnswer>() },
  async (member, { params, req }) => {
    const mode = req.nextUrl.searchParams.get('mode') ?? 'preview';
    if (mode !== 'preview' && mode !== 'apply') throw new AppError('bad-request', 'mode must be preview or apply.');
    // Refused as soon as it passes the limit rather than after buffering it all.
    const csv = await readLimitedText(req, LAYOUT_LIMITS.maxCsvBytes, tooLarge);
    return { summary: await importLayout(member, params.id, csv, mode === 'apply') };
  },
);

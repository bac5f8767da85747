import type { NextRequest } from 'next/server';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { importLayout } from '@/lib/server/services/blocks';
import { LAYOUT_LIMITS } from '@/lib/validation/block';

const megabytes = (bytes: number) => `${Number((bytes / 1024 / 1024).toFixed(1))} MB`;

function tooLarge(bytes: number, exact: boolean) {
  return new AppError(
    'payload-too-large',
    `The file is ${exact ? '' : 'more than '}${megabytes(bytes)}; a layout file can be at most ${megabytes(LAYOUT_LIMITS.maxCsvBytes)} ` +
      `(${LAYOUT_LIMITS.maxRows.toLocaleString('en-US')} rows of ${LAYOUT_LIMITS.maxVinesPerRow.toLocaleString('en-US')} vines). Nothing was changed.`,
  );
}

/** Reads the CSV body, refusing it as soon as it passes the limit rather than after buffering it all. */
async function readCsv(req: NextRequest) {
  const limit = LAYOUT_LIMITS.maxCsvBytes;
  const declared = Number(req.headers.get('content-length') ?? 0);
  if (declared > limit) throw tooLarge(declared, true);
  if (!req.body) return '';
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      await reader.cancel();
      throw tooLarge(total, false);
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks).toString('utf8');
}

/**
 * `POST /api/blocks/:id/layout?mode=preview` checks a layout CSV (the request body, text/csv) and
 * answers what it would change; `?mode=apply` makes the change in one transaction.
 */
export const POST = memberRoute({ permission: 'manage-organisation' }, async (member, { params, req }) => {
  const mode = req.nextUrl.searchParams.get('mode') ?? 'preview';
  if (mode !== 'preview' && mode !== 'apply') throw new AppError('bad-request', 'mode must be preview or apply.');
  const csv = await readCsv(req);
  return { summary: await importLayout(member, String(params.id), csv, mode === 'apply') };
});

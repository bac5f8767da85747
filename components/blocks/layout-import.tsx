'use client';

import { useQueryClient } from '@tanstack/react-query';
import { useRef, useState } from 'react';
import { Button, ButtonLink } from '@/components/ui/button';
import { Notice } from '@/components/ui/field';
import { formatCount } from '@/lib/units';
import { ApiError, uploadFile } from '@/lib/api-client';
import type { LayoutImportAnswer, LayoutSummary } from '@/lib/contracts/blocks';
import { LAYOUT_LIMITS } from '@/lib/validation/block';
import { STATUS_LABEL } from './status';
import { useHydrated } from './use-hydrated';

type Stage =
  | { kind: 'idle' }
  | { kind: 'sending'; apply: boolean; progress: number }
  | { kind: 'preview'; summary: LayoutSummary }
  | { kind: 'applied'; summary: LayoutSummary }
  | { kind: 'error'; message: string; lines: [string, string[]][] };

/** "3, 4, 5, 9" → "3–5, 9": rows changed by a large file stay readable. */
function ranges(rows: number[]) {
  const parts: string[] = [];
  for (let i = 0; i < rows.length; i++) {
    let j = i;
    while (j + 1 < rows.length && rows[j + 1] === rows[j]! + 1) j++;
    parts.push(j > i ? `${rows[i]}–${rows[j]}` : String(rows[i]));
    i = j;
  }
  return parts.join(', ');
}

function Summary({ summary }: { summary: LayoutSummary }) {
  const { rows, slots } = summary;
  const nothing = !rows.added.length && !rows.removed.length && !rows.resized.length && !slots.statusChanged;
  return (
    <div className="flex flex-col gap-2" data-testid="layout-summary">
      {nothing ? (
        <p>The file matches the block as it is: nothing would change.</p>
      ) : (
        <ul className="list-disc pl-5">
          {rows.added.length > 0 && <li>Rows added: {ranges(rows.added)}</li>}
          {rows.removed.length > 0 && <li>Rows removed: {ranges(rows.removed)}</li>}
          {rows.resized.length > 0 && (
            <li>
              Rows resized:{' '}
              {rows.resized
                .slice(0, 8)
                .map((r) => `row ${r.row} ${r.from} → ${r.to}`)
                .join(', ')}
              {rows.resized.length > 8 ? ` and ${rows.resized.length - 8} more` : ''}
            </li>
          )}
          <li>
            Planting slots: {formatCount(slots.before)} → {formatCount(slots.after)} ({formatCount(slots.added)} added, {formatCount(slots.removed)} removed)
          </li>
          {summary.statusChanges.map((c) => (
            <li key={`${c.from}-${c.to}`}>
              {formatCount(c.count)} {c.count === 1 ? 'vine' : 'vines'} {c.from} → {c.to}
            </li>
          ))}
        </ul>
      )}
      <p>
        After {summary.applied ? 'the import' : 'importing'}: {formatCount(slots.after)} slots —{' '}
        {(Object.keys(STATUS_LABEL) as (keyof typeof STATUS_LABEL)[])
          .map((s) => `${formatCount(summary.after[s])} ${STATUS_LABEL[s].toLowerCase()}`)
          .join(', ')}
        .
      </p>
    </div>
  );
}

/** Choose a layout CSV, see what it would change, then apply it. Nothing changes before "Apply". */
export function LayoutImport({ blockId, blockName, firstRow }: { blockId: string; blockName: string; firstRow: number }) {
  const queryClient = useQueryClient();
  const hydrated = useHydrated();
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [stage, setStage] = useState<Stage>({ kind: 'idle' });

  async function send(chosen: File, apply: boolean) {
    if (chosen.size > LAYOUT_LIMITS.maxCsvBytes) {
      // The server refuses it too; saying so here saves uploading megabytes over a farm connection.
      setStage({
        kind: 'error',
        message: `The file is ${(chosen.size / 1024 / 1024).toFixed(1)} MB; a layout file can be at most ${LAYOUT_LIMITS.maxCsvBytes / 1024 / 1024} MB. Nothing was changed.`,
        lines: [],
      });
      return;
    }
    setStage({ kind: 'sending', apply, progress: 0 });
    try {
      const { summary } = await uploadFile<LayoutImportAnswer>(
        `/api/blocks/${blockId}/layout?mode=${apply ? 'apply' : 'preview'}`,
        chosen,
        'text/csv',
        (progress) => setStage({ kind: 'sending', apply, progress }),
      );
      if (apply) {
        await queryClient.invalidateQueries({ queryKey: ['block', blockId] });
        await queryClient.invalidateQueries({ queryKey: ['blocks'] });
      }
      setStage({ kind: apply ? 'applied' : 'preview', summary });
    } catch (err) {
      const fields = err instanceof ApiError && err.fields ? Object.entries(err.fields) : [];
      setStage({ kind: 'error', message: (err as Error).message, lines: fields });
    }
  }

  return (
    <div className="flex flex-col gap-5">
      <section className="rounded-2xl border-2 border-line bg-panel p-4">
        <h2 className="text-xl font-bold">The file</h2>
        <p className="mt-1">A CSV file with one line per row of {blockName}, after this header:</p>
        <pre className="mt-2 overflow-x-auto rounded-lg bg-ground p-3 font-mono text-sm" tabIndex={0} aria-label="Example file">
          {`row,vines,statuses\n${firstRow},60,PPPPMPPPPPPPPPPPDPPPPPPPPRPPPP…\n${firstRow + 1},58,`}
        </pre>
        <ul className="mt-2 list-disc pl-5">
          <li>
            <strong>row</strong>: the row number. Rows run from the block’s first row ({firstRow}) without gaps, in any order; rows left out are removed.
          </li>
          <li>
            <strong>vines</strong>: how many planting slots the row has. Slots past the new count are removed; new ones are planted.
          </li>
          <li>
            <strong>statuses</strong> (optional, the column may be left out): one letter per vine from vine 1 — <strong>P</strong> planted, <strong>M</strong>{' '}
            missing, <strong>D</strong> dead, <strong>R</strong> replant (a new replant takes this year). Left empty, the row keeps its statuses.
          </li>
          <li>
            At most {LAYOUT_LIMITS.maxCsvBytes / 1024 / 1024} MB, {formatCount(LAYOUT_LIMITS.maxRows)} rows and {formatCount(LAYOUT_LIMITS.maxVinesPerRow)}{' '}
            vines per row. Slots with observations are never removed. The block’s own export uses this format.
          </li>
        </ul>
      </section>

      <div className="flex flex-col gap-2">
        <label htmlFor="layout-file" className="font-bold">
          Layout CSV file
        </label>
        <input
          ref={input}
          id="layout-file"
          type="file"
          accept=".csv,text/csv"
          disabled={!hydrated}
          className="min-h-touch rounded-lg border-2 border-dashed border-rootstock bg-panel p-3 file:mr-3 file:min-h-touch file:rounded-lg file:border-0 file:bg-rootstock file:px-4 file:font-bold file:text-white"
          onChange={(e) => {
            const chosen = e.target.files?.[0] ?? null;
            setFile(chosen);
            if (chosen) void send(chosen, false);
            else setStage({ kind: 'idle' });
          }}
        />
      </div>

      {stage.kind === 'sending' && (
        <div className="flex flex-col gap-1" aria-live="polite">
          <label htmlFor="layout-progress" className="font-bold">
            {stage.progress < 1 ? (stage.apply ? 'Uploading…' : 'Reading the file…') : stage.apply ? 'Applying the layout…' : 'Checking every line…'}
          </label>
          <progress id="layout-progress" max={1} value={stage.progress < 1 ? stage.progress : undefined} className="h-4 w-full accent-rootstock" />
        </div>
      )}

      {stage.kind === 'preview' && file && (
        <section className="flex flex-col gap-3 rounded-2xl border-2 border-rootstock bg-panel p-4" aria-labelledby="preview-heading">
          <h2 id="preview-heading" className="text-xl font-bold">
            What {file.name} would change
          </h2>
          <Summary summary={stage.summary} />
          <div className="flex flex-wrap gap-3">
            <Button size="large" onClick={() => void send(file, true)}>
              Apply this layout
            </Button>
            <Button
              size="large"
              variant="secondary"
              onClick={() => {
                setFile(null);
                setStage({ kind: 'idle' });
                if (input.current) input.current.value = '';
              }}
            >
              Choose another file
            </Button>
          </div>
        </section>
      )}

      {stage.kind === 'applied' && (
        <Notice tone="ok">
          <p className="font-bold">Layout imported.</p>
          <Summary summary={stage.summary} />
          <ButtonLink href={`/blocks/${blockId}`} className="mt-2">
            Back to {blockName}
          </ButtonLink>
        </Notice>
      )}

      {stage.kind === 'error' && (
        <Notice tone="error">
          <p className="font-bold">{stage.message}</p>
          {stage.lines.length > 1 && (
            <ul className="mt-2 list-disc pl-5" aria-label="Problems by line">
              {stage.lines.map(([where, messages]) => messages.map((m) => <li key={`${where}-${m}`}>{m}</li>))}
            </ul>
          )}
        </Notice>
      )}
    </div>
  );
}

'use client';

import { useQuery } from '@tanstack/react-query';
import Link from 'next/link';
import { useState } from 'react';
import { CommentThread } from '@/components/comments/comment-thread';
import { CommentToggle } from '@/components/comments/comment-toggle';
import { CellSwatch } from '@/components/grid/cell-swatch';
import { PhotoViewer, type ViewerPhoto } from '@/components/photos/photo-viewer';
import { Button, ButtonLink } from '@/components/ui/button';
import { Notice } from '@/components/ui/field';
import { apiGet } from '@/lib/api-client';
import type { PanelObservation, VinePanelResponse } from '@/lib/contracts/grid';
import { encodeCell } from '@/lib/grid/cells';
import { formatDay, kindLabel, SEVERITY_LABELS, SLOT_LABELS, vineAddress } from '@/lib/grid/labels';
import { formatNumber } from '@/lib/reports/format';
import { formatLengthMm } from '@/lib/units';
import { kgToLb, PLAN_NOTE_CODES, type Severity } from '@/lib/viticulture';

interface VinePanelProps {
  blockId: string;
  row: number;
  position: number;
  onClose: () => void;
}

const formatWeightKg = (kg: number, units: 'metric' | 'imperial') => (units === 'imperial' ? `${kgToLb(kg).toFixed(1)} lb` : `${kg} kg`);
const planNote = (note: string) => (PLAN_NOTE_CODES.some((c) => note.startsWith(`${c}:`)) ? note.slice(note.indexOf(':') + 1).trim() : note);

function photoFor(o: PanelObservation, photoId: string, address: string): ViewerPhoto {
  return {
    id: photoId,
    fullUrl: `/api/photos/${photoId}?size=full`,
    alt: `${kindLabel(o.kind)}, ${address}, ${formatDay(o.observedAt)}`,
    details: (
      <>
        <h2 className="text-xl font-bold">{kindLabel(o.kind)}</h2>
        <p>{address}</p>
        <p>
          {SEVERITY_LABELS[o.severity as Severity]} · {o.status} · {formatDay(o.observedAt)}
        </p>
        {o.summary && <p>{o.summary}</p>}
        {o.note && <p className="italic">“{o.note}”</p>}
        {o.recordedByName && <p className="text-sm text-bark-soft">Recorded by {o.recordedByName}</p>}
      </>
    ),
  };
}

/** One vine: where it is, what stands there, everything recorded on it, its photos and its pruning plan. */
export function VinePanel({ blockId, row, position, onClose }: VinePanelProps) {
  const [viewing, setViewing] = useState<ViewerPhoto | null>(null);
  const [copied, setCopied] = useState(false);
  const query = useQuery({
    queryKey: ['vine', blockId, row, position],
    queryFn: ({ signal }) => apiGet<VinePanelResponse>(`/api/vines?block=${blockId}&row=${row}&position=${position}`, { signal }),
  });
  const data = query.data;
  const address = vineAddress(row, position, data?.vine.vinesPerPanel);

  async function copyLink(url: string) {
    const absolute = new URL(url, window.location.origin).toString();
    try {
      if (navigator.share) await navigator.share({ title: address, url: absolute });
      else await navigator.clipboard.writeText(absolute);
      setCopied(true);
    } catch {
      // Cancelled share sheets land here; the link itself is on screen to copy by hand.
    }
  }

  return (
    <section aria-labelledby="vine-heading" className="flex flex-col gap-4" data-testid="vine-panel">
      <div className="flex items-start justify-between gap-2">
        <div>
          <p className="text-sm text-bark-soft">{data?.vine.blockName ?? 'Vine'}</p>
          <h2 id="vine-heading" className="text-2xl font-extrabold">
            {address}
          </h2>
          {data?.vine.vinesPerPanel ? <p className="text-sm text-bark-soft">Slot {position} from the row’s origin end</p> : null}
        </div>
        <Button type="button" variant="secondary" onClick={onClose} aria-label="Close the vine panel">
          Close
        </Button>
      </div>

      {query.isPending && <p role="status">Loading the vine…</p>}
      {query.isError && (
        <Notice tone="error">
          {query.error.message}{' '}
          <button type="button" className="font-bold underline" onClick={() => query.refetch()}>
            Try again
          </button>
        </Notice>
      )}

      {data && (
        <>
          <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
            <dt className="font-bold">Slot</dt>
            <dd>
              {SLOT_LABELS[data.vine.status]}
              {data.vine.replantYear ? ` (${data.vine.replantYear})` : ''}
            </dd>
            {data.plantings.length > 0 && (
              <>
                <dt className="font-bold">Planted</dt>
                <dd>
                  {data.plantings
                    .map(
                      (p) =>
                        `${p.plantingYear ?? '?'}${p.clone ? ` ${p.clone}` : ''}${p.rootstock ? ` on ${p.rootstock}` : ''}${p.removedYear ? ` (removed ${p.removedYear}${p.removalReason ? `: ${p.removalReason}` : ''})` : ''}`,
                    )
                    .join('; ')}
                </dd>
              </>
            )}
          </dl>

          <div className="flex flex-col gap-2 rounded-lg bg-ground p-3">
            <ButtonLink href={data.walkUrl} variant="primary">
              Open this vine in the field app
            </ButtonLink>
            <Button type="button" variant="secondary" onClick={() => copyLink(data.walkUrl)}>
              {copied ? 'Link copied' : 'Share the link with a scout'}
            </Button>
            <p className="break-all text-sm text-bark-soft" data-testid="walk-url">
              {data.walkUrl}
            </p>
          </div>

          <section aria-labelledby="plan-heading">
            <h3 id="plan-heading" className="mb-1 text-lg font-bold">
              Pruning plan
            </h3>
            {data.plan.plan ? (
              <div className="flex flex-col gap-1">
                <p>
                  Keep {data.plan.plan.keep.length} {data.vine.trainingSystem === 'spur' ? 'spurs' : 'canes'} of {data.plan.plan.budsPerCane.join(' + ')} buds
                  {data.plan.plan.renewalSpurs ? `, and ${data.plan.plan.renewalSpurs} renewal spurs of ${data.plan.plan.budsPerRenewalSpur} buds` : ''}:{' '}
                  <strong>{data.plan.plan.totalBuds} buds</strong>
                  {data.plan.plan.targetBuds !== null ? ` for a target of ${data.plan.plan.targetBuds}` : ''}.
                </p>
                <p className="text-sm text-bark-soft">
                  From {data.plan.canes.length} canes measured {data.plan.measuredOn ? formatDay(data.plan.measuredOn) : ''}
                  {data.plan.pruningWeightKg !== null ? ` and ${formatWeightKg(data.plan.pruningWeightKg, data.units)} of prunings` : ''}. Canes kept:{' '}
                  {data.plan.plan.keep.map((i) => `#${i + 1} (${formatLengthMm(data.plan.canes[i]!.baseDiameterMm, data.units)})`).join(', ')}.
                </p>
                {data.plan.budLoad && (
                  <p
                    className={data.plan.budLoad.reading === 'over' ? 'font-bold text-alarm' : 'text-sm'}
                    role={data.plan.budLoad.reading === 'over' ? 'alert' : undefined}
                    data-testid="plan-bud-load"
                  >
                    {data.plan.plan.targetBuds ?? data.plan.plan.totalBuds} buds is {formatNumber(data.plan.budLoad.budsPerFt, 1)} a foot of row; Ohio
                    State&apos;s pruning primer gives 4–6 a foot, {data.plan.budLoad.rangePerVine.min}–{data.plan.budLoad.rangePerVine.max} a vine at this
                    spacing
                    {data.plan.budLoad.reading === 'over' ? ': check the prunings’ weight before pruning to it.' : '.'}
                  </p>
                )}
                {data.plan.plan.notes.length > 0 && (
                  <ul className="list-disc pl-5 text-sm">
                    {data.plan.plan.notes.map((n) => (
                      <li key={n}>{planNote(n)}</li>
                    ))}
                  </ul>
                )}
              </div>
            ) : (
              <p>{data.plan.reason}</p>
            )}
          </section>

          {data.flags.length > 0 && (
            <section aria-labelledby="flags-heading">
              <h3 id="flags-heading" className="mb-1 text-lg font-bold">
                Flags
              </h3>
              <ul className="flex flex-col gap-1">
                {data.flags.map((f) => (
                  <li key={f.id}>
                    {f.text}{' '}
                    <span className="text-sm text-bark-soft">
                      {f.by} · {formatDay(f.at)}
                    </span>
                  </li>
                ))}
              </ul>
            </section>
          )}

          <section aria-labelledby="history-heading">
            <h3 id="history-heading" className="mb-1 text-lg font-bold">
              Observations ({data.observations.length})
            </h3>
            {data.observations.length === 0 && <p>Nothing recorded on this vine yet.</p>}
            <ol className="flex flex-col gap-3">
              {data.observations.map((o) => (
                <li key={o.id} className="rounded-lg border-2 border-line p-3" data-testid="vine-observation">
                  <div className="flex items-center gap-2">
                    <CellSwatch code={encodeCell('planted', o.severity as Severity)} size={22} />
                    <span className="font-bold">{kindLabel(o.kind)}</span>
                    <span className="ml-auto text-sm">{formatDay(o.observedAt)}</span>
                  </div>
                  <p className="text-sm">
                    {SEVERITY_LABELS[o.severity as Severity]} · {o.status === 'open' ? 'open' : `closed${o.closedAt ? ` ${formatDay(o.closedAt)}` : ''}`}
                    {o.recordedByName ? ` · ${o.recordedByName}` : ''}
                  </p>
                  {o.summary && <p>{o.summary}</p>}
                  {o.note && <p className="italic">“{o.note}”</p>}
                  {o.photos.length > 0 && (
                    <ul className="mt-2 flex flex-wrap gap-2" aria-label="Photos">
                      {o.photos.map((p) => (
                        <li key={p.id}>
                          <button
                            type="button"
                            className="block overflow-hidden rounded-lg border-2 border-line"
                            onClick={() => setViewing(photoFor(o, p.id, address))}
                            aria-label={`Open the photo of ${formatDay(p.takenAt)}`}
                          >
                            {/* Thumbnails come through the guarded redirect route. */}
                            <img
                              src={`/api/photos/${p.id}?size=thumb`}
                              alt={`${kindLabel(o.kind)}, ${formatDay(p.takenAt)}`}
                              width={160}
                              height={p.width && p.height ? Math.round((160 * p.height) / p.width) : 120}
                              loading="lazy"
                              className="block h-auto w-40 bg-ground"
                              data-testid="vine-photo"
                            />
                          </button>
                        </li>
                      ))}
                    </ul>
                  )}
                  <CommentToggle subject="observation" subjectId={o.id} label="Comments on this finding" />
                </li>
              ))}
            </ol>
          </section>

          <section aria-labelledby="comments-heading">
            <h3 id="comments-heading" className="mb-1 text-lg font-bold">
              Comments on this vine
            </h3>
            <CommentThread subject="vine" subjectId={data.vine.positionId} label="Comments on this vine" />
          </section>
          <p>
            <Link href={`/photos?block=${blockId}&row=${row}`} className="font-bold text-rootstock underline">
              All photos of row {row}
            </Link>
          </p>
        </>
      )}
      <PhotoViewer photo={viewing} onClose={() => setViewing(null)} />
    </section>
  );
}

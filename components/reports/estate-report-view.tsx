import Link from 'next/link';
import type { EstateReportResponse } from '@/lib/reports/api';
import { formatCount, formatInterval, formatNumber, formatShare, formatWeightKg } from '@/lib/reports/format';
import type { UnitSystem } from '@/lib/units';
import { ChartFrame, CompareChart } from './charts';
import { SOURCES } from '@/lib/reports/block/sources';
import { FigureCard, ReportTable, Section, StockTable, Working } from './figure';
import { ReportToolbar } from './report-toolbar';

/** Every block's season on one page: the estate's incidence, each block's headline figures, totals and the nursery order. */
export function EstateReportView({
  data,
  organisationName,
  units,
  seasonStartMonth,
}: {
  data: EstateReportResponse;
  organisationName: string;
  units: UnitSystem;
  seasonStartMonth: number;
}) {
  const { blocks, kinds, totals, season } = data;
  return (
    <article className="vw-report flex flex-col gap-6" data-testid="estate-report">
      <header className="flex flex-col gap-2">
        <p className="text-bark-soft">{organisationName}</p>
        <h1 className="text-3xl font-extrabold">Season {season}: all blocks</h1>
        <p className="max-w-3xl">
          What the season&apos;s scouting says, block by block. Open a block for its rows, budbreak, canes, bud loads, vine balance, crop and labour estimates
          and the season before it side by side.
        </p>
        <ReportToolbar
          seasons={data.seasons}
          startMonth={seasonStartMonth}
          season={season}
          compare={null}
          exportHref={`/api/reports/observations.csv?season=${season}`}
          links={[{ href: '/reports/export', label: 'About the CSV columns' }]}
        />
      </header>

      <Section id="estate-glance" title="The estate at a glance">
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4 print:grid-cols-4">
          <FigureCard
            testId="estate-scouted"
            label="Vines scouted"
            value={`${formatCount(totals.vinesScouted)} of ${formatCount(totals.standing)}`}
            from="distinct vines with any record in the season, over standing vines"
          />
          <FigureCard
            testId="estate-crop"
            label="Crop estimate"
            value={formatWeightKg(totals.cropKg, units)}
            from={`sum of each block's estimate at its default inputs${totals.cropBlocksWithout ? `; ${totals.cropBlocksWithout} of ${blocks.length} blocks have no budbreak checks or pruning records this season, so no estimate (open the block to enter them)` : ''}`}
          />
          <FigureCard
            label="Pruning labour"
            value={totals.labourHours === null ? '–' : `${formatCount(Math.round(totals.labourHours))} h`}
            from={totals.labourCost === null ? undefined : `cost ${formatNumber(totals.labourCost, 0)}, each block at its training system's minutes per vine`}
          />
          <FigureCard label="Vines to replant" value={formatCount(totals.replant)} from={`tasks: ${totals.openTasks} open, ${totals.doneTasks} done`} />
        </div>
      </Section>

      <Section id="estate-blocks" title="Blocks">
        {blocks.length === 0 ? (
          <p>There are no blocks yet. A manager sets them up under Blocks.</p>
        ) : (
          <ReportTable
            testId="estate-blocks-table"
            caption="Each block's season; the crop and labour use the block's default inputs (open the block to change them)."
          >
            <thead>
              <tr>
                <th scope="col">Block</th>
                <th scope="col">Scouted</th>
                <th scope="col">Weak budbreak</th>
                <th scope="col">Buds kept / target</th>
                <th scope="col">Crop estimate</th>
                <th scope="col">Labour</th>
                <th scope="col">Replant</th>
                <th scope="col">Open tasks</th>
              </tr>
            </thead>
            <tbody>
              {blocks.map((b) => (
                <tr key={b.block.id}>
                  <th scope="row">
                    <Link href={`/reports/${b.block.id}?season=${season}`} className="font-bold">
                      {b.block.name}
                    </Link>
                    <span className="block text-xs font-normal text-bark-soft">
                      {b.block.variety}, {b.block.trainingSystem}
                    </span>
                  </th>
                  <td>{formatCount(b.scouting.vinesScouted)}</td>
                  <td>{b.budbreak ? `${formatShare(b.budbreak.weakShare.estimate)} of ${formatCount(b.budbreak.vinesChecked)}` : '–'}</td>
                  <td>
                    {b.budLoad ? formatNumber(b.budLoad.meanKept.value ?? 0) : '–'} /{' '}
                    {b.budLoad?.meanTarget ? formatNumber(b.budLoad.meanTarget.value ?? 0) : '–'}
                  </td>
                  <td>{b.crop.estimate.kg === null ? 'needs inputs' : formatWeightKg(b.crop.estimate.kg, units)}</td>
                  <td>{b.labour.estimate.hours === null ? '–' : `${formatCount(Math.round(b.labour.estimate.hours))} h`}</td>
                  <td>{formatCount(b.replant.total)}</td>
                  <td>{b.tasks.available ? b.tasks.open : '–'}</td>
                </tr>
              ))}
            </tbody>
          </ReportTable>
        )}
      </Section>

      <Section
        id="estate-incidence"
        title="Incidence by problem and block"
        intro="Vines whose worst record of the kind is at least “watch”, over the vines scouted (missing or dead vines over the slots), with 95% Wilson intervals."
      >
        {kinds.length === 0 ? (
          <p>Nothing was recorded in {season}.</p>
        ) : (
          <>
            <ReportTable
              testId="estate-incidence-table"
              caption="wilsonInterval(vines with the problem, out of, 0.95): the estate as a whole, then block by block."
            >
              <thead>
                <tr>
                  <th scope="col">Problem</th>
                  <th scope="col">Estate</th>
                  {blocks.map((b) => (
                    <th key={b.block.id} scope="col">
                      {b.block.name}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {kinds.map((k) => (
                  <tr key={k.kind}>
                    <th scope="row">{k.label}</th>
                    <td>
                      {formatInterval(k.incidence)}
                      <Working how={k.how} source={SOURCES.wilson} />
                    </td>
                    {blocks.map((b) => {
                      const i = k.byBlock[b.block.id];
                      return <td key={b.block.id}>{i ? `${formatShare(i.estimate)} (${formatShare(i.lower)}–${formatShare(i.upper)})` : '–'}</td>;
                    })}
                  </tr>
                ))}
              </tbody>
            </ReportTable>
            {blocks.length > 0 && (
              <ChartFrame
                title="Weak budbreak and shade canes by block"
                summary={blocks
                  .map((b) => `${b.block.name}: weak budbreak ${b.budbreak ? formatShare(b.budbreak.weakShare.estimate) : 'not checked'}`)
                  .join('; ')}
              >
                <CompareChart
                  data={blocks.map((b) => ({
                    label: b.block.name,
                    before: b.canes ? b.canes.shadeShare.estimate * 100 : null,
                    now: b.budbreak ? b.budbreak.weakShare.estimate * 100 : null,
                  }))}
                  before="Shade-cane share of canes"
                  now="Weak-budbreak share of vines"
                />
              </ChartFrame>
            )}
          </>
        )}
      </Section>

      <Section id="estate-replant" title="Nursery order" intro="Vines to replant across the estate, by clone and rootstock.">
        {data.replantByStock.length === 0 ? (
          <p>No slot needs a new vine.</p>
        ) : (
          <StockTable
            testId="estate-replant-table"
            rows={data.replantByStock}
            caption="Missing and dead slots, vines recorded missing or dead this season, and open replant flags."
          />
        )}
      </Section>
    </article>
  );
}

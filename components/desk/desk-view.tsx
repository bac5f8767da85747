import Link from 'next/link';
import type { ReactNode } from 'react';
import { MarkSeenButton, OpenOrganisationButton } from '@/components/desk/desk-actions';
import { DeskSection, formatMoment, Meter } from '@/components/desk/desk-parts';
import { ButtonLink } from '@/components/ui/button';
import type { Desk, DeskCoverage, DeskFindings } from '@/lib/desk/types';
import { formatDay, kindLabel, SEVERITY_LABELS, vineAddress } from '@/lib/grid/labels';
import { formatShare } from '@/lib/reports/format';
import { formatCount } from '@/lib/units';
import { REASON_LABELS } from '@/lib/validation/flag';

const link = 'font-bold text-rootstock underline';
const plural = (n: number, one: string, many: string) => `${formatCount(n)} ${n === 1 ? one : many}`;

function daysLate(dueOn: string, now: Date) {
  return Math.max(1, Math.round((Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate()) - Date.parse(`${dueOn}T00:00:00Z`)) / 86_400_000));
}

function Reentry({ sprays }: { sprays: Desk['reentry'] }) {
  return (
    <DeskSection
      id="reentry"
      title="Blocks under a re-entry interval now"
      count={new Set(sprays.map((s) => s.blockId)).size}
      unit="blocks"
      tone={sprays.length ? 'alarm' : 'plain'}
    >
      {sprays.length === 0 ? (
        <p>No re-entry interval is in force.</p>
      ) : (
        <>
          <ul className="flex flex-col gap-2">
            {sprays.map((s) => (
              <li key={s.id} data-testid="desk-spray" className="rounded-lg border-2 border-alarm bg-alarm-tint p-3">
                <Link href={`/sprays#spray-${s.id}`} className={link}>
                  {s.blockName}
                </Link>
                <span className="block">
                  {s.product}: keep out until <strong>{formatMoment(s.reentryAt)}</strong> ({s.reiHours} h REI)
                </span>
              </li>
            ))}
          </ul>
          <p className="mt-2 text-bark-soft">The label, the posted signs and local rules decide who may enter and with what protection.</p>
        </>
      )}
    </DeskSection>
  );
}

const SINCE: Record<DeskFindings['basis'], string> = {
  'last-look': 'since your last look',
  'first-look': 'in the week before your first look at this Desk',
  'marked-seen': 'since you marked them all as seen',
  'last-comment': 'since your last comment here',
  'season-start': 'this season (you have not commented here yet)',
};

function Findings({ findings, canMarkSeen }: { findings: DeskFindings; canMarkSeen: boolean }) {
  const vines = findings.blocks.reduce((a, b) => a + b.actNow + b.actThisSeason + b.watch, 0);
  const urgent = findings.blocks.reduce((a, b) => a + b.actNow, 0);
  return (
    <DeskSection
      id="findings"
      title="New findings"
      count={vines}
      unit={urgent ? `vines, ${formatCount(urgent)} to act on now` : 'vines'}
      tone={urgent ? 'alarm' : 'plain'}
      action={canMarkSeen && findings.blocks.length > 0 ? <MarkSeenButton /> : undefined}
    >
      <p className="text-bark-soft">
        Open findings received {SINCE[findings.basis]}, {formatMoment(findings.since)}.
      </p>
      {findings.blocks.length === 0 ? (
        <p className="mt-2">Nothing new.</p>
      ) : (
        <ul className="mt-2 flex flex-col gap-3">
          {findings.blocks.map((b) => (
            <li key={b.blockId} data-testid="desk-finding-block">
              <p>
                <Link href={`/grid/${b.blockId}`} className={link}>
                  {b.blockName}
                </Link>
                :{' '}
                {[b.actNow && `${b.actNow} act now`, b.actThisSeason && `${b.actThisSeason} act this season`, b.watch && `${b.watch} watch`]
                  .filter(Boolean)
                  .join(', ')}
              </p>
              <ul className="mt-1 flex flex-col gap-1">
                {b.vines.map((v) => (
                  <li key={`${v.row}:${v.position}`}>
                    <Link href={`/grid/${b.blockId}?row=${v.row}&position=${v.position}`} className="inline-flex min-h-touch items-center gap-2 underline">
                      <span
                        className={
                          v.severity === 3
                            ? 'shrink-0 whitespace-nowrap rounded bg-alarm px-2 font-bold text-white'
                            : 'shrink-0 whitespace-nowrap rounded border-2 border-bark-faint px-2 font-bold'
                        }
                      >
                        {SEVERITY_LABELS[v.severity]}
                      </span>
                      {vineAddress(v.row, v.position, b.vinesPerPanel)}: {kindLabel(v.kind)}
                    </Link>
                  </li>
                ))}
              </ul>
            </li>
          ))}
        </ul>
      )}
    </DeskSection>
  );
}

function Flags({ blocks }: { blocks: NonNullable<Desk['untaskedFlags']> }) {
  const total = blocks.reduce((a, b) => a + b.flags, 0);
  return (
    <DeskSection id="flags" title="Flags not yet in a task" count={total} unit={total === 1 ? 'flag' : 'flags'} tone={total ? 'attention' : 'plain'}>
      {blocks.length === 0 ? (
        <p>Every open flag is in a task.</p>
      ) : (
        <ul className="flex flex-col gap-2">
          {blocks.map((b) => (
            <li key={b.blockId} data-testid="desk-flag-block">
              <Link href={`/flags?block=${b.blockId}&untasked=1`} className={link}>
                {b.blockName}: {plural(b.flags, 'flag', 'flags')} on {plural(b.vines, 'vine', 'vines')}
              </Link>
              <span className="block text-bark-soft">
                {b.byReason.map((r) => `${REASON_LABELS[r.reason]} ${r.flags}`).join(', ')}; waiting since {formatDay(b.oldestAt)}
              </span>
            </li>
          ))}
        </ul>
      )}
    </DeskSection>
  );
}

function Overdue({ tasks, now }: { tasks: NonNullable<Desk['overdueTasks']>; now: Date }) {
  return (
    <DeskSection
      id="overdue"
      title="Overdue tasks"
      count={tasks.length}
      unit={tasks.length === 1 ? 'task' : 'tasks'}
      tone={tasks.length ? 'attention' : 'plain'}
    >
      {tasks.length === 0 ? (
        <p>No task is past its due date.</p>
      ) : (
        <ul className="flex flex-col gap-2">
          {tasks.map((t) => (
            <li key={t.id} data-testid="desk-task">
              <Link href={`/tasks/${t.id}`} className={link}>
                {t.title}
              </Link>
              <span className="block">
                {t.blockName}, {t.assigneeName ?? 'no one'}: due {formatDay(t.dueOn)}, {plural(daysLate(t.dueOn, now), 'day', 'days')} late;{' '}
                {formatCount(t.vinesDone)} of {plural(t.vines, 'vine', 'vines')} done
              </span>
            </li>
          ))}
        </ul>
      )}
    </DeskSection>
  );
}

function Coverage({ blocks, season, seasonLabel }: { blocks: DeskCoverage[]; season: number; seasonLabel: string }) {
  return (
    <DeskSection id="coverage" title={`Scouting coverage, season ${seasonLabel}`}>
      {blocks.length === 0 ? (
        <p>No blocks yet.</p>
      ) : (
        <ul className="flex flex-col gap-3">
          {blocks.map((b) => (
            <li key={b.blockId} data-testid="desk-coverage">
              <p className="flex flex-wrap justify-between gap-x-3">
                <Link href={`/reports/${b.blockId}?season=${season}`} className={link}>
                  {b.blockName}
                </Link>
                <span>
                  {formatCount(b.scouted)} of {formatCount(b.standing)} standing vines{b.standing ? ` (${formatShare(b.scouted / b.standing)})` : ''}
                </span>
              </p>
              <Meter done={b.scouted} of={b.standing} />
            </li>
          ))}
        </ul>
      )}
    </DeskSection>
  );
}

function Mail({ mail }: { mail: NonNullable<Desk['undeliveredMail']> }) {
  return (
    <DeskSection
      id="mail"
      title="Mail that may not have arrived"
      count={mail.count}
      unit={mail.more ? 'or more' : mail.count === 1 ? 'mail' : 'mails'}
      tone={mail.count ? 'attention' : 'plain'}
    >
      {mail.count === 0 ? (
        <p>Every mail was delivered.</p>
      ) : (
        <Link href="/team" className={link}>
          Send again or dismiss on the Team page
        </Link>
      )}
    </DeskSection>
  );
}

function AdvisorOrganisations({ organisations }: { organisations: NonNullable<Desk['advisorOrganisations']> }) {
  return (
    <DeskSection id="organisations" title="Vineyards you advise">
      <ul className="flex flex-col gap-3">
        {organisations.map((o) => (
          <li key={o.organisationId} data-testid="desk-organisation" className="rounded-lg border-2 border-line p-3">
            <p className="text-lg font-bold" data-testid="desk-organisation-name">
              {o.organisationName}
            </p>
            <p>
              <strong className="text-2xl">{formatCount(o.findings)}</strong> new {o.findings === 1 ? 'finding' : 'findings'}
              {o.actNow ? `, ${formatCount(o.actNow)} act now` : ''}
              {o.blocks ? ` in ${plural(o.blocks, 'block', 'blocks')}` : ''}
            </p>
            <p className="text-bark-soft">
              {o.lastCommentAt ? `Since your last comment, ${formatMoment(o.lastCommentAt)}` : `This season; you have not commented here yet`}
            </p>
            <div className="mt-2">
              {o.current ? (
                <Link href="#findings" className={link}>
                  See them below
                </Link>
              ) : (
                <OpenOrganisationButton organisationId={o.organisationId} name={o.organisationName} />
              )}
            </div>
          </li>
        ))}
      </ul>
    </DeskSection>
  );
}

function Team({ team, manager }: { team: Desk['team']; manager: boolean }) {
  return (
    <DeskSection id="team" title="Team">
      <ul className="grid grid-cols-2 gap-2 sm:grid-cols-4">
        {team.map((t) => (
          <li key={t.role} className="rounded-lg bg-ground p-3">
            <span className="block text-2xl font-extrabold">{t.count}</span>
            <span className="capitalize">{t.role}s</span>
          </li>
        ))}
      </ul>
      {manager && (
        <Link href="/team" className={`mt-3 inline-block ${link}`}>
          Manage the team and invitations
        </Link>
      )}
    </DeskSection>
  );
}

/** For those who walk rows: the way out to the field first, then what bears on today's walk. */
function FieldFirst({ desk }: { desk: Desk }) {
  return (
    <section aria-label="Today in the field" className="flex flex-col gap-3 sm:flex-row">
      <ButtonLink href="/field" size="large">
        Go to the field
      </ButtonLink>
      {desk.myTasks && (
        <ButtonLink href="/field/tasks" size="large" variant="secondary" data-testid="desk-my-tasks">
          My tasks: {desk.myTasks.open} open{desk.myTasks.overdue ? `, ${desk.myTasks.overdue} overdue` : ''}
        </ButtonLink>
      )}
    </section>
  );
}

/**
 * The Desk: for a manager, the morning page of what needs doing, each item linking to where it is
 * handled; for an advisor, the organisations they serve with what is new there; for scouts and
 * crew leads, the field first and the re-entry intervals in force.
 */
export function DeskView({ desk, name, progress, now = new Date() }: { desk: Desk; name: string; progress?: ReactNode; now?: Date }) {
  const manager = desk.role === 'manager';
  const walker = desk.role === 'scout' || desk.role === 'pruner';
  return (
    <div className="flex flex-col gap-6">
      <section>
        <p className="text-bark-soft">{desk.organisationName}</p>
        <h1 className="text-3xl font-extrabold">Desk</h1>
        <p className="mt-1">
          Signed in as {name}, <strong>{desk.role}</strong>.
        </p>
      </section>
      {walker && <FieldFirst desk={desk} />}
      <div className="grid items-start gap-4 lg:grid-cols-2">
        {desk.advisorOrganisations && <AdvisorOrganisations organisations={desk.advisorOrganisations} />}
        <Reentry sprays={desk.reentry} />
        {desk.findings && <Findings findings={desk.findings} canMarkSeen={manager} />}
        {desk.untaskedFlags && <Flags blocks={desk.untaskedFlags} />}
        {desk.overdueTasks && <Overdue tasks={desk.overdueTasks} now={now} />}
        {progress}
        <Coverage blocks={desk.coverage} season={desk.season} seasonLabel={desk.seasonLabel} />
        {desk.undeliveredMail && <Mail mail={desk.undeliveredMail} />}
        <Team team={desk.team} manager={manager} />
      </div>
    </div>
  );
}

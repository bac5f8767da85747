/**
 * The Desk as the server hands it to the page and to GET /api/desk: plain JSON (times as ISO
 * strings). A section is null when the person's role does not get it, and an empty list when there
 * is nothing to do, so the page can tell "nothing to do" from "not yours".
 */
import type { Role } from '@/lib/roles';
import type { FlagReason } from '@/lib/validation/flag';
import type { TaskPriority } from '@/lib/validation/task';

export interface DeskFlagBlock {
  blockId: string;
  blockName: string;
  flags: number;
  vines: number;
  byReason: { reason: FlagReason; flags: number }[];
  oldestAt: string;
}

export interface DeskTask {
  id: string;
  title: string;
  blockId: string;
  blockName: string;
  assigneeName: string | null;
  dueOn: string;
  priority: TaskPriority;
  vines: number;
  vinesDone: number;
}

export interface DeskSpray {
  id: string;
  blockId: string;
  blockName: string;
  product: string;
  appliedAt: string;
  reiHours: number;
  reentryAt: string;
}

export interface DeskFreshVine {
  row: number;
  position: number;
  kind: string;
  severity: 1 | 2 | 3;
  observedAt: string;
}

export interface DeskFindingBlock {
  blockId: string;
  blockName: string;
  vinesPerPanel: number | null;
  /** Vines by their worst new finding. */
  actNow: number;
  actThisSeason: number;
  watch: number;
  findings: number;
  /** The worst vines first, at most the query's `perBlock`. */
  vines: DeskFreshVine[];
}

export interface DeskFindings {
  /** Received after this moment. */
  since: string;
  /** What the window starts at: the person's last look at the Desk, or (advisors) their last comment. */
  basis: 'last-look' | 'first-look' | 'marked-seen' | 'last-comment' | 'season-start';
  blocks: DeskFindingBlock[];
}

export interface DeskCoverage {
  blockId: string;
  blockName: string;
  standing: number;
  scouted: number;
}

export interface DeskAdvisorOrganisation {
  organisationId: string;
  organisationName: string;
  current: boolean;
  lastCommentAt: string | null;
  since: string;
  findings: number;
  actNow: number;
  blocks: number;
}

/**
 * One block's winter work in one pass, as the row-work progress gives it (issue 14, "Row work").
 * The Desk only shows these rows; it never works them out.
 */
export interface DeskProgressRow {
  blockId: string;
  blockName: string;
  pass: string;
  vinesDone: number;
  vineCount: number;
  /** ISO date at the current pace, null while there is no pace yet. */
  projectedFinish: string | null;
}

export interface Desk {
  role: Role;
  organisationName: string;
  season: number;
  seasonLabel: string;
  untaskedFlags: DeskFlagBlock[] | null;
  overdueTasks: DeskTask[] | null;
  /** The person's own open tasks (crew leads). */
  myTasks: { open: number; overdue: number } | null;
  reentry: DeskSpray[];
  findings: DeskFindings | null;
  coverage: DeskCoverage[];
  /** Mail that failed or may not have arrived; `more` when there are more than `count`. */
  undeliveredMail: { count: number; more: boolean } | null;
  advisorOrganisations: DeskAdvisorOrganisation[] | null;
  team: { role: Role; count: number }[];
  /** Filled from the row-work progress once that is wired in; null until then. */
  progress: DeskProgressRow[] | null;
}

/** Tasks and pruning checks: what /api/tasks and /api/pruning-checks answer. Request schemas: lib/validation/task.ts. */
import type { TaskPriority, TaskStatus } from '@/lib/validation/task';

/** One task with its progress. `T` is the time type: Date on the server, ISO text on the wire. */
export interface TaskView<T = string> {
  id: string;
  blockId: string;
  blockName: string;
  vinesPerPanel: number | null;
  title: string;
  note: string;
  assigneeId: string | null;
  assigneeName: string | null;
  assignedAt: T | null;
  dueOn: string | null;
  priority: TaskPriority;
  status: TaskStatus;
  createdBy: string | null;
  createdByName: string | null;
  createdAt: T;
  closedAt: T | null;
  vines: number;
  vinesDone: number;
  overdue: boolean;
}

/** One vine of a task. */
export interface TaskItemView<T = string> {
  taskId: string;
  positionId: string;
  row: number;
  position: number;
  sequence: number;
  status: 'open' | 'done';
  doneAt: T | null;
  doneByName: string | null;
  note: string;
  observationId: string | null;
  /** The flags of the task that cover this vine: why it is in the task. */
  flags: { id: string; reason: string; note: string }[];
}

/** A task with its vines: what `?items=1` answers, and the copy the phone keeps to work offline. */
export type TaskWithItems<T = string> = TaskView<T> & { items: TaskItemView<T>[] };

/** Open tasks per block. */
export interface BlockTaskProgress {
  blockId: string;
  blockName: string;
  openTasks: number;
  overdueTasks: number;
  vines: number;
  vinesDone: number;
}

export interface TaskList {
  tasks: TaskView[] | TaskWithItems[];
  progress: BlockTaskProgress[];
  fetchedAt: string;
}

/** The phone's list (`assignee=me&items=1`): every task carries its vines. */
export interface PhoneTaskList {
  tasks: TaskWithItems[];
  fetchedAt: string;
}

/** GET /api/tasks/:id and PATCH's answer: the task and its vines in walking order. */
export interface TaskDetail<T = string> {
  task: TaskView<T>;
  items: TaskItemView<T>[];
}

/** POST /api/tasks: one task a block. */
export interface CreatedTasks {
  tasks: TaskView[];
}

export interface CheckedVine {
  id: string;
  blockId: string;
  blockName: string;
  row: number;
  position: number;
  observedAt: string;
  checkedByName: string | null;
  prunerId: string;
  budsLeft: number;
  renewalSpurs: number;
  budTarget: number | null;
  /** Against the block's target, in percent of it; negative when too few buds were left. */
  targetDeviationPercent: number | null;
  /** Against the vine's own plan (planVine from its latest cane measurements), when it has one. */
  planBuds: number | null;
  planRenewalSpurs: number | null;
  planDeviationBuds: number | null;
}

export interface PrunerDeviation {
  prunerId: string;
  prunerName: string | null;
  vines: number;
  budsLeftMean: number;
  /** Mean signed deviation from the block target over the checks that had one. */
  targetDeviationMeanPercent: number | null;
  /** Share of those checks further off target than the "fine" band of the pruning-record rule. */
  offTargetShare: number | null;
  renewalSpursMean: number;
  planChecks: number;
  planDeviationMeanBuds: number | null;
  planSpurDeviationMean: number | null;
}

export interface PruningCheckReport {
  finePercent: number;
  pruners: PrunerDeviation[];
  checks: CheckedVine[];
}

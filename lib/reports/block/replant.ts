/** Vines to replant, for the nursery order, and the season's tasks. */
import type { ReplantSlot, TaskRow } from './input';
import type { BlockReportInput } from './input';

export interface ReplantSection {
  total: number;
  byStock: { clone: string; rootstock: string; vines: number }[];
  byRow: { row: number; positions: number[] }[];
  reasons: Record<ReplantSlot['reason'], number>;
  how: string;
}

export interface TaskSection {
  available: boolean;
  open: number;
  done: number;
  cancelled: number;
  list: TaskRow[];
}

export function replantSection(input: BlockReportInput): ReplantSection {
  const reasons: Record<ReplantSlot['reason'], number> = { missing: 0, dead: 0, 'recorded-missing': 0, 'recorded-dead': 0, flagged: 0 };
  const stock = new Map<string, { clone: string; rootstock: string; vines: number }>();
  const rows = new Map<number, number[]>();
  for (const slot of input.replant) {
    reasons[slot.reason]++;
    const clone = slot.clone ?? input.block.clone ?? 'clone not recorded';
    const rootstock = slot.rootstock ?? input.block.rootstock ?? 'rootstock not recorded';
    const key = `${clone}\u0000${rootstock}`;
    const s = stock.get(key) ?? { clone, rootstock, vines: 0 };
    s.vines++;
    stock.set(key, s);
    (rows.get(slot.row) ?? rows.set(slot.row, []).get(slot.row)!).push(slot.position);
  }
  return {
    total: input.replant.length,
    byStock: [...stock.values()].sort((a, b) => b.vines - a.vines || a.clone.localeCompare(b.clone)),
    byRow: [...rows.entries()].sort((a, b) => a[0] - b[0]).map(([row, positions]) => ({ row, positions: positions.sort((a, b) => a - b) })),
    reasons,
    how: "slots marked missing or dead, slots with a missing or dead vine recorded this season and not closed, and open 'replant' flags; clone and rootstock of the vine last planted in the slot, else the block's",
  };
}

export function taskSection(tasks: TaskRow[] | null): TaskSection {
  if (!tasks) return { available: false, open: 0, done: 0, cancelled: 0, list: [] };
  return {
    available: true,
    open: tasks.filter((t) => t.status === 'open').length,
    done: tasks.filter((t) => t.status === 'done').length,
    cancelled: tasks.filter((t) => t.status === 'cancelled').length,
    list: tasks,
  };
}

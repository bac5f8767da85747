/** The estate's season across all blocks: each block's headline figures and the estate totals. */
import { wilsonInterval, type ProportionInterval } from '@/lib/viticulture';
import { baseOf, type BlockReport, type IncidenceBase } from './block-report';
import { shareWorking } from './block/common';

export interface EstateKind {
  kind: string;
  label: string;
  vinesAffected: number;
  base: IncidenceBase;
  outOf: number;
  incidence: ProportionInterval;
  how: string;
  byBlock: Record<string, ProportionInterval | null>;
}

export interface EstateReport {
  season: number;
  blocks: BlockReport[];
  kinds: EstateKind[];
  totals: {
    vinesScouted: number;
    standing: number;
    /** Over the blocks whose estimate has every input; `cropBlocksWithout` says how many have not. */
    cropKg: number;
    cropBlocksWithout: number;
    labourHours: number | null;
    labourCost: number | null;
    replant: number;
    openTasks: number;
    doneTasks: number;
  };
  replantByStock: { clone: string; rootstock: string; vines: number }[];
}

const sum = (values: (number | null)[]) => (values.some((v) => v === null) ? null : values.reduce<number>((a, v) => a + v!, 0));

export function buildEstateReport(season: number, blocks: BlockReport[]): EstateReport {
  const kinds = new Map<string, { kind: string; label: string; affected: number }>();
  for (const b of blocks) {
    for (const k of b.incidence.kinds) {
      const entry = kinds.get(k.kind) ?? { kind: k.kind, label: k.label, affected: 0 };
      entry.affected += k.vinesAffected;
      kinds.set(k.kind, entry);
    }
  }
  const scouted = blocks.reduce((a, b) => a + b.scouting.vinesScouted, 0);
  const slots = blocks.reduce((a, b) => a + b.incidence.slots, 0);
  const stock = new Map<string, { clone: string; rootstock: string; vines: number }>();
  for (const b of blocks) {
    for (const s of b.replant.byStock) {
      const key = `${s.clone}\u0000${s.rootstock}`;
      const entry = stock.get(key) ?? { clone: s.clone, rootstock: s.rootstock, vines: 0 };
      entry.vines += s.vines;
      stock.set(key, entry);
    }
  }
  const estateKinds: EstateKind[] = [];
  for (const k of kinds.values()) {
    const base = baseOf(k.kind);
    const outOf = base === 'slots' ? slots : scouted;
    if (outOf === 0) continue;
    const affected = Math.min(k.affected, outOf);
    estateKinds.push({
      kind: k.kind,
      label: k.label,
      vinesAffected: k.affected,
      base,
      outOf,
      incidence: wilsonInterval(affected, outOf),
      how: shareWorking(affected, outOf, base === 'slots' ? 'slots had it' : 'vines scouted had it', wilsonInterval(affected, outOf)),
      byBlock: Object.fromEntries(
        blocks.map((b) => {
          const found = b.incidence.kinds.find((x) => x.kind === k.kind);
          const blockOutOf = base === 'slots' ? b.incidence.slots : b.scouting.vinesScouted;
          return [b.block.id, found ? found.incidence : blockOutOf ? wilsonInterval(0, blockOutOf) : null];
        }),
      ),
    });
  }
  estateKinds.sort((a, b) => b.incidence.estimate - a.incidence.estimate || a.label.localeCompare(b.label));
  return {
    season,
    blocks,
    kinds: estateKinds,
    totals: {
      vinesScouted: scouted,
      standing: blocks.reduce((a, b) => a + b.slots.standing, 0),
      cropKg: blocks.reduce((a, b) => a + (b.crop.estimate.kg ?? 0), 0),
      cropBlocksWithout: blocks.filter((b) => b.crop.estimate.kg === null).length,
      labourHours: sum(blocks.map((b) => b.labour.estimate.hours)),
      labourCost: sum(blocks.map((b) => b.labour.estimate.cost)),
      replant: blocks.reduce((a, b) => a + b.replant.total, 0),
      openTasks: blocks.reduce((a, b) => a + b.tasks.open, 0),
      doneTasks: blocks.reduce((a, b) => a + b.tasks.done, 0),
    },
    replantByStock: [...stock.values()].sort((a, b) => b.vines - a.vines || a.clone.localeCompare(b.clone)),
  };
}

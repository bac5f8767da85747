import { CellSwatch } from '@/components/grid/cell-swatch';
import { encodeCell, type Level, type Slot } from '@/lib/grid/cells';
import { levelLabel } from '@/lib/grid/labels';

const ENTRIES: { slot: Slot; level: Level; text: string }[] = [
  { slot: 'planted', level: null, text: levelLabel(null) },
  { slot: 'planted', level: 0, text: `${levelLabel(0)} (ring)` },
  { slot: 'planted', level: 1, text: `${levelLabel(1)} (dot)` },
  { slot: 'planted', level: 2, text: `${levelLabel(2)} (bar)` },
  { slot: 'planted', level: 3, text: `${levelLabel(3)} (cross)` },
  { slot: 'missing', level: null, text: 'Missing vine (light, rising hatch)' },
  { slot: 'dead', level: null, text: 'Dead vine (dark, falling hatch)' },
  { slot: 'replant', level: 0, text: 'Replant (green corner)' },
];

export function GridLegend() {
  return (
    <section aria-labelledby="legend-heading" className="rounded-xl border-2 border-line bg-panel p-3">
      <h2 id="legend-heading" className="mb-2 font-bold">
        Legend: worst finding on each vine
      </h2>
      <ul className="grid grid-cols-1 gap-x-4 gap-y-2 text-sm sm:grid-cols-2">
        {ENTRIES.map((e) => (
          <li key={e.text} className="flex items-center gap-2">
            <CellSwatch code={encodeCell(e.slot, e.level)} />
            <span>{e.text}</span>
          </li>
        ))}
      </ul>
    </section>
  );
}

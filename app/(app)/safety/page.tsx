import type { Metadata } from 'next';

export const metadata: Metadata = { title: 'Safety' };

const CAUTIONS: { title: string; points: string[] }[] = [
  {
    title: 'Cutting tools',
    points: [
      'Wear eye protection at all times while pruning: cane ends whip back.',
      'Wear cut-resistant gloves and keep shears and saws sharp; a blunt blade needs force and slips.',
      'Before every cut, look for what is not vine: fingers, wires, posts, ties.',
      'Powered pruners close fully on trigger contact: keep the free hand clear of the blade path.',
      'Rotate tasks and rest your wrists; avoid long reaches above your head.',
    ],
  },
  {
    title: 'Cold, wet and heat',
    points: [
      'Dormant-season days are cold and damp: dress in layers, keep dry, and watch each other for signs of hypothermia.',
      'Cold drains phone batteries fast: keep the phone in an inner pocket and carry a spare battery.',
      'On hot days, drink water often and take shade breaks; heat exhaustion comes on quietly.',
      'Know the emergency plan: where the first-aid kit is, who to call, and how to describe your row and post.',
    ],
  },
  {
    title: 'Tractors, ladders and equipment in rows',
    points: [
      'Stay out of a row while a tractor or sprayer works it; make eye contact with the driver before crossing.',
      'Drivers: use the rollover protection and seat belt where the tractor has them; carry no passengers.',
      'Set ladders on firm, level ground and keep three points of contact.',
    ],
  },
  {
    title: 'Sprayed blocks',
    points: [
      'Never enter a treated block before its restricted-entry interval (REI) has ended. The REI is on the pesticide label.',
      'When two products were applied together, the longer REI applies.',
      'Personal protective equipment does not make early entry allowed; only the label and the rules decide that.',
      'Vineward shows a warning when the last spray recorded for a block is still within its REI — but the manager’s record, the posted signs and the label come first.',
    ],
  },
];

export default function SafetyPage() {
  return (
    <article className="mx-auto flex max-w-2xl flex-col gap-5">
      <h1 className="text-3xl font-extrabold">Cautions for pruning and scouting</h1>
      <p className="rounded-lg border-2 border-cut bg-cut-tint p-3 font-bold">
        These are the usual cautions, not a safety programme. Local rules, the pesticide label, your employer’s safety plan and licensed practice always come
        first.
      </p>
      {CAUTIONS.map((c) => (
        <section key={c.title}>
          <h2 className="mb-2 text-xl font-bold">{c.title}</h2>
          <ul className="list-disc space-y-1 pl-6">
            {c.points.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        </section>
      ))}
      <p className="text-sm text-bark-faint">
        Drawn from extension guidance on vineyard pruning safety, agricultural tractor rules and the US Worker Protection Standard (40 CFR part 170). Follow the
        rules that apply where you work.
      </p>
    </article>
  );
}

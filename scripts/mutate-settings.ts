/**
 * Mutation check of the judgement defaults: each number in DEFAULT_SETTINGS is moved by one step
 * (its SETTINGS_META step, up) and the viticulture unit tests run against it
 * (tests/mutation/vitest.config.ts); a default no test notices is reported as SURVIVED.
 * `tsx scripts/mutate-settings.ts [leaf …]` prints a Markdown table; exit code 1 if any survived.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { DEFAULT_SETTINGS, SETTINGS_META, type SettingKey } from '../lib/viticulture/settings';

function leaves(): { leaf: string; step: number }[] {
  const out: { leaf: string; step: number }[] = [];
  for (const [group, values] of Object.entries(DEFAULT_SETTINGS)) {
    for (const [key, value] of Object.entries(values as Record<string, unknown>)) {
      const step = SETTINGS_META[`${group}.${key}` as SettingKey].step;
      if (typeof value === 'number') out.push({ leaf: `${group}.${key}`, step });
      else
        for (const [sub, v] of Object.entries(value as Record<string, unknown>)) if (typeof v === 'number') out.push({ leaf: `${group}.${key}.${sub}`, step });
    }
  }
  return out;
}

interface JsonReport {
  testResults: { name: string; assertionResults: { fullName: string; status: string }[] }[];
}

const only = process.argv.slice(2);
const dir = mkdtempSync(path.join(tmpdir(), 'vineward-mutation-'));
const rows: string[] = ['| setting | default | step | failing tests (first of) |', '| --- | --- | --- | --- |'];
let survived = 0;
try {
  for (const { leaf, step } of leaves().filter((l) => !only.length || only.includes(l.leaf))) {
    const out = path.join(dir, `${leaf}.json`);
    const run = spawnSync('npx', ['vitest', 'run', '--config', 'tests/mutation/vitest.config.ts', '--reporter=json', `--outputFile=${out}`], {
      env: { ...process.env, MUTATE: leaf, MUTATE_STEP: String(step) },
      encoding: 'utf8',
    });
    let failing: string[] = [];
    try {
      const report = JSON.parse(readFileSync(out, 'utf8')) as JsonReport;
      failing = report.testResults.flatMap((f) =>
        f.assertionResults.filter((a) => a.status === 'failed').map((a) => `${path.basename(f.name)}: ${a.fullName}`),
      );
      // A file that cannot load at all (a default that breaks the checks) fails every test in it.
      if (!failing.length) failing = report.testResults.filter((f) => !f.assertionResults.length).map((f) => `${path.basename(f.name)}: (file failed to load)`);
    } catch {
      if (run.status !== 0) failing = [`(vitest exited ${run.status}) ${run.stderr.slice(-200).replace(/\s+/g, ' ')}`];
    }
    const value = leaf.split('.').reduce<unknown>((at, k) => (at as Record<string, unknown>)[k], DEFAULT_SETTINGS);
    if (!failing.length) survived++;
    rows.push(`| ${leaf} | ${String(value)} | +${step} | ${failing.length ? `${failing.length}: ${failing[0]!.replace(/\|/g, '/')}` : '**SURVIVED**'} |`);
    console.error(rows[rows.length - 1]);
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
console.log(rows.join('\n'));
process.exit(survived ? 1 : 0);

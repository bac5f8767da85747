'use client';

import { usePathname, useRouter, useSearchParams } from 'next/navigation';
import { Button, ButtonLink } from '@/components/ui/button';
import { Select } from '@/components/ui/field';
import { seasonLabel } from '@/lib/reports/season';

interface ReportToolbarProps {
  seasons: number[];
  season: number;
  /** 1–12, the month the organisation's seasons start in: "2025–26" rather than "2026" when not January. */
  startMonth: number;
  /** Null hides the comparison picker (the estate report); 'none' means no comparison. */
  compare: number | 'none' | null;
  exportHref: string;
  links?: { href: string; label: string }[];
}

/** Season and comparison pickers, print and export: screen only, never printed. */
export function ReportToolbar({ seasons, season, startMonth, compare, exportHref, links = [] }: ReportToolbarProps) {
  const router = useRouter();
  const pathname = usePathname();
  const search = useSearchParams();
  const choices = [...new Set([...seasons, season])].sort((a, b) => b - a);

  function go(key: string, value: string) {
    const params = new URLSearchParams(search.toString());
    params.set(key, value);
    if (key === 'season') params.delete('compare');
    router.push(`${pathname}?${params.toString()}`);
  }

  return (
    <div className="flex flex-wrap items-end gap-3 print:hidden" data-testid="report-toolbar">
      <label className="flex flex-col gap-1 font-bold">
        Season
        <Select value={season} onChange={(e) => go('season', e.target.value)} aria-describedby="season-hint">
          {choices.map((s) => (
            <option key={s} value={s}>
              {seasonLabel(s, startMonth)}
            </option>
          ))}
        </Select>
      </label>
      {compare !== null && (
        <label className="flex flex-col gap-1 font-bold">
          Compare with
          <Select value={String(compare)} onChange={(e) => go('compare', e.target.value)}>
            <option value="none">No comparison</option>
            {[...new Set([...choices, season - 1])]
              .filter((s) => s !== season)
              .sort((a, b) => b - a)
              .map((s) => (
                <option key={s} value={s}>
                  {seasonLabel(s, startMonth)}
                </option>
              ))}
          </Select>
        </label>
      )}
      <Button type="button" variant="secondary" onClick={() => window.print()}>
        Print
      </Button>
      <ButtonLink href={exportHref} variant="secondary" prefetch={false}>
        Download CSV
      </ButtonLink>
      {links.map((l) => (
        <ButtonLink key={l.href} href={l.href} variant="quiet">
          {l.label}
        </ButtonLink>
      ))}
      <p id="season-hint" className="w-full text-sm text-bark-faint">
        A season runs twelve months from the month the estate chose in Settings (January unless changed; UTC): the winter pruning that opens it, budbreak,
        harvest and the walks after. A season that spans two years is named by the year it ends in.
      </p>
    </div>
  );
}

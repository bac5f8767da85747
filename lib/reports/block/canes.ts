/** Canes: base diameters against the fruit-cane rules, and shade canes. Each record is one cane. */
import {
  assessCane,
  caneReasonCode,
  wilsonInterval,
  type CaneVerdict,
  type Exposure,
  type ProportionInterval,
  type ViticultureSettings,
  type WoodOrigin,
} from '@/lib/viticulture';
import { formatCount, formatNumber, formatShare } from '../format';
import { mean, median, num, shareWorking, type Figure, type HistogramBin } from './common';
import type { BlockReportInput } from './input';
import { SOURCES } from './sources';

export interface CaneSection {
  canes: number;
  measured: number;
  meanDiameterMm: number | null;
  medianDiameterMm: number | null;
  bands: HistogramBin[];
  histogram: HistogramBin[];
  verdicts: Record<CaneVerdict, number>;
  assessed: number;
  shadeCanes: number;
  shadeShare: ProportionInterval;
  shadeFigure: Figure;
  /** How each cane is judged, in words. */
  how: string;
  source: string;
}

export function caneSection(input: BlockReportInput, s: ViticultureSettings): CaneSection | null {
  const records = input.measured.filter((o) => o.kind === 'cane-diameter' || o.kind === 'shade-cane');
  if (!records.length) return null;
  const diameters: number[] = [];
  const verdicts: Record<CaneVerdict, number> = { 'fruit-cane': 0, 'if-nothing-better': 0, remove: 0 };
  let assessed = 0;
  let shade = 0;
  for (const o of records) {
    const diameter = num(o.data.diameterMm);
    if (diameter !== undefined && diameter > 0) diameters.push(diameter);
    if (o.kind === 'shade-cane') {
      shade++;
      continue;
    }
    if (diameter === undefined || diameter <= 0) continue;
    const verdict = assessCane(
      {
        baseDiameterMm: diameter,
        longestInternodeMm: num(o.data.longestInternodeMm),
        exposure: o.data.exposure as Exposure | undefined,
        colourGood: typeof o.data.colourGood === 'boolean' ? o.data.colourGood : undefined,
        flat: typeof o.data.flat === 'boolean' ? o.data.flat : undefined,
        origin: o.data.origin as WoodOrigin | undefined,
        injured: typeof o.data.injured === 'boolean' ? o.data.injured : undefined,
      },
      s,
    );
    assessed++;
    verdicts[verdict.verdict]++;
    if (verdict.reasons.some((r) => caneReasonCode(r) === 'shade-cane')) shade++;
  }
  const { veryThinBelowMm, thinBelowMm, bullAboveMm } = s.canes;
  const bands: HistogramBin[] = [
    { label: `Very thin (under ${formatNumber(veryThinBelowMm)} mm)`, from: 0, to: veryThinBelowMm, count: 0 },
    { label: `Thin (under ${formatNumber(thinBelowMm, 2)} mm)`, from: veryThinBelowMm, to: thinBelowMm, count: 0 },
    { label: `Fruit-cane size (${formatNumber(thinBelowMm, 2)}–${formatNumber(bullAboveMm)} mm)`, from: thinBelowMm, to: bullAboveMm, count: 0 },
    { label: `Bull cane (over ${formatNumber(bullAboveMm)} mm)`, from: bullAboveMm, to: Infinity, count: 0 },
  ];
  for (const d of diameters) {
    const band = d < veryThinBelowMm ? 0 : d < thinBelowMm ? 1 : d <= bullAboveMm ? 2 : 3;
    bands[band]!.count++;
  }
  const low = diameters.length ? Math.floor(Math.min(...diameters)) : 0;
  const high = diameters.length ? Math.floor(Math.max(...diameters)) : 0;
  const histogram: HistogramBin[] = [];
  for (let mm = low; mm <= high && diameters.length; mm++) {
    histogram.push({ label: `${mm}–${mm + 1}`, from: mm, to: mm + 1, count: diameters.filter((d) => d >= mm && d < mm + 1).length });
  }
  const shadeShare = wilsonInterval(shade, records.length);
  const internodeMm = s.canes.shadeInternodeAboveMm;
  return {
    canes: records.length,
    measured: diameters.length,
    meanDiameterMm: mean(diameters),
    medianDiameterMm: median(diameters),
    bands,
    histogram,
    verdicts,
    assessed,
    shadeCanes: shade,
    shadeShare,
    shadeFigure: {
      label: 'Shade-cane share of canes recorded',
      value: shadeShare.estimate,
      text: `${formatShare(shadeShare.estimate)} (95% range ${formatShare(shadeShare.lower)}–${formatShare(shadeShare.upper)})`,
      how: `A cane counts as a shade cane when it was recorded as one, or when a measured cane grew in shade or has an internode longer than ${formatNumber(internodeMm, 0)} mm. ${shareWorking(shade, records.length, 'canes recorded were shade canes', shadeShare)}`,
      from: `${formatCount(shade)} of ${formatCount(records.length)} canes recorded in ${input.season} (cane measurements and shade-cane records, one cane each)`,
      source: `${SOURCES.canes}; ${SOURCES.wilson}`,
    },
    how: `Each of the ${formatCount(assessed)} measured canes is judged on its base diameter, its longest internode, where it grew, its colour and shape and the wood it came from. Injured, very thin (under ${formatNumber(veryThinBelowMm)} mm) and bull canes (over ${formatNumber(bullAboveMm)} mm) are to remove; thin (under ${formatNumber(thinBelowMm, 2)} mm), shaded, poorly coloured, flat or older-wood canes have a minor fault, and ${formatCount(s.canes.minorFaultsToRemove)} minor faults mean remove; one minor fault means use it if nothing better is there.`,
    source: SOURCES.canes,
  };
}

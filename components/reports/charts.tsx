'use client';

import type { ReactNode } from 'react';
import { Bar, BarChart, CartesianGrid, Cell, ErrorBar, LabelList, Legend, ReferenceLine, Tooltip, XAxis, YAxis } from 'recharts';

// Ink and greys only, with a hatch for the second series: the charts read the same printed in black
// and white as on screen. Every chart also has its figures in a table beside it.
const INK = '#1d1a16';
const DARK = '#4a443b';
const MID = '#8a826f';
const GRID = '#d8d2c2';
const FONT = { fontSize: 12, fill: INK };

export interface ChartFrameProps {
  title: string;
  /** What the chart shows, read by screen readers in place of the drawing. */
  summary: string;
  children: ReactNode;
  height?: number;
}

export function ChartFrame({ title, summary, children, height = 240 }: ChartFrameProps) {
  return (
    <figure className="vw-chart flex flex-col gap-1 break-inside-avoid" data-testid="report-chart">
      <figcaption className="font-bold">{title}</figcaption>
      <div role="img" aria-label={summary} style={{ height }} className="w-full">
        {children}
      </div>
    </figure>
  );
}

const hatch = (id: string) => (
  <defs>
    <pattern id={id} width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
      <rect width="6" height="6" fill="#ffffff" />
      <line x1="0" y1="0" x2="0" y2="6" stroke={DARK} strokeWidth="2.5" />
    </pattern>
  </defs>
);

const chartStyle = (height: number) => ({ width: '100%', height });

// Legend words in ink whatever the series' fill, so a pale series still reads.
const legendText = (value: string) => <span style={{ color: INK }}>{value}</span>;

export interface HistogramDatum {
  label: string;
  count: number;
  /** Bars under a threshold are drawn dark, the rest mid-grey. */
  below?: boolean;
}

export function HistogramChart({
  data,
  xLabel,
  yLabel,
  threshold,
  height = 240,
}: {
  data: HistogramDatum[];
  xLabel: string;
  yLabel: string;
  threshold?: { at: string; label: string };
  height?: number;
}) {
  return (
    <BarChart responsive style={chartStyle(height)} data={data} margin={{ top: 18, right: 8, bottom: 28, left: 4 }}>
      <CartesianGrid stroke={GRID} vertical={false} />
      <XAxis
        dataKey="label"
        tick={FONT}
        interval={0}
        angle={-30}
        textAnchor="end"
        height={48}
        label={{ value: xLabel, position: 'insideBottom', offset: -22, ...FONT }}
      />
      <YAxis allowDecimals={false} tick={FONT} width={44} label={{ value: yLabel, angle: -90, position: 'insideLeft', ...FONT }} />
      <Tooltip />
      {threshold && <ReferenceLine x={threshold.at} stroke={INK} strokeDasharray="4 3" label={{ value: threshold.label, position: 'top', ...FONT }} />}
      <Bar dataKey="count" name={yLabel} isAnimationActive={false} stroke={INK} fill={MID}>
        {data.map((d) => (
          <Cell key={d.label} fill={d.below ? DARK : MID} />
        ))}
        <LabelList dataKey="count" position="top" style={FONT} />
      </Bar>
    </BarChart>
  );
}

export interface IncidenceDatum {
  label: string;
  /** Percentages 0–100, and the distances to the interval's ends. */
  percent: number;
  error: [number, number];
}

export function IncidenceChart({ data, height }: { data: IncidenceDatum[]; height?: number }) {
  const h = height ?? Math.max(160, 44 * data.length + 40);
  // Up to the highest interval end, rounded up to the next 10%, so small shares are not lost in white space.
  const top = Math.min(100, Math.ceil(Math.max(10, ...data.map((d) => d.percent + d.error[1])) / 10) * 10);
  return (
    <BarChart responsive style={chartStyle(h)} data={data} layout="vertical" margin={{ top: 4, right: 16, bottom: 20, left: 8 }}>
      <CartesianGrid stroke={GRID} horizontal={false} />
      <XAxis
        type="number"
        domain={[0, top]}
        unit="%"
        tick={FONT}
        label={{ value: 'Share with the problem (whiskers: 95% interval)', position: 'insideBottom', offset: -14, ...FONT }}
      />
      <YAxis type="category" dataKey="label" tick={FONT} width={120} interval={0} />
      <Tooltip formatter={(v) => `${Number(v).toFixed(1)}%`} />
      <Bar dataKey="percent" name="Incidence" isAnimationActive={false} fill={DARK} stroke={INK}>
        <ErrorBar dataKey="error" width={6} strokeWidth={2} stroke={INK} direction="x" />
      </Bar>
    </BarChart>
  );
}

export interface RowSeries {
  key: string;
  label: string;
}

const SERIES_FILLS = [DARK, 'url(#vw-hatch-row)', '#c9c2b0'];

/** Vines with each problem, row by row, stacked: dark, hatched and pale tell the kinds apart without colour. */
export function RowCountChart({ data, series, height = 240 }: { data: Record<string, number | null>[]; series: RowSeries[]; height?: number }) {
  return (
    <BarChart responsive style={chartStyle(height)} data={data} margin={{ top: 8, right: 12, bottom: 20, left: 4 }} barCategoryGap={0}>
      {hatch('vw-hatch-row')}
      <CartesianGrid stroke={GRID} vertical={false} />
      <XAxis dataKey="row" tick={FONT} minTickGap={12} label={{ value: 'Row', position: 'insideBottom', offset: -12, ...FONT }} />
      <YAxis allowDecimals={false} tick={FONT} width={40} label={{ value: 'Vines', angle: -90, position: 'insideLeft', ...FONT }} />
      <Tooltip />
      <Legend verticalAlign="top" height={28} wrapperStyle={{ fontSize: 12, color: INK }} formatter={legendText} />
      {series.map((s, i) => (
        <Bar
          key={s.key}
          dataKey={s.key}
          name={s.label}
          stackId="kinds"
          fill={SERIES_FILLS[i % SERIES_FILLS.length]}
          stroke={INK}
          strokeWidth={0.5}
          isAnimationActive={false}
        />
      ))}
    </BarChart>
  );
}

export interface CompareDatum {
  label: string;
  before: number | null;
  now: number | null;
}

/** Two seasons side by side: the earlier hatched, the later solid. */
export function CompareChart({ data, before, now, unit = '%', height }: { data: CompareDatum[]; before: string; now: string; unit?: string; height?: number }) {
  const h = height ?? Math.max(180, 56 * data.length + 60);
  return (
    <BarChart responsive style={chartStyle(h)} data={data} layout="vertical" margin={{ top: 4, right: 40, bottom: 8, left: 8 }}>
      {hatch('vw-hatch-before')}
      <CartesianGrid stroke={GRID} horizontal={false} />
      <XAxis type="number" unit={unit} tick={FONT} />
      <YAxis type="category" dataKey="label" tick={FONT} width={120} interval={0} />
      <Tooltip formatter={(v) => (v === null ? '–' : `${Number(v).toFixed(1)}${unit}`)} />
      <Legend verticalAlign="top" height={28} wrapperStyle={{ fontSize: 12, color: INK }} formatter={legendText} />
      <Bar dataKey="before" name={before} isAnimationActive={false} fill="url(#vw-hatch-before)" stroke={INK}>
        <LabelList dataKey="before" position="right" formatter={(v) => (v == null ? '' : `${Number(v).toFixed(1)}`)} style={FONT} />
      </Bar>
      <Bar dataKey="now" name={now} isAnimationActive={false} fill={DARK} stroke={INK}>
        <LabelList dataKey="now" position="right" formatter={(v) => (v == null ? '' : `${Number(v).toFixed(1)}`)} style={FONT} />
      </Bar>
    </BarChart>
  );
}

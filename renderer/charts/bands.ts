/**
 * Charts of the "How sure?" panel: bars of the point estimates with error bars from the 5th to the 95th percentile of
 * the draws (chartjs-chart-error-bars), and a tornado chart of the one-at-a-time sensitivity (floating bars from the
 * total at an assumption's low setting to the total at its high setting).
 */
import type { ChartConfiguration } from 'chart.js';
import { PALETTE, SERIES } from './register.ts';
import { fmtCompact } from '../format/number.ts';
import type { BandColumns, BandView } from '../worker/protocol.ts';

/** Band j of columns (null where it has none: NaN). */
export function bandAt(c: BandColumns, j: number): BandView | null {
  const point = c.point[j]!;
  return Number.isNaN(point) ? null : { point, p5: c.p5[j]!, p50: c.p50[j]!, p95: c.p95[j]!, mean: c.mean[j]! };
}

export interface BandSeries {
  label: string;
  bands: (BandView | null)[];
}

/** Horizontal bars (one per label) of each series' point estimate, with whiskers at p5 and p95. */
export function bandBars(labels: string[], series: BandSeries[], unit: string): ChartConfiguration {
  return {
    type: 'barWithErrorBars',
    data: {
      labels,
      datasets: series.map((s, k) => ({
        label: s.label,
        data: s.bands.map((b) => (b ? { x: b.point, xMin: b.p5, xMax: b.p95 } : { x: Number.NaN, xMin: Number.NaN, xMax: Number.NaN })),
        backgroundColor: SERIES[k % SERIES.length],
        errorBarColor: PALETTE.ink,
        errorBarWhiskerColor: PALETTE.ink,
        errorBarWhiskerSize: 8,
        borderWidth: 0,
        barPercentage: 0.85,
      })),
    },
    options: {
      indexAxis: 'y',
      responsive: true,
      plugins: { legend: { display: series.length > 1, position: 'bottom' } },
      scales: {
        x: { grid: { color: PALETTE.grid }, ticks: { callback: (v: string | number) => fmtCompact(Number(v)) }, title: { display: true, text: `${unit}; whiskers: 5th to 95th percentile of the draws` } },
        y: { grid: { display: false }, ticks: { autoSkip: false } },
      },
    },
  } as ChartConfiguration;
}

/** Tornado: one floating bar per assumption from its low-setting total to its high-setting total, largest swing on top. */
export function tornado(labels: string[], ranges: [number, number][], point: number, unit: string): ChartConfiguration<'bar'> {
  return {
    type: 'bar',
    data: {
      labels,
      datasets: [
        { label: 'From the low to the high setting', data: ranges, backgroundColor: PALETTE.ochre, borderWidth: 0, barPercentage: 0.7 },
      ],
    },
    options: {
      indexAxis: 'y',
      responsive: true,
      plugins: { legend: { display: false } },
      scales: {
        x: {
          beginAtZero: false,
          grid: { color: (c) => (c.tick && Math.abs(c.tick.value - point) < 1e-9 * Math.max(1, Math.abs(point)) ? PALETTE.ink : PALETTE.grid) },
          ticks: { callback: (v: string | number) => fmtCompact(Number(v)) },
          title: { display: true, text: `Total output (${unit}); point estimate ${fmtCompact(point)}` },
        },
        y: { grid: { display: false }, ticks: { autoSkip: false } },
      },
    },
  };
}

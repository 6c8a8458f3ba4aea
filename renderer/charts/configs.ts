/**
 * Chart configurations built from plain series, shared by the screens: bars by sector (grouped or stacked),
 * a rounds chart (bars per round with the cumulative share as a line) and the spectrum in the complex plane.
 */
import type { ChartConfiguration } from 'chart.js';
import { PALETTE, SERIES } from './register.ts';
import { fmtCompact } from '../format/number.ts';

export interface Series {
  label: string;
  values: (number | null)[];
}

function clean(v: (number | null)[]): (number | null)[] {
  return v.map((x) => (x !== null && Number.isFinite(x) ? x : null));
}

export function barsBySector(labels: string[], series: Series[], opts: { stacked?: boolean; horizontal?: boolean; unit?: string } = {}): ChartConfiguration<'bar'> {
  const horizontal = opts.horizontal ?? labels.length > 8;
  const valueAxis = {
    stacked: opts.stacked ?? false,
    grid: { color: PALETTE.grid },
    ticks: { callback: (v: string | number) => fmtCompact(Number(v)) },
    ...(opts.unit ? { title: { display: true, text: opts.unit } } : {}),
  };
  const catAxis = { stacked: opts.stacked ?? false, grid: { display: false }, ticks: { autoSkip: false } };
  return {
    type: 'bar',
    data: {
      labels,
      datasets: series.map((s, k) => ({ label: s.label, data: clean(s.values), backgroundColor: SERIES[k % SERIES.length], borderWidth: 0, barPercentage: 0.85 })),
    },
    options: {
      indexAxis: horizontal ? 'y' : 'x',
      responsive: true,
      plugins: { legend: { display: series.length > 1, position: 'bottom' } },
      scales: horizontal ? { x: valueAxis, y: catAxis } : { x: catAxis, y: valueAxis },
    },
  };
}

export function roundsChart(rounds: { round: number; value: number; cumulative: number }[], unit: string): ChartConfiguration {
  return {
    type: 'bar',
    data: {
      labels: rounds.map((r) => String(r.round)),
      datasets: [
        { type: 'bar', label: `Added in the round (${unit})`, data: rounds.map((r) => r.value), backgroundColor: PALETTE.teal, yAxisID: 'y', order: 2 },
        { type: 'line', label: 'Share of the total reached', data: rounds.map((r) => r.cumulative * 100), borderColor: PALETTE.ochre, backgroundColor: PALETTE.ochre, pointRadius: 2, yAxisID: 'share', order: 1 },
      ],
    },
    options: {
      responsive: true,
      plugins: { legend: { position: 'bottom' } },
      scales: {
        x: { title: { display: true, text: 'Round of spending' }, grid: { display: false } },
        y: { position: 'left', grid: { color: PALETTE.grid }, ticks: { callback: (v) => fmtCompact(Number(v)) }, title: { display: true, text: unit } },
        share: { position: 'right', min: 0, max: 100, grid: { display: false }, ticks: { callback: (v) => `${v} %` } },
      },
    },
  } as ChartConfiguration;
}

export function spectrumChart(points: { re: number; im: number }[], perron: number | null): ChartConfiguration<'scatter'> {
  const circle: { x: number; y: number }[] = [];
  for (let k = 0; k <= 120; k++) {
    const t = (2 * Math.PI * k) / 120;
    circle.push({ x: Math.cos(t), y: Math.sin(t) });
  }
  const rad = perron ?? 0;
  const inner = circle.map((p) => ({ x: p.x * rad, y: p.y * rad }));
  return {
    type: 'scatter',
    data: {
      datasets: [
        { label: 'Eigenvalues', data: points.map((p) => ({ x: p.re, y: p.im })), backgroundColor: PALETTE.teal, pointRadius: 4 },
        { label: 'Unit circle (|λ| = 1)', data: circle, showLine: true, borderColor: PALETTE.clay, borderWidth: 1.5, pointRadius: 0, fill: false },
        ...(perron !== null ? [{ label: 'Circle of the Perron root', data: inner, showLine: true, borderColor: PALETTE.ochre, borderDash: [4, 4], borderWidth: 1, pointRadius: 0, fill: false }] : []),
      ],
    },
    options: {
      responsive: true,
      // No legend inside the square: the caption below the chart names the circles, keeping the plot area square.
      plugins: { legend: { display: false } },
      scales: {
        x: { min: -1.5, max: 1.5, ticks: { stepSize: 0.5 }, title: { display: true, text: 'Real part' }, grid: { color: PALETTE.grid } },
        y: { min: -1.5, max: 1.5, ticks: { stepSize: 0.5 }, title: { display: true, text: 'Imaginary part' }, grid: { color: PALETTE.grid } },
      },
    },
  };
}

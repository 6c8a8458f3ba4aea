/**
 * chart.js 4 with only the pieces the screens use (tree-shaken registration), and our palette.
 */
import {
  Chart, BarController, BarElement, LineController, LineElement, PointElement, ScatterController,
  CategoryScale, LinearScale, Legend, Tooltip, Title, Filler,
} from 'chart.js';
import { BarWithErrorBarsController, BarWithErrorBar } from 'chartjs-chart-error-bars';

Chart.register(BarController, BarElement, LineController, LineElement, PointElement, ScatterController,
  CategoryScale, LinearScale, Legend, Tooltip, Title, Filler, BarWithErrorBarsController, BarWithErrorBar);

Chart.defaults.font.family = getComputedStyleSafe('--font-ui') ?? 'system-ui, sans-serif';
Chart.defaults.font.size = 12;
Chart.defaults.color = '#3a4652';
Chart.defaults.animation = false;
Chart.defaults.maintainAspectRatio = false;

function getComputedStyleSafe(name: string): string | undefined {
  if (typeof document === 'undefined') return undefined;
  const v = getComputedStyle(document.documentElement).getPropertyValue(name).trim();
  return v || undefined;
}

/** Restrained palette of our own: deep teal, ochre, plum, slate, clay, moss. */
export const PALETTE = {
  teal: '#2f6f73',
  ochre: '#c28f2c',
  plum: '#7a4e7e',
  slate: '#5f7282',
  clay: '#b4583f',
  moss: '#6d7f3a',
  grid: '#e3e7ea',
  ink: '#1f2a36',
} as const;

/** Series colours in a fixed order, so "direct / indirect / induced" always look the same. */
export const SERIES = [PALETTE.teal, PALETTE.ochre, PALETTE.plum, PALETTE.slate, PALETTE.clay, PALETTE.moss];

export { Chart };

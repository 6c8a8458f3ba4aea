/**
 * Exports through the bridge: a save dialog on the desktop, a download in browser mode.
 * Reports are built by the engine (in the worker) as a rectangular CSV plus its `.about.txt` sidecar.
 */
import { csvFileText, type ReportFile } from '../../src/study/index.ts';
import type { Chart } from 'chart.js';
import { getBridge } from '../bridge/index.ts';
import { app, messageOf, say } from './app.ts';
import { engine, CancelledError } from '../worker/client.ts';

/** Margins and type sizes of an exported chart, in CSS pixels (scaled by the canvas' pixel ratio). */
const PNG = { pad: 16, title: 16, subtitle: 12, gap: 6 };

/**
 * The chart as a PNG that stands on its own in a document: a white background (the screen's canvas is transparent),
 * the title and, under it, the study's context (table, scenario, units), drawn above the chart at the canvas' own
 * resolution.
 */
export function chartImage(chart: Chart, title: string, context: string): string {
  const src = chart.canvas;
  const ratio = src.width / Math.max(1, src.clientWidth || src.width);
  const px = (v: number) => Math.round(v * ratio);
  const head = px(PNG.pad + PNG.title + PNG.gap + PNG.subtitle + PNG.gap * 2);
  const out = document.createElement('canvas');
  out.width = src.width + px(PNG.pad * 2);
  out.height = src.height + head + px(PNG.pad);
  const g = out.getContext('2d');
  if (!g) return chart.toBase64Image('image/png', 1);
  g.fillStyle = '#ffffff';
  g.fillRect(0, 0, out.width, out.height);
  g.fillStyle = '#1a1a1a';
  g.textBaseline = 'top';
  const family = getComputedStyle(document.body).fontFamily || 'sans-serif';
  g.font = `bold ${px(PNG.title)}px ${family}`;
  g.fillText(title, px(PNG.pad), px(PNG.pad), out.width - px(PNG.pad * 2));
  g.fillStyle = '#555555';
  g.font = `${px(PNG.subtitle)}px ${family}`;
  g.fillText(context, px(PNG.pad), px(PNG.pad + PNG.title + PNG.gap), out.width - px(PNG.pad * 2));
  g.drawImage(src, px(PNG.pad), head);
  return out.toDataURL('image/png');
}

/** The study's context under a chart's title: the table, the scenario when the chart is of one, and the units. */
export function chartContext(scenario?: string, units?: string): string {
  const t = app.table;
  return [t ? `${t.name} (${t.fileName})` : '', scenario ? `scenario '${scenario}'` : '', units ?? (t ? `money in ${t.moneyUnit}` : '')].filter(Boolean).join(' · ');
}

export async function exportChartPng(chart: Chart, base: string, title: string, context: string): Promise<void> {
  const url = chartImage(chart, title, context);
  const b64 = url.slice(url.indexOf(',') + 1);
  const saved = await getBridge().exportFile(`${base}.png`, 'png', b64);
  if (saved) say(`Saved ${saved.name}`);
}

export async function exportReportFiles(files: ReportFile[]): Promise<number> {
  let n = 0;
  for (const f of files) {
    const kind = f.name.endsWith('.csv') ? 'csv' : f.name.endsWith('.json') ? 'json' : 'txt';
    // CSV with the UTF-8 byte-order mark, as the CLI writes it (src/csv csvFileText says why).
    const saved = await getBridge().exportFile(f.name, kind, kind === 'csv' ? csvFileText(f.content) : f.content);
    if (!saved) break;
    n++;
  }
  if (n) say(`Exported ${files.slice(0, n).map((f) => f.name).join(', ')}`);
  return n;
}

/**
 * Spending mixes as a mix file (`mix,sector,share`, written by the engine's writeMixCsv, read back by the mix reader):
 * the named ones, or all of the study's own (`names` null). Through the bridge like every export: a save dialog that
 * asks before replacing a file, an atomic write.
 */
export async function exportMixes(names: string[] | null): Promise<void> {
  try {
    const f = await engine().call('mixFile', { names });
    const saved = await getBridge().exportFile(f.name, 'csv', csvFileText(f.text));
    if (saved) say(`Exported ${saved.name}`);
  } catch (e) {
    if (!(e instanceof CancelledError)) say(`Not exported: ${messageOf(e)}`);
  }
}

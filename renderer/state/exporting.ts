/**
 * Exports through the bridge: a save dialog on the desktop, a download in browser mode.
 * Reports are built by the engine (in the worker) as a rectangular CSV plus its `.about.txt` sidecar.
 */
import type { Chart } from 'chart.js';
import { getBridge } from '../bridge/index.ts';
import type { ReportFile } from '../../src/report/index.ts';
import { say } from './app.ts';

export async function exportChartPng(chart: Chart, base: string): Promise<void> {
  const url = chart.toBase64Image('image/png', 1);
  const b64 = url.slice(url.indexOf(',') + 1);
  const saved = await getBridge().exportFile(`${base}.png`, 'png', b64);
  if (saved) say(`Saved ${saved.name}`);
}

export async function exportReportFiles(files: ReportFile[]): Promise<number> {
  let n = 0;
  for (const f of files) {
    const kind = f.name.endsWith('.csv') ? 'csv' : f.name.endsWith('.json') ? 'json' : 'txt';
    const saved = await getBridge().exportFile(f.name, kind, f.content);
    if (!saved) break;
    n++;
  }
  if (n) say(`Exported ${files.slice(0, n).map((f) => f.name).join(', ')}`);
  return n;
}

/**
 * The brief and the workbook from the app, in real Chromium (browser mode: one download each): the brief's PDF is
 * byte for byte the one the study layer (the function `roundwise scenario --brief` calls) makes in this process for
 * the same study and the app's own timestamp; the workbook's cells, read back by SheetJS, equal the study layer's;
 * CSV reports carry the UTF-8 byte-order mark; a chart's PNG has a white background and a title band above the chart;
 * Ctrl+P prints the brief (the print view alone, with the brief's text).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Download, Page } from 'playwright-core';
import { DOWNLOADS, shot, skipBrowser, startSession, type Session, goTo } from './harness.ts';
import {
  dateText, prepareStudy, runStudyScenario, SAMPLE_CSV, SAMPLE_FILE_NAME, studyBrief, studyFromTableFile, studyWorkbook, utf8Bytes, type Scenario,
} from '../../src/study/index.ts';
import { fonts, pdfWords, poppler, readWorkbook } from '../support/deliverables.ts';

let s: Session;
let page: Page;

/** The scenario the app starts with on the sample (renderer/worker/table-loading.ts `starter`). */
const STARTER: Scenario = { name: 'New food plant', phases: [{ name: 'Operating', timing: 'annual', lines: [{ sector: 'Food processing', amount: 1000, kind: 'final-demand', localShare: 1 }] }] };

function sampleOutcome() {
  const study = studyFromTableFile(utf8Bytes(SAMPLE_CSV), SAMPLE_FILE_NAME, { name: 'Fernhollow County (invented sample)' }, { scenarios: [STARTER] });
  const ps = prepareStudy(study); // as the app prepares it (with the eigenvalues)
  return { ps, o: runStudyScenario(ps, STARTER, { paths: null }) };
}

async function download(click: () => Promise<void>): Promise<{ name: string; bytes: Buffer }> {
  const [d] = await Promise.all([page.waitForEvent('download', { timeout: 60_000 }) as Promise<Download>, click()]);
  const path = join(DOWNLOADS, d.suggestedFilename());
  await d.saveAs(path);
  return { name: d.suggestedFilename(), bytes: readFileSync(path) };
}

function go(screen: string): Promise<void> {
  return goTo(page, screen);
}

describe.skipIf(skipBrowser)('the brief and the workbook from the app', () => {
  beforeAll(async () => {
    s = await startSession();
    page = s.page;
    await page.addInitScript(() => { (window as unknown as { printed: number }).printed = 0; window.print = () => { (window as unknown as { printed: number }).printed++; }; });
    await page.goto(s.url);
    await page.getByTestId('verdict').waitFor({ timeout: 150_000 });
  });
  afterAll(async () => { await s?.close(); });

  it('saves the brief the study layer makes for the same study, byte for byte', async () => {
    await go('export');
    await page.getByTestId('brief-paper').selectOption('a4');
    const pdf = await download(() => page.getByTestId('export-brief').click());
    expect(pdf.name).toBe('new-food-plant-brief.pdf');
    // The brief shows the time to the minute and records it to the second (the PDF's creation date): read it back.
    const created = /CreationDate:\s+(\S+)/.exec(poppler('pdfinfo', pdf.bytes, ['-isodates']))?.[1];
    expect(created).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ$/);
    const date = created!.replace(/Z$/, '.000Z');
    expect(pdfWords(pdf.bytes)).toContain(`produced ${dateText(date)}`);
    const { ps, o } = sampleOutcome();
    const expected = await studyBrief(ps, o, { date, paper: 'a4', fonts });
    expect(pdf.bytes.equals(Buffer.from(expected))).toBe(true);
    await shot(page, 'deliverables-export');
  });

  it('saves the workbook with the study layer\'s cells', async () => {
    const book = await download(() => page.getByTestId('export-workbook').click());
    expect(book.name).toBe('new-food-plant.xlsx');
    const { ps, o } = sampleOutcome();
    const app = readWorkbook(book.bytes);
    const direct = readWorkbook(await studyWorkbook(ps, o, { date: '2026-12-02T00:00:00.000Z' }));
    expect(app.names).toEqual(direct.names);
    for (const n of app.names.filter((x) => x !== 'Provenance and cautions')) expect(app.sheets.get(n), n).toEqual(direct.sheets.get(n));
  });

  it('saves CSV reports with the UTF-8 byte-order mark', async () => {
    const downloads: Download[] = [];
    const on = (d: Download) => { downloads.push(d); };
    page.on('download', on);
    await page.click('[data-report="multipliers"]');
    await expect.poll(() => downloads.length, { timeout: 30_000 }).toBe(2);
    page.off('download', on);
    const csv = downloads.find((d) => d.suggestedFilename().endsWith('.csv'))!;
    const path = join(DOWNLOADS, csv.suggestedFilename());
    await csv.saveAs(path);
    expect([...readFileSync(path).subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
  });

  it('saves a chart as a PNG with a white background and a title band above the chart', async () => {
    await go('overview');
    const chartHeight = await page.locator('[data-png="overview-output-multipliers"]').evaluate((b) => b.closest('figure')!.querySelector('canvas')!.height);
    const png = await download(() => page.click('[data-png="overview-output-multipliers"]'));
    const px = await page.evaluate(async (b64) => {
      const img = new Image();
      img.src = `data:image/png;base64,${b64}`;
      await img.decode();
      const c = document.createElement('canvas');
      c.width = img.width;
      c.height = img.height;
      const g = c.getContext('2d')!;
      g.drawImage(img, 0, 0);
      const corner = [...g.getImageData(1, 1, 1, 1).data];
      const bottom = [...g.getImageData(img.width - 2, img.height - 2, 1, 1).data];
      // Dark pixels in the title band: the title is drawn there.
      const band = g.getImageData(0, 0, img.width, Math.round(img.height * 0.08)).data;
      let dark = 0;
      for (let k = 0; k < band.length; k += 4) if (band[k]! < 100) dark++;
      return { corner, bottom, dark, height: img.height };
    }, png.bytes.toString('base64'));
    expect(px.corner).toEqual([255, 255, 255, 255]);
    expect(px.bottom).toEqual([255, 255, 255, 255]);
    expect(px.dark).toBeGreaterThan(50);
    expect(px.height).toBeGreaterThan(chartHeight);
  });

  it('prints the brief on Ctrl+P: the print view alone, with the brief\'s text', async () => {
    await page.keyboard.press('Control+p');
    await expect.poll(() => page.evaluate(() => (window as unknown as { printed: number }).printed), { timeout: 60_000 }).toBe(1);
    await page.emulateMedia({ media: 'print' });
    const view = page.locator('.brief-print');
    expect(await view.isVisible()).toBe(true);
    expect(await page.locator('.shell').isVisible()).toBe(false);
    const text = (await view.textContent()) ?? '';
    expect(text).toContain('Economic impact brief: New food plant');
    expect(text).toContain('Cautions');
    await page.pdf({ path: join(DOWNLOADS, 'printed-brief.pdf'), format: 'A4' }).catch(() => undefined);
    await page.emulateMedia({ media: 'screen' });
    expect(await view.isVisible()).toBe(false);
    expect(s.errors).toEqual([]);
  });
});

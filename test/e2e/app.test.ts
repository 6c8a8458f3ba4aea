/**
 * The planner's whole flow in real Chromium against the built renderer: sample opens with its verdict, a table is
 * imported through the file input with a role changed, a malformed file is refused with its location while the
 * previous table stays, a two-line scenario runs, the multiplier report is exported and its numbers compared with
 * the engine's own output for the same table (computed here, in the test process), and a project is saved and
 * reopened with the same results. No console error may appear along the way; every screen is photographed.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import Papa from 'papaparse';
import { DOWNLOADS, money, REPO, type Session, shot as photograph, skipBrowser, startSession } from './harness.ts';
import { importTable } from '../../src/table/index.ts';
import { prepareModel, analyzeTable } from '../../src/model/index.ts';
import { runScenario, linesOf, onePhase } from '../support/scenario.ts';
import type { Scenario } from '../../src/scenario/index.ts';
import type { Download } from 'playwright-core';
import { sparseTableCsv } from '../support/random-tables.ts';

const FIX = join(REPO, 'test', 'fixtures', 'e2e');
const TEST_CSV = join(FIX, 'ridgeline-test.csv');
let s: Session;
let page: Page;
let projectFile = '';
let totalBeforeSave = '';

/** The scenario the test types in, as the engine sees it. */
const TWO_LINES: Scenario = onePhase('Cannery expansion', [
  { sector: 'Cannery', amount: 500, kind: 'final-demand', localShare: 1 },
  { sector: 'Retail', amount: 200, kind: 'final-demand', localShare: 0.5 },
]);

function engineTable() {
  return importTable(readFileSync(TEST_CSV, 'utf8'), { fileName: 'ridgeline-test.csv' });
}


/** Click, and collect the downloads the click starts (reports come as a CSV and its .about.txt). */
async function downloadsOf(click: () => Promise<void>, count: number): Promise<{ name: string; path: string; text: string }[]> {
  const got: Download[] = [];
  const onDl = (d: Download) => { got.push(d); };
  page.on('download', onDl);
  await click();
  await poll(() => got.length, { timeout: 15_000 }).toBe(count);
  page.off('download', onDl);
  const out = [];
  for (const d of got) {
    const path = join(DOWNLOADS, d.suggestedFilename());
    await d.saveAs(path);
    out.push({ name: d.suggestedFilename(), path, text: readFileSync(path, 'utf8') });
  }
  return out;
}

/** expect.poll with a timeout that suits a busy 2-core machine (vitest's default is one second). */
function poll<T>(fn: () => T | Promise<T>, opts: { timeout?: number } = {}) {
  return expect.poll(fn, { interval: 100, timeout: 30_000, ...opts });
}

/** Photograph the screen, checking first that no NaN or Infinity is on it. */
async function shot(p: Page, name: string): Promise<void> {
  expect(await p.locator('body').innerText(), name).not.toMatch(/\bNaN\b|Infinity|∞/);
  await photograph(p, name);
}

async function go(screen: string): Promise<void> {
  await page.click(`[data-screen="${screen}"]`);
  await page.waitForSelector(`main[aria-label]`);
}

describe.skipIf(skipBrowser)('Roundwise in the browser', () => {
  beforeAll(async () => {
    s = await startSession();
    page = s.page;
    // Generous: on a busy 2-core machine the first load compiles the app and the engine worker.
    page.setDefaultTimeout(60_000);
    await page.goto(s.url);
    await page.getByTestId('verdict').waitFor({ timeout: 150_000 });
  });

  afterAll(async () => {
    await s?.close();
  });

  it('opens on the sample county with its verdict in plain words', async () => {
    const verdict = page.getByTestId('verdict');
    await verdict.waitFor({ timeout: 30_000 });
    await poll(() => verdict.textContent()).toMatch(/table is productive/);
    expect(await page.getByTestId('table-name').textContent()).toMatch(/Fernhollow County/);
    expect(await page.getByTestId('perron').textContent()).toMatch(/certified between/);
    expect(await page.getByTestId('cautions').count()).toBe(1);
    await shot(page, '01-overview');
    // A chart saves as a real PNG file (a download in browser mode).
    const [png] = await downloadsOf(() => page.click('[data-png="overview-output-multipliers"]'), 1);
    expect(png!.name).toBe('overview-output-multipliers.png');
    expect(readFileSync(png!.path).subarray(0, 8)).toEqual(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]));
    // Every chart has a table alternative.
    await page.getByRole('button', { name: 'Show as table' }).first().click();
    expect(await page.locator('.chart-table table').first().textContent()).toMatch(/Food processing/);
    await page.getByRole('button', { name: 'Show chart' }).first().click();
    // The in-window menu lists each command with its shortcut and is keyboard-driven.
    await page.getByRole('button', { name: 'File' }).click();
    const menu = page.getByRole('menu', { name: 'File' });
    expect(await menu.textContent()).toMatch(/Import table….*Ctrl\+O.*Save project.*Ctrl\+S/);
    await page.keyboard.press('ArrowDown');
    expect(await page.evaluate(() => document.activeElement?.textContent)).toMatch(/Open project/);
    await page.keyboard.press('Escape');
    expect(await menu.count()).toBe(0);
    await page.getByRole('button', { name: 'Edit' }).click();
    await page.getByTestId('verdict').click();
    expect(await page.getByRole('menu').count()).toBe(0);
  });

  it('imports a CSV through the file input, with a role changed before accepting', async () => {
    await go('import');
    await page.getByTestId('file-input').setInputFiles(join(FIX, 'ridgeline-test.csv'));
    await page.getByTestId('row-roles').waitFor();
    expect(await page.getByTestId('preview-sectors').textContent()).toMatch(/5 sectors/);
    // Balanced as shipped; ignoring "Other value added" opens a gap the balance report must show.
    expect(await page.getByTestId('balance').textContent()).toMatch(/0\.00\s?%/);
    await page.selectOption('[data-row-role="Other value added"]', 'ignore');
    await poll(() => page.getByTestId('balance').textContent()).toMatch(/-\d+\.\d\d\s?%|−\d+\.\d\d\s?%/);
    await shot(page, '02-import-preview');
    await page.selectOption('[data-row-role="Other value added"]', 'otherValueAdded');
    await poll(() => page.getByTestId('balance').textContent()).toMatch(/^(?!.*[1-9]\.\d\d\s?%)/s);
    await page.getByTestId('accept-import').click();
    await poll(() => page.getByTestId('table-name').textContent()).toMatch(/ridgeline-test/);
    // Ctrl+O asks for a file too (through the bridge); dismissing the preview changes nothing. The key goes to the
    // page in front once the import's work has ended (a file chooser needs the page's user activation).
    await poll(() => page.getByTestId('progress').count()).toBe(0);
    await page.bringToFront();
    const chooser = page.waitForEvent('filechooser');
    await page.keyboard.press('Control+o');
    await (await chooser).setFiles(TEST_CSV);
    await page.getByRole('button', { name: 'Discard' }).click();
    expect(await page.getByTestId('table-name').textContent()).toMatch(/ridgeline-test/);
  });

  it('refuses a malformed CSV with its location and keeps the previous table', async () => {
    await go('overview');
    // Dropped onto the window (drag and drop), from any screen.
    const csv = readFileSync(join(FIX, 'malformed.csv'), 'utf8');
    await page.evaluate((content) => {
      const dt = new DataTransfer();
      dt.items.add(new File([content], 'malformed.csv', { type: 'text/csv' }));
      const target = document.querySelector('.shell')!;
      target.dispatchEvent(new DragEvent('dragover', { dataTransfer: dt, bubbles: true, cancelable: true }));
      target.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, cancelable: true }));
    }, csv);
    const err = page.getByTestId('import-error');
    await err.waitFor();
    const text = (await err.textContent()) ?? '';
    expect(text).toMatch(/malformed\.csv:4:3/);
    expect(text).toMatch(/thirty/);
    expect(await page.getByTestId('table-name').textContent()).toMatch(/ridgeline-test/);
    await shot(page, '03-import-refused');
  });

  it('shows the multipliers with the household closure switch, the table, and its structure', async () => {
    await go('multipliers');
    const table = page.getByTestId('multiplier-table');
    await table.waitFor();
    expect(await table.textContent()).toContain('Output Type II');
    await shot(page, '04-multipliers');
    await page.getByTestId('closure').uncheck();
    await poll(() => table.textContent()).not.toContain('Output Type II');
    await page.getByTestId('closure').check();
    await poll(() => table.textContent()).toContain('Output Type II');
    await page.click('button[title="Sort by Output Type I"]');
    expect(await page.locator('th:has(button[title="Sort by Output Type I"])').getAttribute('aria-sort')).toBe('descending');
    const first = Number((await table.locator('tbody tr:not(.pad) td').first().textContent())!.replace(/,/g, ''));
    const best = Math.max(...analyzeTable(engineTable()).multipliers.output.typeI.map((v) => v ?? -Infinity));
    expect(first).toBeCloseTo(best, 4);

    await go('table');
    await page.locator('.matrix .m-cell').first().waitFor();
    await shot(page, '05-table');
    await page.click('[data-matrix="A"]');
    await page.getByTestId('grid-view').click();
    await page.locator('canvas.shaded').waitFor();
    await shot(page, '06-table-grid');

    await go('structure');
    await page.getByTestId('spectrum-table').waitFor();
    expect(await page.getByTestId('rounds99').textContent()).toMatch(/\d/);
    // The Perron root is the long-run ratio of successive rounds, not a rate the first rounds keep.
    expect(await page.getByTestId('spectrum-note').textContent()).toMatch(/The largest, the Perron root, is\s+the ratio of one round to the round before in the long run; the first rounds can shrink faster or slower/);
    await shot(page, '07-structure');
  });

  it('runs a scenario with two lines and shows the engine\'s totals', async () => {
    await go('scenarios');
    await page.getByTestId('new-scenario').click();
    await page.getByTestId('scenario-name').fill(TWO_LINES.name);
    await page.getByTestId('scenario-name').press('Tab');
    const l1 = linesOf(TWO_LINES)[0]!, l2 = linesOf(TWO_LINES)[1]!;
    await page.getByLabel('Sector of line 1').fill(l1.sector);
    await page.getByLabel('Sector of line 1').press('Enter');
    await page.locator('[data-line-amount="0"]').fill(String(l1.amount));
    await page.locator('[data-line-amount="0"]').press('Tab');
    await page.getByTestId('add-line').click();
    await page.getByLabel('Sector of line 2').fill('reta'); // a unique partial match is taken
    await page.getByLabel('Sector of line 2').press('Enter');
    await poll(() => page.getByLabel('Sector of line 2').inputValue()).toBe(l2.sector);
    await page.locator('[data-line-amount="1"]').fill(String(l2.amount));
    await page.locator('[data-line-amount="1"]').press('Tab');
    await page.getByLabel('Local share of line 2, percent').fill('50');
    await page.getByLabel('Local share of line 2, percent').press('Tab');

    const expected = runScenario(prepareModel(engineTable()), TWO_LINES);
    const total = expected.totals.output.total;
    await poll(() => page.getByTestId('total-effect').textContent(), { timeout: 10_000 }).toBe(money(total));
    expect(await page.getByTestId('effect-totals').textContent()).toContain(money(expected.totals.output.direct));
    totalBeforeSave = money(total);
    // Undo takes the last edit back (local share 50 % → 100 %); redo restores it.
    await page.keyboard.press('Control+z');
    await poll(() => page.getByLabel('Local share of line 2, percent').inputValue()).toBe('100');
    await page.keyboard.press('Control+y');
    await poll(() => page.getByLabel('Local share of line 2, percent').inputValue()).toBe('50');
    await poll(() => page.getByTestId('total-effect').textContent()).toBe(totalBeforeSave);
    await page.getByTestId('compare').waitFor();
    // Structural paths to the most affected sector not shocked itself, traced once the results have settled, carry
    // that sector's total effect (display rounding aside), and are shown again on a later visit (kept, not searched again).
    const carried = async (): Promise<number> => {
      const t = await page.getByTestId('path-total').textContent({ timeout: 10_000 });
      return Number(/Output change there: ([\d,.]+)/.exec(t ?? '')![1]!.replaceAll(',', ''));
    };
    const traced = await carried();
    const destination = await page.getByLabel('Structural paths to sector').inputValue();
    expect(expected.sectors).toContain(destination);
    const atDestination = expected.effects.output!.total[expected.sectors.indexOf(destination)]!;
    expect(Math.abs(traced - atDestination)).toBeLessThanOrEqual(0.05);
    await go('overview');
    await go('scenarios');
    expect(Math.abs(await carried() - atDestination)).toBeLessThanOrEqual(0.05);
    await shot(page, '08-scenarios');
  });

  it('exports the multiplier report with the engine\'s own numbers', async () => {
    await go('export');
    await shot(page, '09-export');
    const files = await downloadsOf(() => page.click('[data-report="multipliers"]'), 2);
    const csv = files.find((f) => f.name === 'multipliers.csv');
    const about = files.find((f) => f.name === 'multipliers.about.txt');
    expect(csv).toBeDefined();
    expect(about?.text).toMatch(/Cautions/);
    const rows = Papa.parse<string[]>(csv!.text.trim(), { skipEmptyLines: true }).data;
    const a = analyzeTable(engineTable());
    const header = rows[0]!;
    const col = (name: string) => header.findIndex((h) => h.startsWith(name));
    const checks: [string, (number | null)[]][] = [
      ['output Type I', a.multipliers.output.typeI], ['output Type II', a.multipliers.output.typeII],
      ['labour income simple', a.multipliers.income.simple], ['labour income Type II', a.multipliers.income.typeII],
      ['employment simple', a.multipliers.employment.simple], ['value added total', a.multipliers.valueAdded.total],
      ['backward linkage', a.linkages.backward], ['forward linkage', a.linkages.forward],
    ];
    expect(rows.length).toBe(a.n + 1);
    for (const [name, values] of checks) {
      const c = col(name);
      expect(c, name).toBeGreaterThan(0);
      a.sectors.forEach((sector, j) => {
        const row = rows.find((r) => r[0] === sector)!;
        const v = values[j];
        expect(v, `${name} ${sector}`).not.toBeNull();
        // Shortest round-trip numbers: what the engine computed is what the file says, to the last bit.
        expect(Number(row[c]), `${name} ${sector}`).toBe(v);
      });
    }
  });

  it('saves the project and reopens it with the same results', async () => {
    const [saved] = await downloadsOf(() => page.getByTestId('save-project').click(), 1);
    expect(saved!.name).toMatch(/\.roundwise$/);
    projectFile = saved!.path;
    // Replace the table and scenarios' context with the sample, then reopen the project.
    await go('import');
    await page.getByTestId('use-sample').click();
    await poll(() => page.getByTestId('table-name').textContent()).toMatch(/Fernhollow/);
    await go('export');
    page.once('dialog', (d) => void d.accept());
    const chooser = page.waitForEvent('filechooser');
    await page.getByTestId('open-project').click();
    await (await chooser).setFiles(projectFile);
    await poll(() => page.getByTestId('table-name').textContent()).toMatch(/ridgeline-test/);
    await go('scenarios');
    await page.getByRole('button', { name: TWO_LINES.name }).click();
    await poll(() => page.getByTestId('total-effect').textContent()).toBe(totalBeforeSave);
    expect(await page.getByLabel('Sector of line 2').inputValue()).toBe('Retail');
    expect(await page.getByLabel('Local share of line 2, percent').inputValue()).toBe('50');
    await go('export');
    expect(await page.getByTestId('recent').textContent()).toContain(saved!.name);
    await go('scenarios');
    await shot(page, '10-reopened-project');
  });

  it('stays usable at 2,000 sectors: progress with cancel while it works, then virtual scrolling', async () => {
    const file = join(REPO, 'test-output', 'e2e-2000-sectors.csv');
    writeFileSync(file, sparseTableCsv(2000));
    // The reopened project's name is shown until another table is imported: that starts a new, unnamed study.
    expect(await page.getByTestId('project-name').textContent()).toMatch(/\.roundwise/);
    await go('import');
    await page.getByTestId('file-input').setInputFiles(file);
    // Import and analysis take seconds at this size: the indicator (with its Cancel button) must show meanwhile. The
    // page notes it as it appears: polled from here, an indicator shown while the page is busy drawing can be missed.
    await page.evaluate(() => {
      const seen = { indicator: false, cancel: false };
      (window as unknown as { progressSeen: typeof seen }).progressSeen = seen;
      new MutationObserver(() => {
        const el = document.querySelector('[data-testid="progress"]');
        if (!el) return;
        seen.indicator = true;
        if ([...el.querySelectorAll('button')].some((b) => b.textContent?.trim() === 'Cancel')) seen.cancel = true;
      }).observe(document.body, { childList: true, subtree: true });
    });
    await page.getByTestId('accept-import').click({ timeout: 60_000 });
    await poll(() => page.getByTestId('table-name').textContent(), { timeout: 90_000 }).toMatch(/2,000 sectors/);
    expect(await page.evaluate(() => (window as unknown as { progressSeen: unknown }).progressSeen)).toEqual({ indicator: true, cancel: true });
    expect(await page.getByTestId('project-name').count()).toBe(0);
    await go('multipliers');
    const table = page.getByTestId('multiplier-table');
    await table.waitFor();
    expect(await table.textContent()).toMatch(/2,000 of 2,000 rows/);
    const rendered = await table.locator('tbody tr:not(.pad)').count();
    expect(rendered).toBeLessThan(60);
    await table.locator('.table-scroll').evaluate((el) => { el.scrollTop = el.scrollHeight; });
    await poll(() => table.locator('tbody tr:not(.pad) th').last().textContent()).toBe('Sector 2000');
    await go('table');
    await page.locator('.matrix .m-cell').first().waitFor();
    expect(await page.locator('.matrix .m-cell').count()).toBeLessThan(600);
    await shot(page, '11-table-2000-sectors');
  });

  it('says in words when a table is not productive, and shows no made-up numbers', async () => {
    await go('import');
    await page.getByTestId('file-input').setInputFiles(join(FIX, 'not-productive.csv'));
    await page.getByTestId('accept-import').click();
    await poll(() => page.getByTestId('table-name').textContent(), { timeout: 20_000 }).toMatch(/not-productive/);
    await go('overview');
    expect(await page.getByTestId('verdict').textContent()).toMatch(/not productive/);
    await page.getByTestId('no-multipliers').waitFor();
    await shot(page, '12-not-productive');
    await go('multipliers');
    await shot(page, '13-not-productive-multipliers');
    await go('scenarios');
    await page.getByTestId('scenario-error').waitFor();
    expect(await page.getByTestId('scenario-error').textContent()).toMatch(/not productive/);
  });

  it('asks before closing the window with unsaved changes', async () => {
    expect(await page.getByTestId('table-name').locator('..').textContent()).toContain('●');
    const asked = page.waitForEvent('dialog', { timeout: 10_000 });
    await page.close({ runBeforeUnload: true });
    const dialog = await asked;
    expect(dialog.type()).toBe('beforeunload');
    await dialog.dismiss();
    expect(page.isClosed()).toBe(false);
  });

  it('shows no console errors during the whole flow', () => {
    expect(s.errors).toEqual([]);
  });
});

// Keep the fixture honest: the test table is balanced as shipped (checked in plain arithmetic here).
describe('e2e fixture', () => {
  it('ridgeline-test.csv is balanced', () => {
    const rows = readFileSync(join(FIX, 'ridgeline-test.csv'), 'utf8').trim().split('\n').map((l) => l.split(','));
    for (let j = 1; j <= 5; j++) {
      let col = 0;
      for (let i = 1; i <= 8; i++) col += Number(rows[i]![j]);
      expect(col).toBeCloseTo(Number(rows[j]![8]), 9);
    }
  });
});

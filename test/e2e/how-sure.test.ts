/**
 * The "How sure?" panel in real Chromium against the built renderer: bands of the multipliers and of a scenario's
 * totals, computed in the engine worker a range of draws at a time, are compared with the study layer called here in
 * the test process with the same seed (the CLI's --draws calls the same function); the sensitivity's order and Cancel
 * are checked; no console error may appear. Screenshots: test-output/screenshots/how-sure-*.png (1280×800).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { money, openApp, shot, skipBrowser, type Session } from './harness.ts';
import { onePhase } from '../support/scenario.ts';
import { buildRegional } from '../../renderer/worker/regional.ts';
import {
  EMPLOYMENT_SAMPLE_CSV, EMPLOYMENT_SAMPLE_FILE_NAME, NATIONAL_SAMPLE_CSV, NATIONAL_SAMPLE_FILE_NAME, SAMPLE_CSV, SAMPLE_FILE_NAME,
  beginStudyBands, defaultUncertaintySettings, flqOriginOf, prepareStudy, studyBands, studyFromTableFile, studySensitivity, utf8Bytes, type Scenario,
} from '../../src/study/index.ts';

let s: Session;
let page: Page;

const ps = prepareStudy(studyFromTableFile(utf8Bytes(SAMPLE_CSV), SAMPLE_FILE_NAME));
/** ChartPanel's table alternative: up to four decimals. */
const cell = (v: number) => v.toLocaleString('en-US', { maximumFractionDigits: 4 });

async function compute(draws: number, seed: number, cv: number): Promise<void> {
  const panel = page.getByTestId('how-sure');
  await panel.getByTestId('band-draws').fill(String(draws));
  await panel.getByTestId('band-seed').fill(String(seed));
  await panel.getByTestId('band-cv').fill(String(cv));
  await panel.getByTestId('band-compute').click();
  await panel.getByTestId('band-summary').waitFor({ timeout: 60_000 }).catch(async (e) => {
    await shot(page, 'how-sure-debug');
    throw new Error(`${(e as Error).message}\npanel: ${await panel.innerText()}\nerrors: ${s.errors.join('; ')}`);
  });
}

describe.skipIf(skipBrowser)('How sure? in the browser', () => {
  beforeAll(async () => {
    s = await openApp();
    page = s.page;
  });

  afterAll(async () => {
    await s?.close();
  });

  it('shows the multipliers\' bands the study gives for the same seed', async () => {
    await page.click('[data-screen="multipliers"]');
    await compute(200, 7, 0.1);
    const ref = studyBands(ps, { settings: defaultUncertaintySettings({ draws: 200, seed: 7, cv: 0.1 }), multipliers: true, scenarios: [] })!;
    const panel = page.getByTestId('how-sure');
    expect(await panel.getByTestId('band-summary').textContent()).toMatch(new RegExp(`200 draws, seed 7, CV 0.1:\\s+${ref.accepted} kept, ${ref.rejected} left out`));
    await panel.getByTestId('band-summary').scrollIntoViewIfNeeded();
    await shot(page, 'how-sure-01-multipliers');
    await panel.getByRole('button', { name: 'Show as table' }).click();
    const first = panel.locator('.chart-table tbody tr').first();
    const texts = (await first.locator('td').allTextContents()).map((t) => t.trim());
    const typeI = ref.multipliers!.find((m) => m.key === 'output.typeI')!.values;
    const j = ref.sectors.indexOf(texts[0]!);
    expect(j).toBeGreaterThanOrEqual(0);
    const b = typeI[j]!;
    expect(texts.slice(1, 6)).toEqual([b.point, b.p5, b.p50, b.p95, b.mean].map(cell));
    // Largest point estimate first, as the screen's own chart.
    expect(Math.max(...typeI.map((x) => x?.point ?? -Infinity))).toBe(b.point);
  });

  it('shows a scenario\'s totals with the bands the study gives, and its sensitivity sorted by swing', async () => {
    await page.click('[data-screen="scenarios"]');
    await page.getByTestId('how-sure').waitFor({ timeout: 30_000 });
    await compute(200, 3, 0.1);
    const food = ps.study.table.sectors.find((x) => /food/i.test(x))!;
    const scenario: Scenario = onePhase('New food plant', [{ sector: food, amount: 1000, kind: 'final-demand', localShare: 1 }]);
    const ref = studyBands(ps, { settings: defaultUncertaintySettings({ draws: 200, seed: 3, cv: 0.1 }), multipliers: false, scenarios: [scenario] })!;
    const out = ref.scenarios[0]!.totals.output!;
    const row = page.getByTestId('band-totals').locator('tr[data-variable="output"] td');
    expect((await row.allTextContents()).slice(0, 5).map((t) => t.trim())).toEqual([out.point, out.p5, out.p50, out.p95, out.mean].map(money));
    await page.getByTestId('band-totals').scrollIntoViewIfNeeded();
    await shot(page, 'how-sure-02-scenario');

    await page.getByTestId('sens-compute').click();
    await page.getByTestId('sens-table').waitFor();
    const sens = studySensitivity(ps, scenario, 0.1)[0]!; // the panel shows the first phase's
    const names = (await page.getByTestId('sens-table').locator('tbody th').allTextContents()).map((t) => t.trim());
    expect(names).toEqual(sens.items.map((i) => i.assumption));
    await page.getByTestId('sens-table').scrollIntoViewIfNeeded();
    await shot(page, 'how-sure-03-sensitivity');
  });

  it('stops on Cancel without a result or an error, and the app carries on', async () => {
    const panel = page.getByTestId('how-sure');
    await panel.getByTestId('band-draws').fill('100000');
    await panel.getByTestId('band-compute').click();
    await panel.getByTestId('band-progress').waitFor();
    await panel.getByTestId('band-cancel').click();
    await expect.poll(() => panel.getByTestId('band-progress').count(), { timeout: 10_000 }).toBe(0);
    expect(await panel.getByTestId('band-summary').count()).toBe(0);
    expect(await panel.locator('.message.error').count()).toBe(0);
    await panel.getByTestId('band-draws').fill('50');
    await panel.getByTestId('band-compute').click();
    await panel.getByTestId('band-summary').waitFor({ timeout: 30_000 });
    expect(s.errors).toEqual([]);
  });

  it('draws FLQ δ on a table taken from the Larger-table screen as the study does with the estimate\'s inputs, and says so', async () => {
    await page.click('[data-screen="import"]');
    await page.getByTestId('start-larger').click();
    await page.click('[data-method="flq"]');
    await page.getByTestId('delta').fill('0.3');
    await page.getByTestId('regional-sectors').waitFor({ timeout: 30_000 });
    await page.getByTestId('regional-accept').click();
    await expect.poll(() => page.getByTestId('table-name').textContent(), { timeout: 30_000 }).toMatch(/fernhollow-flq-estimate/);
    await page.click('[data-screen="scenarios"]');
    const panel = page.getByTestId('how-sure');
    await panel.waitFor({ timeout: 30_000 });
    // Offered only for such a table, off by default (as the CLI draws δ only with --delta-range), range δ ± 0.1.
    expect(await panel.getByTestId('band-draw-delta').isChecked()).toBe(false);
    expect([await panel.getByTestId('band-delta-low').inputValue(), await panel.getByTestId('band-delta-high').inputValue()]).toEqual(['0.2', '0.4']);
    await panel.getByTestId('band-draw-delta').check();
    await panel.getByTestId('band-delta-high').fill('0.45');
    await compute(100, 5, 0.05);

    // The same estimate, made here by the worker's own function, and its bands by the study layer with the same seed.
    const national = { text: NATIONAL_SAMPLE_CSV, fileName: NATIONAL_SAMPLE_FILE_NAME };
    const employment = { text: EMPLOYMENT_SAMPLE_CSV, fileName: EMPLOYMENT_SAMPLE_FILE_NAME };
    const est = buildRegional({ national, employment, method: 'flq', delta: 0.3, balance: null, groups: null, bridge: null });
    const county = prepareStudy(studyFromTableFile(utf8Bytes(est.result.csv), est.result.fileName));
    const bytes = (f: { text: string; fileName: string }) => ({ bytes: utf8Bytes(f.text), fileName: f.fileName });
    const scenario: Scenario = onePhase('New food plant', [{ sector: 'Food processing', amount: 1000, kind: 'final-demand', localShare: 1 }]);
    const settings = defaultUncertaintySettings({ draws: 100, seed: 5, cv: 0.05, deltaRange: [0.2, 0.45] });
    const run = beginStudyBands(county, { settings, multipliers: false, scenarios: [scenario] }, flqOriginOf(county.study.table, bytes(national), bytes(employment), 0.3));
    run.step(0, 100);
    const ref = run.finish();
    expect(ref.deltaDraws).toBe(100);
    const out = ref.scenarios[0]!.totals.output!;
    const row = page.getByTestId('band-totals').locator('tr[data-variable="output"] td');
    expect((await row.allTextContents()).slice(0, 5).map((t) => t.trim())).toEqual([out.point, out.p5, out.p50, out.p95, out.mean].map(money));
    const said = (await panel.getByTestId('band-delta').textContent())!.replace(/\s+/g, ' ');
    expect(said).toContain('FLQ δ drawn uniformly from 0.2 to 0.45 in 100 of the 100 draws');
    expect(said).toContain(`δ of the draws kept: ${ref.deltaDrawn![0].toFixed(4)} to ${ref.deltaDrawn![1].toFixed(4)}`);
    expect(await panel.getByTestId('band-summary').textContent()).toMatch(new RegExp(`100 draws, seed 5, CV 0.05, FLQ δ 0.2–0.45:\\s+${ref.accepted} kept`));
    await panel.getByTestId('band-summary').scrollIntoViewIfNeeded();
    await shot(page, 'how-sure-04-delta-draws');
    expect(s.errors).toEqual([]);
  }, 120_000);
});

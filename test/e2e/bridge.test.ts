/**
 * The Scenarios screen's classification bridge in real Chromium on the sample county: the bundled (invented) bridge is
 * read and what it covers is shown; a shock file by codes becomes a new scenario whose total is the study layer's,
 * called here on the same files (the CLI's --bridge path); a bridge whose shares do not sum to 1 and a shock file with
 * a code the bridge lacks are refused on screen with the located message. A shock file by sector labels is read the
 * same way without a bridge ("Read a shock file…"). Screenshots: test-output/screenshots/bridge-*.png.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { goTo, money, openApp, shot, skipBrowser, type Session } from './harness.ts';
import {
  BRIDGE_SAMPLE_CSV, BRIDGE_SAMPLE_FILE_NAME, prepareStudy, readBridge, runStudyScenario, SAMPLE_CSV, SAMPLE_FILE_NAME, shockFromFile, studyFromTableFile, utf8Bytes,
} from '../../src/study/index.ts';

let s: Session;
let page: Page;

// Invented codes of the sample bridge: FH-05 Construction, FH-12 split 0.4 Real estate / 0.6 Professional services.
const SHOCK = 'sector,amount,kind,local_share\nFH-05,12000,final-demand,0.8\nFH-12,500,final-demand,1\n';
const csv = (name: string, text: string) => ({ name, mimeType: 'text/csv', buffer: Buffer.from(text, 'utf8') });
const poll = <T>(fn: () => T | Promise<T>) => expect.poll(fn, { interval: 100, timeout: 30_000 });

describe.skipIf(skipBrowser)('classification bridge on the Scenarios screen', () => {
  beforeAll(async () => {
    s = await openApp();
    page = s.page;
    await goTo(page, 'scenarios');
  });
  afterAll(async () => { await s?.close(); });

  it('reads the bundled bridge and says what it covers', async () => {
    await page.getByTestId('code-bridge-panel').locator('summary').click();
    await page.getByTestId('code-bridge-sample').click();
    await poll(() => page.getByTestId('code-bridge-summary').textContent()).toMatch(/16 codes, 1 split by shares,\s+reaching 16 of the table's 16 sectors/);
    expect(await page.getByTestId('code-bridge-name').textContent()).toContain(BRIDGE_SAMPLE_FILE_NAME);
  });

  it('turns a shock file by codes into a new scenario with the study layer\'s numbers', async () => {
    await page.getByTestId('code-bridge-shock-file').setInputFiles(csv('plant-by-code.csv', SHOCK));
    await poll(() => page.getByTestId('code-bridge-done').textContent()).toMatch(/plant-by-code\.csv → scenario “plant-by-code”: 3 lines by sector in 1 phase/);
    await poll(() => page.getByTestId('scenario-list').textContent()).toContain('plant-by-code');
    const ps = prepareStudy(studyFromTableFile(utf8Bytes(SAMPLE_CSV), SAMPLE_FILE_NAME, {}), { spectrum: false });
    const bridge = readBridge({ bytes: utf8Bytes(BRIDGE_SAMPLE_CSV), fileName: BRIDGE_SAMPLE_FILE_NAME }, ps.study.table.sectors);
    const want = runStudyScenario(ps, shockFromFile(SHOCK, 'plant-by-code.csv', bridge)).phases[0]!.result.totals.output.total;
    await poll(() => page.getByTestId('total-effect').textContent()).toBe(money(want));
    await page.getByTestId('code-bridge-panel').scrollIntoViewIfNeeded();
    await shot(page, 'bridge-shock-read');
  });

  it('refuses a code the bridge lacks and a bridge whose shares do not sum to 1, with located messages', async () => {
    await page.getByTestId('code-bridge-shock-file').setInputFiles(csv('typo.csv', SHOCK.replace('FH-12', 'FH-21')));
    await poll(() => page.getByTestId('code-bridge-error').textContent()).toBe(`typo.csv:3 (row 'FH-21'): code 'FH-21' is not in the bridge ${BRIDGE_SAMPLE_FILE_NAME} (every code of the file needs a row code,sector[,share] there)`);
    await page.getByTestId('code-bridge-file').setInputFiles(csv('halves.csv', 'code,sector,share\nFH-12,Real estate,0.4\nFH-12,Professional services,0.5\n'));
    await poll(() => page.getByTestId('code-bridge-error').textContent()).toMatch(/^halves\.csv:2:3 \(row 'FH-12'\): the shares of code 'FH-12' sum to 0\.9, not 1/);
    // The shock reader waits for a bridge that reads.
    expect(await page.getByTestId('code-bridge-shock-file').isDisabled()).toBe(true);
    expect(await page.locator('body').innerText()).not.toMatch(/\bNaN\b|Infinity/);
    await page.getByTestId('code-bridge-panel').scrollIntoViewIfNeeded();
    await shot(page, 'bridge-refused');
  });

  it('reads a shock file by sector labels, without a bridge, as a new scenario with the study layer\'s numbers; refuses a sector the table lacks', async () => {
    const plain = 'sector,amount,kind,local_share\nConstruction,12000,final-demand,0.8\nReal estate,200,final-demand,1\n';
    await page.getByTestId('shock-file').setInputFiles(csv('plant-by-sector.csv', plain));
    await poll(() => page.getByTestId('shock-file-done').textContent()).toMatch(/plant-by-sector\.csv → scenario “plant-by-sector”: 2 lines by sector in 1 phase/);
    const ps = prepareStudy(studyFromTableFile(utf8Bytes(SAMPLE_CSV), SAMPLE_FILE_NAME, {}), { spectrum: false });
    const want = runStudyScenario(ps, shockFromFile(plain, 'plant-by-sector.csv', null)).phases[0]!.result.totals.output.total;
    await poll(() => page.getByTestId('total-effect').textContent()).toBe(money(want));
    await page.getByTestId('shock-file').setInputFiles(csv('typo.csv', plain.replace('Real estate', 'Real estat')));
    await poll(() => page.getByTestId('shock-file-error').textContent()).toMatch(/^typo\.csv:3:1 \(row 'Real estat'.*unknown sector 'Real estat'/);
    expect(await page.locator('body').innerText()).not.toMatch(/\bNaN\b|Infinity/);
    await shot(page, 'scenario-shock-file-read');
    expect(s.errors).toEqual([]);
  });
});

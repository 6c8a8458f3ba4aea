/**
 * The brief (PDF) and the workbook (XLSX) from the app: made in the worker by the study layer's one function each
 * (the CLI's --brief and --xlsx call the same), saved through the bridge (a save dialog on the desktop, one download
 * in the browser). The brief's fonts are bundled with the app (as modules loaded on first use, so nothing is fetched)
 * and handed to the worker.
 */
import { nextTick, reactive } from 'vue';
import type { BriefDocument, BriefFonts, Paper } from '../../src/study/index.ts';
import { getBridge } from '../bridge/index.ts';
import { engine } from '../worker/client.ts';
import type { ScenarioDraft } from '../worker/protocol.ts';
import { app, choices, say } from './app.ts';

let fonts: Promise<BriefFonts> | null = null;

/** The bytes of a `data:…;base64,` URL (what Vite's `?inline` gives for a binary asset). */
function dataUrlBytes(url: string): Uint8Array {
  const bin = atob(url.slice(url.indexOf(',') + 1));
  const out = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) out[i] = bin.charCodeAt(i);
  return out;
}

function briefFonts(): Promise<BriefFonts> {
  fonts ??= Promise.all([
    import('dejavu-fonts-ttf/ttf/DejaVuSansCondensed.ttf?inline'),
    import('dejavu-fonts-ttf/ttf/DejaVuSansCondensed-Bold.ttf?inline'),
  ]).then(([regular, bold]) => ({ regular: dataUrlBytes(regular.default), bold: dataUrlBytes(bold.default) }));
  fonts.catch(() => { fonts = null; });
  return fonts;
}

/** Bytes as base64, in slices (String.fromCharCode takes a bounded argument list). */
export function bytesToBase64(bytes: Uint8Array): string {
  let bin = '';
  for (let i = 0; i < bytes.length; i += 0x8000) bin += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(bin);
}

const plain = <T>(v: T): T => JSON.parse(JSON.stringify(v)) as T;

/** The paper size a brief is made for: US Letter where the user's locale uses it, else A4. */
export function defaultPaper(locale = typeof navigator === 'undefined' ? 'en' : navigator.language): Paper {
  return /-(US|CA|MX|PH|CL|CO|VE|GT|CR|PA|DO|PR|SV|NI)$/i.test(locale) ? 'letter' : 'a4';
}

/** Make the scenario's brief in the worker. */
export async function makeBrief(scenario: ScenarioDraft, paper: Paper): Promise<{ name: string; pdf: Uint8Array; document: BriefDocument }> {
  return engine().call('brief', { scenario: plain(scenario), scenarios: plain(app.scenarios), choices: choices(), paper, fonts: await briefFonts() }, 'Writing the brief…');
}

export async function exportBrief(scenario: ScenarioDraft, paper: Paper): Promise<void> {
  const b = await makeBrief(scenario, paper);
  const saved = await getBridge().exportFile(b.name, 'pdf', bytesToBase64(b.pdf));
  if (saved) say(`Saved ${saved.name}`);
}

export async function exportWorkbook(scenario: ScenarioDraft | undefined): Promise<void> {
  const w = await engine().call('workbook', { ...(scenario ? { scenario: plain(scenario) } : {}), scenarios: plain(app.scenarios), choices: choices() }, 'Writing the workbook…');
  const saved = await getBridge().exportFile(w.name, 'xlsx', bytesToBase64(w.xlsx));
  if (saved) say(`Saved ${saved.name}`);
}

/** The brief the print view shows (renderer/components/BriefPrint.vue): hidden on screen, the only thing printed. */
export const printing = reactive<{ document: BriefDocument | null }>({ document: null });

/** Ctrl/Cmd+P: the brief of the selected scenario, printed through the system's print dialog. */
export async function printBrief(): Promise<void> {
  const scenario = app.scenarios[app.selected] ?? app.scenarios[0];
  if (!scenario) return;
  printing.document = (await makeBrief(scenario, defaultPaper())).document;
  await nextTick();
  window.print();
}

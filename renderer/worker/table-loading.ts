/**
 * The worker's side of the Import screen: a table file (or text) previewed under the screen's settings, then made the
 * study in use, keeping the study's other inputs. A picked file is read and hashed once, and the study of its last
 * preview is prepared while the planner reads that preview, so "Use this table" at 2,000 sectors rarely waits for it.
 */
import {
  prepareStudy, previewTable as enginePreview, previewTableBytes, SAMPLE_CSV, SAMPLE_FILE_NAME, SAMPLE_NOTE, sha256HexPortable, studyFromImportedTable,
  studyFromTableFile, usePlatformSha256, utf8Bytes, withTable, type ImportSettings, type IOTable, type PreparedStudy, type Study,
} from '../../src/study/index.ts';
import type { AnalysisView, FileSource, PreviewView, ScenarioDraft, StudyContent, TableInfo, TableSource, TextSource } from './protocol.ts';
import { analysisView, previewView, tableInfo } from './views.ts';
import { contentOf } from './study-content.ts';
import { currentOrNull, keepStudy } from './study-state.ts';

export interface Loaded { table: TableInfo; analysis: AnalysisView; starter: ScenarioDraft; content: StudyContent }

/** The engine's import settings of a table source, as the Import screen set them. */
function importSettings(src: TableSource): ImportSettings {
  return {
    ...(src.roles ? { roles: src.roles } : {}), ...(src.layout ? { layout: src.layout as ImportSettings['layout'] } : {}), ...(src.name ? { name: src.name } : {}),
    ...(src.delimiter ? { delimiter: src.delimiter } : {}), ...(src.decimalMark ? { decimalMark: src.decimalMark } : {}),
  };
}

/** The engine's import options for a table source: its file name (located messages) and the screen's settings. */
function importOptions(src: TableSource): ImportSettings & { fileName: string } {
  return { fileName: src.fileName, ...importSettings(src) };
}

/** The first scenario offered for a table: a food plant's yearly demand where the table has a food sector. */
function starter(study: Study): ScenarioDraft {
  const s = study.table.sectors;
  const food = s.find((x) => /food/i.test(x));
  return {
    name: food ? 'New food plant' : 'Example scenario',
    phases: [{ name: food ? 'Operating' : 'Phase 1', timing: food ? 'annual' : 'once', lines: [{ sector: food ?? s[0] ?? '', amount: 1000, kind: 'final-demand', localShare: 1 }] }],
  };
}

/** The study prepared (factorisation, analysis) and what the screens get of it, without making it the worker's state. */
function prepared(study: Study): { ps: PreparedStudy; views: Loaded } {
  const ps = prepareStudy(study);
  return { ps, views: { table: tableInfo(study, study.source?.fileName ?? study.table.name), analysis: analysisView(ps), starter: starter(study), content: contentOf(study) } };
}

/** Make `study` the one in use, prepared; what the screens get of it. */
export function load(study: Study): Loaded {
  const { ps, views } = prepared(study);
  keepStudy(ps);
  dropPreview({}); // what was read or prepared ahead for a preview belongs to the state before
  return views;
}

/**
 * Import the table file's bytes under the source's settings and make it the study (keeping the study's other inputs);
 * `table`: what the preview of the same bytes and settings read, taken instead of reading them again.
 */
function studyOfBytes(bytes: Uint8Array, src: TableSource, table: IOTable | null = null): Study {
  const study = table ? studyFromImportedTable(bytes, src.fileName, importSettings(src), table) : studyFromTableFile(bytes, src.fileName, importSettings(src));
  if (src.derivedFrom?.length) study.source = { ...study.source!, derivedFrom: src.derivedFrom.map((o) => ({ ...o })) };
  const ps = currentOrNull();
  return ps ? withTable(ps.study, study) : study;
}

function loadTable(src: TextSource): Loaded {
  return load(studyOfBytes(utf8Bytes(src.text), src));
}

function previewTable(src: TextSource): PreviewView {
  dropPreview({});
  return previewView(enginePreview(src.text, importOptions(src)), src);
}

/**
 * The last picked file the worker read: its bytes, as the file holds them, and their SHA-256. A file is previewed,
 * perhaps with other roles, then imported: it is read and hashed once. The bytes are what the study keeps and
 * fingerprints (the CLI's rule: the SHA-256 of the file itself, byte order mark and all); the table is read from
 * them as UTF-8 text by the engine, which decodes only what it cannot read from the bytes themselves. The hash is the
 * platform's (Web Crypto), started as soon as the file is read, so it is ready by the time "Use this table" is pressed.
 */
let lastFile: { id: string; bytes: Uint8Array; sha256: Promise<string> } | null = null;

async function readFile(src: FileSource): Promise<NonNullable<typeof lastFile>> {
  if (lastFile?.id === src.id) return lastFile;
  lastFile = null;
  const bytes = new Uint8Array(await src.file.arrayBuffer());
  lastFile = { id: src.id, bytes, sha256: platformSha256(bytes) };
  return lastFile;
}

/** Hex SHA-256 by Web Crypto (native, off this thread), or the engine's own code where Web Crypto is missing. */
async function platformSha256(bytes: Uint8Array): Promise<string> {
  const subtle = globalThis.crypto?.subtle;
  if (!subtle) return sha256HexPortable(bytes);
  const digest = new Uint8Array(await subtle.digest('SHA-256', bytes as Uint8Array<ArrayBuffer>));
  return Array.from(digest, (b) => b.toString(16).padStart(2, '0')).join('');
}

/**
 * The table the last preview of a picked file read, and the settings it was read under: "Use this table" right after
 * takes it instead of reading 20 MB again (the preview reads the bytes as the import does: previewTableBytes).
 */
interface PreviewRead { id: string; settings: string; table: IOTable }
let lastPreview: PreviewRead | null = null;
const settingsKey = (src: TableSource) => JSON.stringify([src.fileName, importSettings(src)]);

async function previewFile(src: FileSource): Promise<PreviewView> {
  const f = await readFile(src);
  dropPreview({});
  const p = previewTableBytes(f.bytes, importOptions(src));
  if (p.table) {
    const preview: PreviewRead = { id: src.id, settings: settingsKey(src), table: p.table };
    lastPreview = preview;
    const from = currentOrNull();
    setTimeout(() => { void prepareAhead(src, preview, from).catch(() => undefined); }, 0); // after this answer is sent
  }
  return previewView(p, src);
}

/**
 * The study of the last previewed file, prepared while the planner reads the preview (its factorisation and analysis
 * are most of "Use this table" at 2,000 sectors), with the worker's state it was made from: loadFile takes it when
 * that preview is the one accepted and the state is unchanged; anything else discards it. A refusal is left to
 * loadFile to report.
 */
let ahead: { preview: PreviewRead; from: PreparedStudy | null; ps: PreparedStudy; views: Loaded } | null = null;

async function prepareAhead(src: FileSource, preview: PreviewRead, from: PreparedStudy | null): Promise<void> {
  const f = await readFile(src);
  const hex = await f.sha256;
  if (lastPreview !== preview || currentOrNull() !== from) return; // another preview, or another table, came first
  const r = withSha256(f.bytes, hex, () => prepared(studyOfBytes(f.bytes, src, preview.table)));
  if (lastPreview === preview && currentOrNull() === from) ahead = { preview, from, ...r };
}

/** The preview is gone (discarded, or another file previewed): so is what was read or prepared for it. */
function dropPreview(_: Record<string, never>): void {
  lastPreview = null;
  ahead = null;
}

/** Run `fn` with the study fingerprinting `bytes` by the hash already made; anything else is hashed as usual. */
function withSha256<T>(bytes: Uint8Array, hex: string, fn: () => T): T {
  usePlatformSha256((d) => (d === bytes ? hex : sha256HexPortable(d)));
  try {
    return fn();
  } finally {
    usePlatformSha256(null);
  }
}

async function loadFile(src: FileSource): Promise<Loaded> {
  const f = await readFile(src);
  const hex = await f.sha256;
  const settings = settingsKey(src);
  const done = ahead?.preview.id === src.id && ahead.preview.settings === settings && ahead.from === currentOrNull() ? ahead : null;
  const table = lastPreview?.id === src.id && lastPreview.settings === settings ? lastPreview.table : null;
  dropPreview({});
  if (done) {
    keepStudy(done.ps);
    return done.views;
  }
  return withSha256(f.bytes, hex, () => load(studyOfBytes(f.bytes, src, table)));
}

/** No file read, no preview: the worker as it starts (with resetWorker in compute.ts). */
export function forgetFiles(): void {
  lastFile = null;
  dropPreview({});
}

export const tableLoadingApi = {
  loadSample(_: Record<string, never>): Loaded & { source: TableSource; note: string } {
    const source: TextSource = { text: SAMPLE_CSV, fileName: SAMPLE_FILE_NAME, name: 'Fernhollow County (invented sample)' };
    return { ...loadTable(source), source, note: SAMPLE_NOTE };
  },
  previewTable,
  previewFile,
  loadTable,
  loadFile,
  dropPreview,
};

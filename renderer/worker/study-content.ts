/**
 * The worker's side of the study's input files (spending mixes, activities, margins, a price index, commuting): read,
 * edited and undone on the Scenarios screen, each change checked by the study layer as a save would check it.
 */
import {
  checkStudyInputs, InputError, mixesFromFile, mixesOfTable, parseActivityCsv, parseCommutingCsv, parseMarginsCsv, parsePriceIndexCsv,
  restudy, scenarioSlug, writeMixCsv, type Study,
} from '../../src/study/index.ts';
import type { StudyContent, StudyContentView, StudyInputKind, StudyInputsView } from './protocol.ts';
import { tableInfo } from './views.ts';
import { bridgeOf } from './bridges.ts';
import type { RegionalFile } from './regional.ts';
import { current, keepStudy } from './study-state.ts';

/** The study's input files in words, for the Scenarios screen. */
export function studyInputsView(study: Study): StudyInputsView {
  const names = (list: { name: string }[], one: string, many: string) => (list.length ? `${list.length} ${list.length === 1 ? one : many}: ${list.map((x) => x.name).join(', ')}` : null);
  const m = study.margins;
  const idx = study.prices.index;
  const years = idx ? idx.points.map((p) => p.year).sort((a, b) => a - b) : [];
  return {
    mix: names(study.mixes, 'mix', 'mixes'),
    activity: names(study.activities, 'activity', 'activities'),
    margins: m ? `${m.rows.length} sector${m.rows.length === 1 ? '' : 's'} with margins; retail earned by ${m.sectors.retail ?? '—'}, wholesale by ${m.sectors.wholesale ?? '—'}, transport by ${m.sectors.transport ?? '—'}` : null,
    'price-index': years.length ? `${years.length} year${years.length === 1 ? '' : 's'}, ${years[0]}–${years.at(-1)}` : null,
    commuting: study.commuting.sectors.length ? `${study.commuting.sectors.length} sector${study.commuting.sectors.length === 1 ? '' : 's'} listed` : null,
  };
}

/** File origins say where a file's rows were; content the app keeps (and edits, and undoes) has none. */
const ORIGIN_KEYS = new Set(['origin', 'itemOrigins', 'sectorOrigin']);
function withoutOrigins<T>(x: T): T {
  return JSON.parse(JSON.stringify(x, (k, v: unknown) => (ORIGIN_KEYS.has(k) ? undefined : v))) as T;
}

export function contentOf(study: Study): StudyContent {
  return withoutOrigins({ mixes: study.mixes, activities: study.activities, margins: study.margins, priceIndex: study.prices.index, commuting: study.commuting.sectors });
}

/** Keep the study with new content, checked by the study layer as a save would be (located refusals; nothing kept then). */
function useContent(study: Study): StudyContentView {
  checkStudyInputs(study);
  keepStudy(restudy(current(), study));
  return { table: tableInfo(study, study.source?.fileName ?? study.table.name), inputs: studyInputsView(study), content: contentOf(study) };
}

/**
 * Read one of the study's input files (replacing the one before; spending mixes and activities of the same name are
 * replaced, others kept), or remove it (`text` null). Checked against the table like a save would (located refusals).
 * A mix file may name codes of an outside classification, read through `bridge` (`code,sector[,share]`).
 */
function setStudyInput(args: { kind: StudyInputKind; text: string | null; fileName: string; bridge?: RegionalFile | null }): StudyContentView {
  const study: Study = { ...current().study };
  const { kind, text, fileName } = args;
  const keep = <T extends { name: string }>(old: T[], add: T[]) => [...old.filter((x) => !add.some((y) => y.name === x.name)), ...add];
  if (kind === 'mix') study.mixes = text === null ? [] : keep(study.mixes, mixesFromFile(text, fileName, args.bridge ? bridgeOf(args.bridge, study.table.sectors) : null));
  else if (kind === 'activity') study.activities = text === null ? [] : keep(study.activities, parseActivityCsv(text, fileName));
  else if (kind === 'margins') study.margins = text === null ? null : parseMarginsCsv(text, fileName);
  else if (kind === 'price-index') study.prices = { ...study.prices, index: text === null ? null : parsePriceIndexCsv(text, fileName) };
  else study.commuting = { ...study.commuting, sectors: text === null ? [] : parseCommutingCsv(text, fileName) };
  return useContent(study);
}

/** The study's content as the app's editors (or undo) leave it: every part replaced, then checked as a whole. */
function setStudyContent(c: StudyContent): StudyContentView {
  const study = current().study;
  return useContent({
    ...study, mixes: c.mixes, activities: c.activities, margins: c.margins,
    prices: { ...study.prices, index: c.priceIndex }, commuting: { ...study.commuting, sectors: c.commuting },
  });
}

/** Spending mixes as a mix file (writeMixCsv: mix,sector,share; `names` null: the study's own), for the app's export. */
function mixFile(args: { names: string[] | null }): { name: string; text: string } {
  const { study } = current();
  const all = [...study.mixes, ...mixesOfTable(study.table)];
  const mixes = args.names === null ? study.mixes : args.names.map((n) => {
    const m = all.find((x) => x.name === n);
    if (!m) throw new InputError('unknown-mix', `the study has no spending mix '${n}'`, { rowLabel: n });
    return m;
  });
  if (mixes.length === 0) throw new InputError('empty', 'the study has no spending mixes of its own to export');
  return { name: `${scenarioSlug(mixes.length === 1 ? mixes[0]!.name : `${study.name || study.table.name} mixes`)}.csv`, text: writeMixCsv(mixes) };
}

export const studyContentApi = { setStudyInput, setStudyContent, mixFile };

/**
 * The deliverable options: `--brief FILE.pdf` and `--paper` (scenario) and `--xlsx FILE.xlsx` (scenario and analyze),
 * made by the study layer's one function each (studyBrief, studyWorkbook, as in the app) and written atomically with
 * the other outputs of the run.
 */
import { readBriefFonts } from '../../node-io/index.ts';
import { PAPERS, studyBrief, studyWorkbook, type Paper, type PreparedStudy, type ScenarioOutcome } from '../../study/index.ts';
import type { NamedFile, RunContext } from '../command.ts';

export const BRIEF_OPTIONS = {
  brief: { type: 'string', value: 'BRIEF.pdf', help: 'write the scenario\'s brief: headline per phase, the sectors most affected with a chart, multipliers, inputs, model choices and the cautions, as a PDF (three pages for one phase, about one more per further phase)' },
  paper: { type: 'string', value: 'a4|letter', choices: PAPERS, help: 'the brief\'s paper size: a4 (default) or letter (US Letter)' },
} as const;

export const XLSX_OPTION = {
  xlsx: { type: 'string', value: 'BOOK.xlsx', help: 'write the reports as one spreadsheet workbook: a sheet per report with numbers at full precision, the provenance and the cautions' },
} as const;

function checkExtension(path: string, ext: string, option: string, ctx: RunContext): void {
  if (!path.toLowerCase().endsWith(ext)) throw ctx.usageError(`--${option}: the file name must end in ${ext} (got '${path}')`);
}

/** The brief and the workbook the values ask for, as files to write. */
export async function deliverableFiles(
  ps: PreparedStudy, o: ScenarioOutcome | null, values: { brief?: string | undefined; paper?: string | undefined; xlsx?: string | undefined }, ctx: RunContext,
): Promise<NamedFile[]> {
  const files: NamedFile[] = [];
  if (values.paper !== undefined && values.brief === undefined) throw ctx.usageError('--paper sets the size of the brief: add --brief BRIEF.pdf');
  if (values.brief !== undefined && o) {
    checkExtension(values.brief, '.pdf', 'brief', ctx);
    files.push({ path: values.brief, content: await studyBrief(ps, o, { date: ctx.date, paper: (values.paper ?? 'a4') as Paper, fonts: readBriefFonts() }) });
  }
  if (values.xlsx !== undefined) {
    checkExtension(values.xlsx, '.xlsx', 'xlsx', ctx);
    files.push({ path: values.xlsx, content: await studyWorkbook(ps, o, { date: ctx.date }) });
  }
  return files;
}

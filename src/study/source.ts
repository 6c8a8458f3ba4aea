/**
 * Where a study's table came from, as reports, summaries and the brief say it: the source file and its SHA-256, and
 * for a table derived from a supply and use pair, both files of the pair with theirs (the one rule of provenance).
 */
import type { SourceOrigin } from '../report/index.ts';
import type { Study } from './study.ts';

const WHAT = { supply: 'Supply table', use: 'Use table' } as const;

/** The pair a study's table was derived from, named for reports ("Supply table", "Use table"); empty otherwise. */
export function sourceOriginsOf(study: Pick<Study, 'source'>): SourceOrigin[] {
  return (study.source?.derivedFrom ?? []).map((o) => ({ what: WHAT[o.role], fileName: o.fileName, sha256: o.sha256 }));
}

/** The report context's source fields for a study. */
export function sourceContext(study: Pick<Study, 'source'>): { sourceFile?: string; sourceHash?: string; sourceOrigins?: SourceOrigin[] } {
  const src = study.source;
  if (!src) return {};
  const origins = sourceOriginsOf(study);
  return { sourceFile: src.fileName, sourceHash: src.sha256, ...(origins.length ? { sourceOrigins: origins } : {}) };
}

/**
 * The brief's fonts read from the dejavu-fonts-ttf package (a dependency, so present beside both the sources and the
 * CLI bundle): resolved from this module, read through the one reader.
 */
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { BRIEF_FONT_FILES, type BriefFonts } from '../deliverables/index.ts';
import { readFileLimited } from './read.ts';

export function readBriefFonts(): BriefFonts {
  const dir = join(dirname(createRequire(import.meta.url).resolve('dejavu-fonts-ttf/package.json')), 'ttf');
  return {
    regular: readFileLimited(join(dir, BRIEF_FONT_FILES.regular.file)).bytes,
    bold: readFileLimited(join(dir, BRIEF_FONT_FILES.bold.file)).bytes,
  };
}

/**
 * Node I/O for the CLI (src/cli) and the desktop shell (main/): the one atomic writer, the one reader with its size
 * limit, and the one table of file-system errors in words. Node built-ins are allowed here; nothing else in src/
 * may import this folder (lint-checked), so the engine stays pure.
 */
export { errnoCode, fileError, fsReason } from './errors.ts';
export { MAX_INPUT_BYTES, readFileLimited, type FileIdentity, type ReadFile, type ReadOptions } from './read.ts';
export { refuseInputOverwrite, removeStaleTemps, resolveWriteTarget, sameFileAs, TMP_SUFFIX, writeFileAtomic, type AtomicWriteOptions } from './write.ts';
export { readBriefFonts } from './fonts.ts';

/** Types of freshness.mjs (plain JavaScript: the launcher runs it before tsx could be loaded). */
export function bundleIsFresh(bundle: string, src: string, installed: boolean): boolean;

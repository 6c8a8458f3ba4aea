/** Types of code-cache.mjs (plain JavaScript: the launcher runs it before the bundle or tsx could be loaded). */
export const IMPORT_META_URL: string;
export function cacheFileOf(bundle: string): string;
export function loadBundle(bundle: string, opts?: { useCache?: boolean }): {
  exports: Record<string, unknown>;
  cache: 'used' | 'rejected' | 'none';
  saveCache(): void;
};

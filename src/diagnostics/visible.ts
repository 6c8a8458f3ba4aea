/**
 * Text from a file shown to a person (terminal, message, report): characters that would act instead of show are
 * written as escapes, so a label cannot move the cursor, recolour the terminal, reverse the text around it or hide
 * a difference between two labels. Covered: C0 and C1 controls and DEL (terminal escape sequences start with ESC
 * U+001B or CSI U+009B), the Unicode bidirectional controls (Unicode Standard Annex #9: LRM, RLM, ALM, the embeddings
 * and overrides U+202A–U+202E, the isolates U+2066–U+2069; "Trojan Source", CVE-2021-42574), the line and paragraph
 * separators, and the invisible zero-width space and mid-text byte-order mark.
 */
const SHOWN_AS_ESCAPE = /[\u0000-\u001f\u007f-\u009f\u061c\u200b\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069\ufeff]/g;

const SHORT: Record<string, string> = { '\n': '\\n', '\r': '\\r', '\t': '\\t' };

function escapeOne(c: string): string {
  return SHORT[c] ?? `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`;
}

/** `s` with every acting character escaped (`\n`, `\t`, `\u001b`, `\u202e`), except those listed in `keep`. */
export function visibleText(s: string, keep = ''): string {
  return s.replace(SHOWN_AS_ESCAPE, (c) => (keep.includes(c) ? c : escapeOne(c)));
}


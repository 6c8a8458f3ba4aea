/**
 * A number typed into one of the study-input editors: the text as typed, trimmed; a comma is read as the decimal mark
 * when there is no point. null when empty or not a finite number (the editor says which row; the ranges are the study
 * layer's to check, with the same messages as the files).
 */
export function numberOf(text: string): number | null {
  const t = text.trim();
  if (t === '') return null;
  const v = Number(t.includes('.') ? t : t.replace(',', '.'));
  return Number.isFinite(v) ? v : null;
}

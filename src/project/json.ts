/**
 * Deterministic JSON for project files: keys in the order given, arrays of plain values on one line, numbers in the
 * shortest form that reads back to the same double (ECMAScript Number::toString, what JSON.stringify uses), and −0
 * written as "-0" (JSON.parse gives −0 back; JSON.stringify would write 0). So parse(write(v)) has the same bits as v.
 */
export type Json = null | boolean | number | string | Json[] | { [key: string]: Json | undefined };

function num(n: number): string {
  if (!Number.isFinite(n)) throw new RangeError(`cannot write ${n} to a project file`);
  return Object.is(n, -0) ? '-0' : String(n);
}

function isFlat(a: Json[]): boolean {
  return a.every((v) => v === null || typeof v !== 'object');
}

export function writeJson(value: Json, indent = ''): string {
  if (value === null) return 'null';
  if (typeof value === 'number') return num(value);
  if (typeof value === 'string' || typeof value === 'boolean') return JSON.stringify(value);
  const inner = `${indent}  `;
  if (Array.isArray(value)) {
    if (value.length === 0) return '[]';
    if (isFlat(value)) return `[${value.map((v) => writeJson(v)).join(', ')}]`;
    return `[\n${value.map((v) => inner + writeJson(v, inner)).join(',\n')}\n${indent}]`;
  }
  const entries = Object.entries(value).filter(([, v]) => v !== undefined) as [string, Json][];
  if (entries.length === 0) return '{}';
  return `{\n${entries.map(([k, v]) => `${inner}${JSON.stringify(k)}: ${writeJson(v, inner)}`).join(',\n')}\n${indent}}`;
}

// Shared helpers for the table tests.
import { expect } from 'vitest';
import { InputError, type Location } from '../../../src/diagnostics/index.ts';
import { importTable, type ImportOptions } from '../../../src/table/index.ts';

/** A small balanced table (invented, for tests): rows sell to columns; every row and column adds up. */
export const BASE = [
  'thousand dollars,Farming,Mills,Services,Households,Exports,Total output',
  'Farming,10,40,5,20,25,100',
  'Mills,15,20,10,45,110,200',
  'Services,5,20,30,60,35,150',
  'Compensation of employees,30,60,50,,,',
  'Other value added,25,40,45,,,',
  'Imports,15,20,10,,,',
  'Employment (jobs),12,30,40,,,',
  'Total input,100,200,150,,,',
  '',
].join('\n');

export function replaceOnce(text: string, from: string, to: string): string {
  if (!text.includes(from)) throw new Error(`test setup: '${from}' not in text`);
  return text.replace(from, to);
}

/** Expect importTable to refuse with this code, message and location. */
export function expectRefusal(text: string, code: string, message: string | RegExp, location: Location, opts: Partial<ImportOptions> = {}): void {
  let err: unknown;
  try {
    importTable(text, { fileName: 't.csv', ...opts });
  } catch (e) {
    err = e;
  }
  expect(err).toBeInstanceOf(InputError);
  const ie = err as InputError;
  expect(ie.code).toBe(code);
  if (typeof message === 'string') expect(ie.message).toBe(message);
  else expect(ie.message).toMatch(message);
  expect(ie.location).toEqual({ file: 't.csv', ...location });
}

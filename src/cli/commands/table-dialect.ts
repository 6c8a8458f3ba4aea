/**
 * The table-dialect options of every command that reads a table: the delimiter and the decimal mark, for the files
 * whose first lines or numbers do not show them (the importer's guess and its warning are src/table/dialect.ts).
 */
import type { DecimalMark, Delimiter, ImportOptions } from '../../table/index.ts';

export const TABLE_DIALECT_OPTIONS = {
  delimiter: {
    type: 'string', value: 'D', choices: ['comma', 'semicolon', 'tab'],
    help: 'the table\'s field delimiter, when the guess from its first lines is wrong (a "sep=;" first line in the file also sets it)',
  },
  'decimal-mark': {
    type: 'string', value: 'M', choices: ['point', 'comma'],
    help: 'the table\'s decimal mark, when no number in it shows which it is (the import warns when it had to guess)',
  },
} as const;

const DELIMITERS: Record<string, Delimiter> = { comma: ',', semicolon: ';', tab: '\t' };
const MARKS: Record<string, DecimalMark> = { point: '.', comma: ',' };

/** The import options the two values ask for (nothing when they are not given). */
export function tableDialect(values: { delimiter: string | undefined; 'decimal-mark': string | undefined }): Pick<ImportOptions, 'delimiter' | 'decimalMark'> {
  return {
    ...(values.delimiter !== undefined ? { delimiter: DELIMITERS[values.delimiter]! } : {}),
    ...(values['decimal-mark'] !== undefined ? { decimalMark: MARKS[values['decimal-mark']]! } : {}),
  };
}

/**
 * One interface over the two FITS table kinds (binary tables, bintable.ts; ASCII tables,
 * ascii-table.ts): columns found by name without regard to case, numbers decoded on demand.
 */
import { openAsciiTable } from './ascii-table.js';
import { openBinTable } from './bintable.js';
import { hduError, type FitsHdu } from './parse.js';

export interface TableColumn {
  /** 1-based column number (the n of TTYPEn). */
  number: number;
  /** TTYPEn as written (trimmed); 'COLn' when absent. */
  name: string;
  /** TFORMn as written. */
  form: string;
  /** TUNITn, trimmed; undefined when absent. */
  unit?: string;
  /** Elements per row (1 for scalars; variable-length columns: 1, see rowValues). */
  repeat: number;
  /** Holds text ('A' columns). */
  isText: boolean;
  /** Variable-length array column (P or Q descriptors). */
  isVariable: boolean;
}

export interface FitsTable {
  hdu: FitsHdu;
  rows: number;
  columns: TableColumn[];
  /** Column by name, case-insensitive. */
  find(name: string): TableColumn | undefined;
  /** Every element of a numeric column, row after row (rows × repeat values), scaled, nulls → NaN. */
  values(column: TableColumn): Float64Array;
  /** The elements of one row of a numeric column (also for variable-length columns). */
  rowValues(column: TableColumn, row: number): Float64Array;
  /** A text column, one trimmed string per row. */
  strings(column: TableColumn): string[];
}

export function openTable(hdu: FitsHdu): FitsTable {
  if (hdu.kind === 'bintable') return openBinTable(hdu);
  if (hdu.kind === 'ascii-table') return openAsciiTable(hdu);
  return hduError(hdu, 'is not a table');
}

/**
 * TTYPEn of every column (trimmed; 'COLn' when absent), from the header alone and without
 * checking the row layout; undefined when TFIELDS is not valid (openTable says why).
 */
export function columnNames(hdu: FitsHdu): string[] | undefined {
  const count = hdu.header.integer('TFIELDS') ?? 0;
  if (count < 0 || count > 999) return undefined;
  return Array.from({ length: count }, (_, i) => hdu.header.string(`TTYPE${i + 1}`)?.trim() || `COL${i + 1}`);
}

/** Name → column look-up shared by both table kinds (first column of a name wins). */
export function columnFinder(names: readonly string[], column: (index: number) => TableColumn): (name: string) => TableColumn | undefined {
  const byName = new Map<string, number>();
  names.forEach((name, i) => {
    if (!byName.has(name.toLowerCase())) byName.set(name.toLowerCase(), i);
  });
  return (name) => {
    const i = byName.get(name.toLowerCase());
    return i === undefined ? undefined : column(i);
  };
}

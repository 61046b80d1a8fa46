/**
 * A column-described table, the one shape every catalogue exporter takes: each column has a
 * name (with its unit in the name where it has one, e.g. ra_deg), a unit string that astropy
 * and FITS understand (or null), a datatype and a description.
 */

export const COLUMN_TYPES = ['float64', 'int64', 'bool', 'string'] as const;
export type ColumnType = (typeof COLUMN_TYPES)[number];

export type Cell = number | string | boolean | null;

export interface ColumnSpec {
  name: string;
  /** FITS/astropy unit string (e.g. 'deg', 's', 'd'), or null for dimensionless/text. */
  unit: string | null;
  type: ColumnType;
  description: string;
}

export interface Table {
  columns: ColumnSpec[];
  /** One array per row, cells in column order; null = no value. */
  rows: Cell[][];
  /**
   * Table-level facts (worklist name, export time, caveats), written as header metadata. Keys
   * are at most 8 characters a–z 0–9 _ - so that FITS can hold them as keywords.
   */
  meta: Record<string, string>;
  /**
   * Caveats for whoever reads the file, one sentence each: ECSV meta `comments` and FITS
   * COMMENT cards (where astropy's Table.read puts both, as meta['comments']).
   */
  comments?: string[];
}

/** Throws when a cell does not fit its column's datatype (a programming error). */
export function checkTable(table: Table): void {
  for (const key of Object.keys(table.meta)) {
    if (!/^[a-z0-9_-]{1,8}$/.test(key)) throw new Error(`table meta key ${JSON.stringify(key)} must be 1–8 characters a–z 0–9 _ -`);
  }
  table.rows.forEach((row, r) => {
    if (row.length !== table.columns.length) throw new Error(`row ${r + 1} has ${row.length} cells for ${table.columns.length} columns`);
    row.forEach((cell, c) => {
      const col = table.columns[c];
      if (cell === null) return;
      const ok =
        col.type === 'float64' ? typeof cell === 'number' && !Number.isNaN(cell)
        : col.type === 'int64' ? Number.isSafeInteger(cell)
        : col.type === 'bool' ? typeof cell === 'boolean'
        : typeof cell === 'string';
      if (!ok) throw new Error(`row ${r + 1}, column ${col.name}: ${JSON.stringify(cell)} is not ${col.type}`);
    });
  });
}

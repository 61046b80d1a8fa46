/** The catalogue file formats and their serialisers (bytes, ready to write). */
import { tableToCsv } from './export-csv.js';
import { tableToEcsv } from './export-ecsv.js';
import { tableToFits } from './export-fits.js';
import type { Table } from './table.js';

export const CATALOGUE_FORMATS = ['csv', 'ecsv', 'fits'] as const;
export type CatalogueFormat = (typeof CATALOGUE_FORMATS)[number];

export function serialiseTable(table: Table, format: CatalogueFormat): Uint8Array {
  if (format === 'fits') return tableToFits(table);
  return new TextEncoder().encode(format === 'csv' ? tableToCsv(table) : tableToEcsv(table));
}

/** The format a file name's ending implies, or null. */
export function formatFromFileName(name: string): CatalogueFormat | null {
  const m = /\.(csv|ecsv|fits|fit|fts)$/i.exec(name);
  if (!m) return null;
  const ext = m[1].toLowerCase();
  return ext === 'csv' || ext === 'ecsv' ? ext : 'fits';
}

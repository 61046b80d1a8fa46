/**
 * Catalogue as CSV (RFC 4180): one header row of column names, then one row per spectrum.
 * Units live in the column names (ra_deg, exptime_s; z is dimensionless), so the file needs no
 * second header row and opens as-is in spreadsheets, pandas and astropy. Empty field = no value;
 * numbers are written in the shortest form that reads back to the same double.
 */
import { csvField } from './csv-field.js';
import { checkTable, type Cell, type Table } from './table.js';

function cellText(cell: Cell): string {
  if (cell === null || (typeof cell === 'number' && !Number.isFinite(cell))) return '';
  if (typeof cell === 'string') return csvField(cell);
  return String(cell);
}

export function tableToCsv(table: Table): string {
  checkTable(table);
  const lines = [table.columns.map((c) => csvField(c.name)).join(',')];
  for (const row of table.rows) lines.push(row.map(cellText).join(','));
  return `${lines.join('\r\n')}\r\n`;
}

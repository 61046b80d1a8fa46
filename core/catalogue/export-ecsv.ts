/**
 * Catalogue as ECSV 1.0 (Enhanced Character Separated Values, astropy APE 6: a YAML header
 * in '# ' comment lines giving each column's name, unit, datatype and description, then CSV
 * data), which astropy's Table.read(path, format='ascii.ecsv') reads with units. Strings in the
 * YAML header are written as JSON strings, which are valid YAML double-quoted scalars.
 */
import { csvField } from './csv-field.js';
import { checkTable, type Cell, type Table } from './table.js';

function cellText(cell: Cell): string {
  if (cell === null || (typeof cell === 'number' && !Number.isFinite(cell))) return '';
  if (typeof cell === 'boolean') return cell ? 'True' : 'False';
  // A quoted empty string is an empty text; an unquoted empty field is no value.
  if (typeof cell === 'string') return cell === '' ? '""' : csvField(cell);
  return String(cell);
}

export function tableToEcsv(table: Table): string {
  checkTable(table);
  const q = (s: string) => JSON.stringify(s);
  const header = ['%ECSV 1.0', '---', 'delimiter: \',\'', 'datatype:'];
  for (const c of table.columns) {
    const unit = c.unit ? `, unit: ${q(c.unit)}` : '';
    header.push(`- {name: ${q(c.name)}${unit}, datatype: ${c.type}, description: ${q(c.description)}}`);
  }
  const meta = Object.entries(table.meta);
  const comments = table.comments ?? [];
  if (meta.length || comments.length) {
    header.push('meta: !!omap');
    for (const [k, v] of meta) header.push(`- {${q(k)}: ${q(v)}}`);
    if (comments.length) header.push(`- {comments: [${comments.map(q).join(', ')}]}`);
  }
  header.push('schema: astropy-2.0');
  const lines = header.map((h) => `# ${h}`);
  lines.push(table.columns.map((c) => csvField(c.name)).join(','));
  for (const row of table.rows) lines.push(row.map(cellText).join(','));
  return `${lines.join('\n')}\n`;
}

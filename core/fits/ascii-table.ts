/**
 * ASCII tables (FITS 4.0 §7.2): each field starts at byte TBCOLn of its row and has the
 * Fortran-style TFORMn Aw, Iw, Fw.d, Ew.d or Dw.d; a field equal to TNULLn, or blank, is null
 * (NaN); physical value = TZEROn + TSCALn × field.
 */
import { checkElementCount, hduError, type FitsHdu } from './parse.js';
import { columnFinder, type FitsTable, type TableColumn } from './table.js';

interface AsciiColumn extends TableColumn {
  start: number;
  width: number;
  scale: number;
  zero: number;
  tnull?: string;
}

export function openAsciiTable(hdu: FitsHdu): FitsTable {
  const h = hdu.header;
  const rowBytes = hdu.axes[0] ?? 0;
  const rows = hdu.axes[1] ?? 0;
  const nfields = h.integer('TFIELDS') ?? 0;
  if (nfields < 0 || nfields > 999) hduError(hdu, `TFIELDS ${nfields} is not valid`);
  const columns: AsciiColumn[] = [];
  for (let n = 1; n <= nfields; n++) {
    const form = (h.string(`TFORM${n}`) ?? '').trim().toUpperCase();
    const m = /^([AIFED])(\d+)(\.\d+)?$/.exec(form);
    const start = (h.integer(`TBCOL${n}`) ?? 0) - 1;
    if (!m || start < 0) hduError(hdu, `column ${n} has an invalid TFORM${n} '${form}' or TBCOL${n}`);
    const width = Number(m![2]);
    if (start + width > rowBytes) hduError(hdu, `column ${n} runs past the end of the row`);
    columns.push({
      number: n,
      name: h.string(`TTYPE${n}`)?.trim() || `COL${n}`,
      form,
      unit: h.string(`TUNIT${n}`)?.trim() || undefined,
      repeat: 1,
      isText: m![1] === 'A',
      isVariable: false,
      start,
      width,
      scale: h.number(`TSCAL${n}`) ?? 1,
      zero: h.number(`TZERO${n}`) ?? 0,
      tnull: h.string(`TNULL${n}`)?.trim(),
    });
  }
  const field = (col: AsciiColumn, row: number): string => {
    let s = '';
    const at = hdu.dataStart + row * rowBytes + col.start;
    for (let i = 0; i < col.width; i++) s += String.fromCharCode(hdu.bytes[at + i]);
    return s.trim();
  };
  const numberAt = (col: AsciiColumn, row: number): number => {
    const text = field(col, row);
    if (text === '' || text === col.tnull) return NaN;
    const v = Number(text.replace(/[Dd]/, 'E'));
    return Number.isNaN(v) ? NaN : col.zero + col.scale * v;
  };
  const numeric = (c: TableColumn): AsciiColumn => {
    if (c.isText) hduError(hdu, `column ${c.name} holds text, not numbers`);
    return c as AsciiColumn;
  };
  return {
    hdu,
    rows,
    columns,
    find: columnFinder(
      columns.map((c) => c.name),
      (i) => columns[i],
    ),
    values(c) {
      const col = numeric(c);
      checkElementCount(hdu, rows, `column ${col.name}`);
      const out = new Float64Array(rows);
      for (let r = 0; r < rows; r++) out[r] = numberAt(col, r);
      return out;
    },
    rowValues(c, row) {
      const col = numeric(c);
      if (row < 0 || row >= rows) hduError(hdu, `row ${row} is outside the table`);
      return Float64Array.of(numberAt(col, row));
    },
    strings(c) {
      const col = c as AsciiColumn;
      const out: string[] = [];
      for (let r = 0; r < rows; r++) out.push(field(col, r));
      return out;
    },
  };
}

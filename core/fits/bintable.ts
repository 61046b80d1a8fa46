/**
 * Binary tables (FITS 4.0 §7.3): TFORMn = rT with T one of L X B I J K A E D C M P Q;
 * physical value = TZEROn + TSCALn × stored (§7.3.2); integer cells equal to TNULLn, and
 * logical cells that are neither T nor F, read as NaN. Variable-length arrays (P, Q) are read
 * from the heap, which starts THEAP bytes after the main table (default NAXIS1 × NAXIS2).
 */
import { concatArrays } from '../util/concat-arrays.js';
import { checkElementCount, hduError, type FitsHdu } from './parse.js';
import { columnFinder, columnNames, type FitsTable, type TableColumn } from './table.js';

interface BinColumn extends TableColumn {
  type: string;
  /** Byte offset of the column within a row. */
  offset: number;
  scale: number;
  zero: number;
  tnull?: number;
  /** Element type of a P/Q column. */
  heapType?: string;
}

/** Bytes per element of each TFORM type (X counts bits, handled apart). */
const ELEMENT_BYTES: Record<string, number> = { L: 1, B: 1, I: 2, J: 4, K: 8, A: 1, E: 4, D: 8, C: 8, M: 16, P: 8, Q: 16 };

export function openBinTable(hdu: FitsHdu): FitsTable {
  const h = hdu.header;
  const rowBytes = hdu.axes[0] ?? 0;
  const rows = hdu.axes[1] ?? 0;
  const names = columnNames(hdu) ?? hduError(hdu, `TFIELDS ${h.integer('TFIELDS')} is not valid`);
  const nfields = names.length;
  // Every TFORMn is checked now; the rest of a column's keywords are read when it is used.
  const layouts: ColumnLayout[] = [];
  let offset = 0;
  for (let n = 1; n <= nfields; n++) {
    const form = (h.string(`TFORM${n}`) ?? '').trim().toUpperCase();
    const m = /^(\d*)([LXBIJKAEDCMPQ])(.*)$/.exec(form);
    if (!m) hduError(hdu, `column ${n} has an unknown TFORM${n} '${form}'`);
    const repeat = m![1] === '' ? 1 : Number(m![1]);
    const type = m![2];
    const width = type === 'X' ? Math.ceil(repeat / 8) : repeat * ELEMENT_BYTES[type];
    const isVariable = type === 'P' || type === 'Q';
    const heapType = isVariable ? /^([LXBIJKAEDCM])/.exec(m![3])?.[1] : undefined;
    if (isVariable && !heapType) hduError(hdu, `column ${n} has a variable-length TFORM${n} '${form}' without an element type`);
    layouts.push({ n, form, repeat, type, isVariable, heapType, offset, name: names[n - 1] });
    offset += width;
  }
  if (offset > rowBytes) hduError(hdu, `the columns need ${offset} bytes per row but NAXIS1 is ${rowBytes}`);
  const described: BinColumn[] = [];
  const column = (i: number): BinColumn => (described[i] ??= describe(h, layouts[i]));
  let all: BinColumn[] | undefined;
  const view = new DataView(hdu.bytes.buffer, hdu.bytes.byteOffset + hdu.dataStart, hdu.dataLength);
  const heapStart = h.integer('THEAP') ?? rowBytes * rows;

  const numeric = (c: TableColumn): BinColumn => {
    const col = c as BinColumn;
    if (col.isText) hduError(hdu, `column ${col.name} holds text, not numbers`);
    if (col.type === 'C' || col.type === 'M' || col.heapType === 'C' || col.heapType === 'M') {
      hduError(hdu, `column ${col.name} holds complex numbers`);
    }
    return col;
  };

  return {
    hdu,
    rows,
    get columns() {
      return (all ??= layouts.map((_, i) => column(i)));
    },
    find: columnFinder(names, column),
    values(c) {
      const col = numeric(c);
      if (col.isVariable) {
        const parts: Float64Array[] = [];
        let total = 0;
        for (let r = 0; r < rows; r++) {
          const part = this.rowValues(col, r);
          total += part.length;
          checkElementCount(hdu, total, `column ${col.name}`);
          parts.push(part);
        }
        return concatArrays((n) => new Float64Array(n), parts);
      }
      checkElementCount(hdu, rows * col.repeat, `column ${col.name}`);
      const out = new Float64Array(rows * col.repeat);
      if (col.repeat === 1 && col.type !== 'X') decodeCells(view, col.type, col.offset, rowBytes, rows, out, 0);
      else for (let r = 0; r < rows; r++) decodeCells(view, col.type, r * rowBytes + col.offset, ELEMENT_BYTES[col.type], col.repeat, out, r * col.repeat);
      applyNullsAndScale(col, col.type, out);
      return out;
    },
    rowValues(c, row) {
      const col = numeric(c);
      if (row < 0 || row >= rows) hduError(hdu, `row ${row} is outside the table`);
      const cell = row * rowBytes + col.offset;
      if (!col.isVariable) {
        checkElementCount(hdu, col.repeat, `column ${col.name}`);
        const out = new Float64Array(col.repeat);
        decodeCells(view, col.type, cell, ELEMENT_BYTES[col.type], col.repeat, out, 0);
        applyNullsAndScale(col, col.type, out);
        return out;
      }
      const wide = col.type === 'Q';
      const count = wide ? Number(view.getBigInt64(cell)) : view.getInt32(cell);
      const at = wide ? Number(view.getBigInt64(cell + 8)) : view.getInt32(cell + 4);
      const type = col.heapType!;
      const bytes = type === 'X' ? Math.ceil(count / 8) : count * ELEMENT_BYTES[type];
      const start = heapStart + at;
      if (count < 0 || at < 0 || start + bytes > hdu.dataLength) {
        hduError(hdu, `column ${col.name} row ${row + 1} points outside the heap`);
      }
      checkElementCount(hdu, count, `column ${col.name}`);
      const out = new Float64Array(count);
      decodeCells(view, type, start, ELEMENT_BYTES[type], count, out, 0);
      applyNullsAndScale(col, type, out);
      return out;
    },
    strings(c) {
      const col = c as BinColumn;
      if (!col.isText || col.isVariable) hduError(hdu, `column ${col.name} is not a fixed-width text column`);
      const out: string[] = [];
      for (let r = 0; r < rows; r++) {
        let s = '';
        const start = r * rowBytes + col.offset;
        for (let i = 0; i < col.repeat; i++) {
          const b = view.getUint8(start + i);
          if (b === 0) break;
          s += String.fromCharCode(b);
        }
        out.push(s.trimEnd());
      }
      return out;
    },
  };
}

/** What TFORMn and TTYPEn say about a column: enough to check the row layout and find it by name. */
interface ColumnLayout {
  n: number;
  name: string;
  form: string;
  repeat: number;
  type: string;
  isVariable: boolean;
  heapType?: string;
  offset: number;
}

function describe(h: FitsHdu['header'], l: ColumnLayout): BinColumn {
  return {
    number: l.n,
    name: l.name,
    form: l.form,
    unit: h.string(`TUNIT${l.n}`)?.trim() || undefined,
    repeat: l.isVariable ? 1 : l.repeat,
    isText: l.type === 'A' || l.heapType === 'A',
    isVariable: l.isVariable,
    type: l.type,
    offset: l.offset,
    scale: h.number(`TSCAL${l.n}`) ?? 1,
    zero: h.number(`TZERO${l.n}`) ?? 0,
    tnull: h.integer(`TNULL${l.n}`),
    heapType: l.heapType,
  };
}

/**
 * Stored values of `count` elements, element i at byte at + i × step (X: bits packed from `at`),
 * big-endian; one loop per type so that each stays monomorphic.
 */
function decodeCells(view: DataView, type: string, at: number, step: number, count: number, out: Float64Array, outAt: number): void {
  switch (type) {
    case 'L':
      for (let i = 0; i < count; i++) {
        const b = view.getUint8(at + i * step);
        out[outAt + i] = b === 84 ? 1 : b === 70 ? 0 : NaN;
      }
      return;
    case 'X':
      for (let i = 0; i < count; i++) out[outAt + i] = (view.getUint8(at + (i >> 3)) >> (7 - (i & 7))) & 1;
      return;
    case 'B':
      for (let i = 0; i < count; i++) out[outAt + i] = view.getUint8(at + i * step);
      return;
    case 'I':
      for (let i = 0; i < count; i++) out[outAt + i] = view.getInt16(at + i * step);
      return;
    case 'J':
      for (let i = 0; i < count; i++) out[outAt + i] = view.getInt32(at + i * step);
      return;
    case 'K':
      for (let i = 0; i < count; i++) out[outAt + i] = Number(view.getBigInt64(at + i * step));
      return;
    case 'E':
      for (let i = 0; i < count; i++) out[outAt + i] = view.getFloat32(at + i * step);
      return;
    default:
      for (let i = 0; i < count; i++) out[outAt + i] = view.getFloat64(at + i * step);
  }
}

/** Integer cells equal to TNULLn → NaN; then physical = TZEROn + TSCALn × stored (L and X as stored). */
function applyNullsAndScale(col: BinColumn, type: string, out: Float64Array): void {
  if (type === 'L' || type === 'X') return;
  const { scale, zero } = col;
  const tnull = type === 'B' || type === 'I' || type === 'J' || type === 'K' ? col.tnull : undefined;
  const scaled = scale !== 1 || zero !== 0;
  if (tnull === undefined && !scaled) return;
  for (let i = 0; i < out.length; i++) {
    const raw = out[i];
    out[i] = tnull !== undefined && raw === tnull ? NaN : scaled ? zero + scale * raw : raw;
  }
}

/**
 * Binary tables (FITS 4.0 §7.3): TFORMn = rT with T one of L X B I J K A E D C M P Q;
 * physical value = TZEROn + TSCALn × stored (§7.3.2); integer cells equal to TNULLn, and
 * logical cells that are neither T nor F, read as NaN. Variable-length arrays (P, Q) are read
 * from the heap, which starts THEAP bytes after the main table (default NAXIS1 × NAXIS2).
 */
import { concatArrays } from '../util/concat-arrays.js';
import { checkElementCount, hduError, type FitsHdu } from './parse.js';
import { columnFinder, type FitsTable, type TableColumn } from './table.js';

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
  const nfields = h.integer('TFIELDS') ?? 0;
  if (nfields < 0 || nfields > 999) hduError(hdu, `TFIELDS ${nfields} is not valid`);
  const columns: BinColumn[] = [];
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
    columns.push({
      number: n,
      name: h.string(`TTYPE${n}`)?.trim() || `COL${n}`,
      form,
      unit: h.string(`TUNIT${n}`)?.trim() || undefined,
      repeat: isVariable ? 1 : repeat,
      isText: type === 'A' || heapType === 'A',
      isVariable,
      type,
      offset,
      scale: h.number(`TSCAL${n}`) ?? 1,
      zero: h.number(`TZERO${n}`) ?? 0,
      tnull: h.integer(`TNULL${n}`),
      heapType,
    });
    offset += width;
  }
  if (offset > rowBytes) hduError(hdu, `the columns need ${offset} bytes per row but NAXIS1 is ${rowBytes}`);
  const view = new DataView(hdu.bytes.buffer, hdu.bytes.byteOffset + hdu.dataStart, hdu.dataLength);
  const heapStart = h.integer('THEAP') ?? rowBytes * rows;
  const find = columnFinder(columns);

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
    columns,
    find,
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
      const decode = cellDecoder(col, col.type);
      for (let r = 0; r < rows; r++) decode(view, r * rowBytes + col.offset, col.repeat, out, r * col.repeat);
      return out;
    },
    rowValues(c, row) {
      const col = numeric(c);
      if (row < 0 || row >= rows) hduError(hdu, `row ${row} is outside the table`);
      const cell = row * rowBytes + col.offset;
      if (!col.isVariable) {
        checkElementCount(hdu, col.repeat, `column ${col.name}`);
        const out = new Float64Array(col.repeat);
        cellDecoder(col, col.type)(view, cell, col.repeat, out, 0);
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
      cellDecoder(col, type)(view, start, count, out, 0);
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

type CellDecoder = (view: DataView, at: number, count: number, out: Float64Array, outAt: number) => void;

function cellDecoder(col: BinColumn, type: string): CellDecoder {
  const { scale, zero, tnull } = col;
  const scaled = scale !== 1 || zero !== 0;
  const integer = (read: (v: DataView, o: number) => number, size: number): CellDecoder => (view, at, count, out, outAt) => {
    for (let i = 0; i < count; i++) {
      const raw = read(view, at + i * size);
      out[outAt + i] = tnull !== undefined && raw === tnull ? NaN : scaled ? zero + scale * raw : raw;
    }
  };
  const float = (read: (v: DataView, o: number) => number, size: number): CellDecoder => (view, at, count, out, outAt) => {
    for (let i = 0; i < count; i++) {
      const raw = read(view, at + i * size);
      out[outAt + i] = scaled ? zero + scale * raw : raw;
    }
  };
  switch (type) {
    case 'L':
      return (view, at, count, out, outAt) => {
        for (let i = 0; i < count; i++) {
          const b = view.getUint8(at + i);
          out[outAt + i] = b === 84 ? 1 : b === 70 ? 0 : NaN;
        }
      };
    case 'X':
      return (view, at, count, out, outAt) => {
        for (let i = 0; i < count; i++) out[outAt + i] = (view.getUint8(at + (i >> 3)) >> (7 - (i & 7))) & 1;
      };
    case 'B':
      return integer((v, o) => v.getUint8(o), 1);
    case 'I':
      return integer((v, o) => v.getInt16(o), 2);
    case 'J':
      return integer((v, o) => v.getInt32(o), 4);
    case 'K':
      return integer((v, o) => Number(v.getBigInt64(o)), 8);
    case 'E':
      return float((v, o) => v.getFloat32(o), 4);
    default:
      return float((v, o) => v.getFloat64(o), 8);
  }
}

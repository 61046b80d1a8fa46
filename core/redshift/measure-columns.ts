/**
 * The columns of a measurement row, as a list of definitions: later columns (frames, distances,
 * host lines) are appended to MEASURE_COLUMNS without touching the code that writes rows.
 * Units are in the keys where a value has one (redshifts are dimensionless).
 */
import type { Candidate, Measurement } from './types.js';

export interface MeasureRowInput {
  file: string;
  hdu: number | null;
  status: 'ok' | 'error';
  error: string | null;
  measurement: Measurement | null;
}

export type CellValue = string | number | null;

export interface MeasureColumn {
  key: string;
  /** One cell; for JSON Lines a column may give an array or object (flattened for CSV). */
  value(row: MeasureRowInput): CellValue | CandidateCell[];
}

export interface CandidateCell {
  z: number;
  z_err: number;
  r: number;
  template: string;
}

const best = (row: MeasureRowInput): Candidate | null => row.measurement?.best ?? null;
const round = (x: number | undefined | null, digits: number): number | null => (x === undefined || x === null || !Number.isFinite(x) ? null : Number(x.toPrecision(digits)));

export const MEASURE_COLUMNS: MeasureColumn[] = [
  { key: 'file', value: (r) => r.file },
  { key: 'hdu', value: (r) => r.hdu },
  { key: 'status', value: (r) => r.status },
  { key: 'error', value: (r) => r.error },
  { key: 'z', value: (r) => round(best(r)?.z, 8) },
  { key: 'z_err', value: (r) => round(best(r)?.zErr, 3) },
  { key: 'confidence', value: (r) => r.measurement?.confidence ?? null },
  { key: 'template', value: (r) => best(r)?.template ?? null },
  { key: 'r', value: (r) => round(best(r)?.r, 4) },
  { key: 'overlap', value: (r) => round(best(r)?.overlap, 3) },
  { key: 'n_lines', value: (r) => r.measurement?.nLines ?? null },
  {
    key: 'candidates',
    value: (r) => (r.measurement?.candidates ?? []).map((c) => ({ z: round(c.z, 8)!, z_err: round(c.zErr, 3)!, r: round(c.r, 4)!, template: c.template })),
  },
  // What the engine noticed (a short spectrum, a fit that did not converge, nothing credible).
  { key: 'notes', value: (r) => r.measurement?.notes.join('; ') || null },
];

/** Candidates after the best flattened into CSV columns: z_2, z_err_2, r_2, template_2, z_3 … */
export const CSV_EXTRA_CANDIDATES = 2;
const CANDIDATE_FIELDS: (keyof CandidateCell)[] = ['z', 'z_err', 'r', 'template'];

export function csvHeader(columns: MeasureColumn[]): string[] {
  return columns.flatMap((c) =>
    c.key === 'candidates' ? Array.from({ length: CSV_EXTRA_CANDIDATES }, (_, k) => CANDIDATE_FIELDS.map((f) => `${f}_${k + 2}`)).flat() : [c.key],
  );
}

export function csvCells(columns: MeasureColumn[], row: MeasureRowInput): CellValue[] {
  return columns.flatMap((c) => {
    const v = c.value(row);
    if (!Array.isArray(v)) return [v];
    const rest = v.slice(1, 1 + CSV_EXTRA_CANDIDATES);
    return Array.from({ length: CSV_EXTRA_CANDIDATES }, (_, k) => CANDIDATE_FIELDS.map((f) => (rest[k] ? rest[k][f] : null))).flat();
  });
}

export function csvLine(cells: CellValue[]): string {
  return cells
    .map((v) => {
      if (v === null) return '';
      const s = String(v);
      return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
    })
    .join(',');
}

export function jsonlLine(columns: MeasureColumn[], row: MeasureRowInput): string {
  const o: Record<string, unknown> = {};
  for (const c of columns) o[c.key] = c.value(row);
  return JSON.stringify(o);
}

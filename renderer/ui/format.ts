/** How numbers are written in the window: always with their unit or as a dimensionless z. */
import type { Confidence } from '../../core/catalogue/verdict.js';
import { CONFIDENCE_LOOK } from './theme.js';

export function fmtZ(z: number | null | undefined, digits = 5): string {
  return z === null || z === undefined || !Number.isFinite(z) ? '—' : z.toFixed(digits);
}

/** z ± σz with σz to two significant figures and z to the same last decimal (at least 5, at most 7). */
export function fmtZErr(z: number | null, zErr: number | null): string {
  if (z === null) return '—';
  if (zErr === null || !Number.isFinite(zErr) || zErr <= 0) return `${fmtZ(z)} (no σ)`;
  const digits = Math.min(7, Math.max(5, 1 - Math.floor(Math.log10(zErr))));
  return `${fmtZ(z, digits)} ± ${zErr < 1e-6 ? zErr.toFixed(digits) : zErr.toPrecision(2)}`;
}

export function fmtNum(v: number | null | undefined, digits: number, unit: string): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  return unit ? `${v.toFixed(digits)} ${unit}` : v.toFixed(digits);
}

/** v ± err in the unit, both to `digits` decimals; as fmtNum without an error. */
export function fmtNumErr(v: number, err: number | null | undefined, digits: number, unit: string): string {
  return err === null || err === undefined || !Number.isFinite(err) ? fmtNum(v, digits, unit) : `${v.toFixed(digits)} ± ${err.toFixed(digits)} ${unit}`;
}

export function confidenceText(c: Confidence | null): { text: string; shape: string; colour: string } {
  if (c === null) return { text: 'no z', shape: '○○○', colour: '#9aa4af' };
  return { text: c, ...CONFIDENCE_LOOK[c] };
}

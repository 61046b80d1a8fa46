/** How numbers are written in the window: always with their unit or as a dimensionless z. */
import type { Confidence } from '../../core/catalogue/verdict.js';
import { CONFIDENCE_LOOK } from './theme.js';

export function fmtZ(z: number | null | undefined, digits = 5): string {
  return z === null || z === undefined || !Number.isFinite(z) ? '—' : z.toFixed(digits);
}

/** z ± σz with σz to two significant figures. */
export function fmtZErr(z: number | null, zErr: number | null): string {
  if (z === null) return '—';
  if (zErr === null || !Number.isFinite(zErr)) return `${fmtZ(z)} (no σ)`;
  return `${fmtZ(z)} ± ${zErr.toPrecision(2)}`;
}

export function fmtNum(v: number | null | undefined, digits: number, unit: string): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  return unit ? `${v.toFixed(digits)} ${unit}` : v.toFixed(digits);
}

export function confidenceText(c: Confidence | null): { text: string; shape: string; colour: string } {
  if (c === null) return { text: 'no z', shape: '○○○', colour: '#9aa4af' };
  return { text: c, ...CONFIDENCE_LOOK[c] };
}

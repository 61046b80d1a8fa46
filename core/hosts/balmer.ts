/**
 * Dust from the Balmer decrement: E(B−V) = 2.5/(k(Hβ) − k(Hα)) · log10[(F_Hα/F_Hβ)/2.86]
 * (e.g. Domínguez et al. 2013, ApJ 763, 145, eq. 4), intrinsic Hα/Hβ = 2.86 for case B at
 * T = 10⁴ K, n_e = 10² cm⁻³ (Osterbrock & Ferland 2006, Table 4.4).
 */
import { restLine } from '../redshift/line-list.js';
import { attenuationK, CURVE_SOURCE, type AttenuationCurve } from './attenuation.js';
import { DETECTION_SN, type LineMeasurement } from './measure-lines.js';

export const INTRINSIC_HA_HB = 2.86;

export interface BalmerDecrement {
  /** Observed narrow F(Hα)/F(Hβ); null when either line lacks S/N ≥ 3. */
  decrement: number | null;
  decrement_err: number | null;
  /** Colour excess of the gas, mag; 0 when the decrement is at or below 2.86 (then ebv_raw is negative). */
  ebv: number | null;
  ebv_err: number | null;
  ebv_raw: number | null;
  curve: AttenuationCurve;
  curve_source: string;
  k_hbeta: number;
  k_halpha: number;
  /** Attenuation at Hα, mag. */
  a_halpha: number | null;
  intrinsic: number;
  /** Hα flux corrected for dust (flux units of the spectrum × Å); null without a decrement. */
  halpha_flux_corrected: number | null;
  halpha_flux_corrected_err: number | null;
  note: string;
}

export function balmerDecrement(lines: LineMeasurement[], curve: AttenuationCurve): BalmerDecrement {
  const find = (id: string) => lines.find((l) => l.name === id && l.component === 'narrow');
  const ha = find('Halpha');
  const hb = find('Hbeta');
  const kHb = attenuationK(curve, restLine('Hbeta').waveVacuumAngstrom);
  const kHa = attenuationK(curve, restLine('Halpha').waveVacuumAngstrom);
  const base = { curve, curve_source: CURVE_SOURCE[curve], k_hbeta: kHb, k_halpha: kHa, intrinsic: INTRINSIC_HA_HB };
  const detected = (l: LineMeasurement | undefined): l is LineMeasurement => !!l && !l.limit && l.sn >= DETECTION_SN;
  if (!detected(ha) || !detected(hb)) {
    const which = [detected(ha) ? null : 'Halpha', detected(hb) ? null : 'Hbeta'].filter(Boolean).join(' and ');
    return {
      ...base, decrement: null, decrement_err: null, ebv: null, ebv_err: null, ebv_raw: null, a_halpha: null,
      halpha_flux_corrected: null, halpha_flux_corrected_err: null,
      note: `no Balmer decrement: ${which} not detected at S/N ≥ 3`,
    };
  }
  const ratio = ha.flux / hb.flux;
  const relErr = Math.hypot(ha.flux_err / ha.flux, hb.flux_err / hb.flux);
  const scale = 2.5 / (kHb - kHa);
  const ebvRaw = scale * Math.log10(ratio / INTRINSIC_HA_HB);
  const ebvErr = (scale * relErr) / Math.LN10;
  const ebv = Math.max(0, ebvRaw);
  const aHa = kHa * ebv;
  const factor = 10 ** (0.4 * aHa);
  const corrected = ha.flux * factor;
  // Error of the corrected flux: F_Hα and the E(B−V) error (which itself holds F_Hα) combined
  // as independent, a slight overestimate; common practice, no source.
  const correctedErr = corrected * Math.hypot(ha.flux_err / ha.flux, ebv > 0 ? 0.4 * Math.LN10 * kHa * ebvErr : 0);
  return {
    ...base,
    decrement: ratio,
    decrement_err: ratio * relErr,
    ebv,
    ebv_err: ebvErr,
    ebv_raw: ebvRaw,
    a_halpha: aHa,
    halpha_flux_corrected: corrected,
    halpha_flux_corrected_err: correctedErr,
    note: ebvRaw < 0 ? 'decrement below the case-B value: E(B−V) set to 0 (no correction)' : 'narrow Hα and Hβ, stellar absorption fitted',
  };
}

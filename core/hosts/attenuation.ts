/**
 * Attenuation curves k(λ) = A(λ)/E(B−V), λ in vacuum Å (the air/vacuum difference changes k by
 * less than 1e-4 here).
 */

export type AttenuationCurve = 'calzetti2000' | 'ccm89';

/** Calzetti et al. (2000, ApJ 533, 682) eq. 4, R′_V = 4.05, valid 0.12–2.2 µm. */
export function kCalzetti2000(waveAngstrom: number): number {
  const x = 1e4 / waveAngstrom;
  const rv = 4.05;
  if (waveAngstrom >= 6300) return 2.659 * (-1.857 + 1.04 * x) + rv;
  return 2.659 * (-2.156 + 1.509 * x - 0.198 * x * x + 0.011 * x * x * x) + rv;
}

/** Cardelli, Clayton & Mathis (1989, ApJ 345, 245) eqs. 3a,b (optical/NIR 1.1–3.3 µm⁻¹), R_V = 3.1. */
export function kCcm89(waveAngstrom: number): number {
  const rv = 3.1;
  const x = 1e4 / waveAngstrom;
  if (x < 1.1) {
    // Infrared, eqs. 2a,b.
    return rv * 0.574 * x ** 1.61 - 0.527 * x ** 1.61;
  }
  const y = x - 1.82;
  const a = 1 + 0.17699 * y - 0.50447 * y ** 2 - 0.02427 * y ** 3 + 0.72085 * y ** 4 + 0.01979 * y ** 5 - 0.7753 * y ** 6 + 0.32999 * y ** 7;
  const b = 1.41338 * y + 2.28305 * y ** 2 + 1.07233 * y ** 3 - 5.38434 * y ** 4 - 0.62251 * y ** 5 + 5.3026 * y ** 6 - 2.09002 * y ** 7;
  return rv * a + b;
}

export function attenuationK(curve: AttenuationCurve, waveAngstrom: number): number {
  return curve === 'calzetti2000' ? kCalzetti2000(waveAngstrom) : kCcm89(waveAngstrom);
}

export const CURVE_SOURCE: Record<AttenuationCurve, string> = {
  calzetti2000: 'Calzetti et al. (2000, ApJ 533, 682), R′_V = 4.05',
  ccm89: 'Cardelli, Clayton & Mathis (1989, ApJ 345, 245), R_V = 3.1',
};

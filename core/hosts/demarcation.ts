/**
 * Demarcation lines of the optical emission-line diagnostic diagrams, x = log of the low-
 * ionisation line over Hα, y = log([O III] 5008 / Hβ).
 */

/** Kauffmann et al. (2003, MNRAS 346, 1055) eq. 1: empirical upper edge of star-forming galaxies (x < 0.05). */
export function kauffmann03(logNiiHa: number): number {
  return 0.61 / (logNiiHa - 0.05) + 1.3;
}

/** Kewley et al. (2001, ApJ 556, 121) eq. 5: theoretical maximum starburst line, [N II] diagram (x < 0.47). */
export function kewley01Nii(logNiiHa: number): number {
  return 0.61 / (logNiiHa - 0.47) + 1.19;
}

/** Kewley et al. (2001) eq. 6: maximum starburst line, [S II] diagram (x < 0.32). */
export function kewley01Sii(logSiiHa: number): number {
  return 0.72 / (logSiiHa - 0.32) + 1.3;
}

/** Kewley et al. (2001) eq. 7: maximum starburst line, [O I] diagram (x < −0.59). */
export function kewley01Oi(logOiHa: number): number {
  return 0.73 / (logOiHa + 0.59) + 1.33;
}

/** Kewley et al. (2006, MNRAS 372, 961) eq. 6: Seyfert/LINER line, [S II] diagram. */
export function kewley06SiiSeyfertLiner(logSiiHa: number): number {
  return 1.89 * logSiiHa + 0.76;
}

/** Kewley et al. (2006) eq. 7: Seyfert/LINER line, [O I] diagram. */
export function kewley06OiSeyfertLiner(logOiHa: number): number {
  return 1.18 * logOiHa + 1.3;
}

/** Asymptote (x limit) of each hyperbola: at and beyond it the curve no longer bounds star formation. */
export const ASYMPTOTE = { kauffmann03: 0.05, kewley01Nii: 0.47, kewley01Sii: 0.32, kewley01Oi: -0.59 } as const;

/** True when (x, y) lies above a hyperbolic demarcation (or right of its asymptote). */
export function aboveHyperbola(curve: (x: number) => number, asymptote: number, x: number, y: number): boolean {
  return x >= asymptote || y > curve(x);
}

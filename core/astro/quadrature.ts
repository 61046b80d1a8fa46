/**
 * Adaptive Gauss–Kronrod quadrature (7-point Gauss, 15-point Kronrod), the QK15 rule of
 * QUADPACK (Piessens, de Doncker-Kapenga, Überhuber & Kahaner 1983, "QUADPACK", Springer),
 * with global bisection of the interval whose error estimate |K15 − G7| is largest.
 */

/** Kronrod abscissae on [−1, 1] (positive half; the last is the centre). QUADPACK qk15. */
const XGK = [
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851,
  0.864864423359769072789712788640926, 0.741531185599394439863864773280788,
  0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245, 0,
];
/** Kronrod weights for XGK. */
const WGK = [
  0.022935322010529224963732008058970, 0.063092092629978553290700663189204,
  0.104790010322250183839876322541518, 0.140653259715525918745189590510238,
  0.169004726639267902826583426598550, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
];
/** Gauss weights for the 7-point rule, whose nodes are XGK[1], XGK[3], XGK[5], XGK[7]. */
const WG = [
  0.129484966168869693270611432679082, 0.279705391489276667901467771423780,
  0.381830050505118944950369775488975, 0.417959183673469387755102040816327,
];

interface Piece { a: number; b: number; value: number; error: number }

/** One QK15 step on [a, b]: the Kronrod value and |Kronrod − Gauss| as its error estimate. */
export function kronrod15(f: (x: number) => number, a: number, b: number): { value: number; error: number } {
  const centre = 0.5 * (a + b);
  const half = 0.5 * (b - a);
  const fc = f(centre);
  let kronrod = fc * WGK[7];
  let gauss = fc * WG[3];
  for (let j = 0; j < 7; j++) {
    const dx = half * XGK[j];
    const pair = f(centre - dx) + f(centre + dx);
    kronrod += WGK[j] * pair;
    if (j % 2 === 1) gauss += WG[(j - 1) / 2] * pair;
  }
  return { value: kronrod * half, error: Math.abs((kronrod - gauss) * half) };
}

export interface QuadratureOptions {
  /** Relative tolerance on the whole integral (default 1e-12). */
  relTol?: number;
  /** Absolute tolerance (default 0). */
  absTol?: number;
  /** Most subintervals before giving up (default 200). */
  maxPieces?: number;
}

/**
 * ∫_a^b f(x) dx for a finite interval and an integrand finite on it. Throws a RangeError when
 * the tolerance is not reached within maxPieces subintervals or the integrand is not finite.
 */
export function integrate(f: (x: number) => number, a: number, b: number, options: QuadratureOptions = {}): number {
  const relTol = options.relTol ?? 1e-12;
  const absTol = options.absTol ?? 0;
  const maxPieces = options.maxPieces ?? 200;
  if (a === b) return 0;
  const pieces: Piece[] = [{ a, b, ...kronrod15(f, a, b) }];
  for (;;) {
    let value = 0;
    let error = 0;
    let worst = 0;
    for (let i = 0; i < pieces.length; i++) {
      value += pieces[i].value;
      error += pieces[i].error;
      if (pieces[i].error > pieces[worst].error) worst = i;
    }
    if (!Number.isFinite(value)) throw new RangeError('integrand is not finite on the interval');
    if (error <= Math.max(absTol, relTol * Math.abs(value))) return value;
    if (pieces.length >= maxPieces) {
      throw new RangeError(`integral did not converge (estimated relative error ${(error / Math.abs(value)).toExponential(1)})`);
    }
    const { a: pa, b: pb } = pieces[worst];
    const mid = 0.5 * (pa + pb);
    pieces.splice(worst, 1, { a: pa, b: mid, ...kronrod15(f, pa, mid) }, { a: mid, b: pb, ...kronrod15(f, mid, pb) });
  }
}

/**
 * Spectral class of the narrow emission lines from the [N II], [S II] and [O I] diagnostic
 * diagrams, following the scheme of Kewley et al. (2006, MNRAS 372, 961, section 4):
 * [N II]: star-forming below Kauffmann et al. (2003), composite between that and Kewley et al.
 * (2001), AGN above; [S II] and [O I]: star-forming below the Kewley (2001) maximum starburst
 * line, otherwise Seyfert above / LINER below the Kewley (2006) line.
 */
import {
  ASYMPTOTE, aboveHyperbola, kauffmann03, kewley01Nii, kewley01Oi, kewley01Sii, kewley06OiSeyfertLiner, kewley06SiiSeyfertLiner,
} from './demarcation.js';
import { DETECTION_SN, type LineMeasurement } from './measure-lines.js';

export type BptClass = 'star-forming' | 'composite' | 'agn' | 'insufficient';
export type SecondaryClass = 'star-forming' | 'seyfert' | 'liner' | 'insufficient';

export interface DiagramPoint {
  /** log10 ratios and their 1σ errors (dex); null where a line is missing or a limit. */
  log_nii_ha: number | null;
  log_nii_ha_err: number | null;
  log_oiii_hb: number | null;
  log_oiii_hb_err: number | null;
  log_sii_ha: number | null;
  log_sii_ha_err: number | null;
  log_oi_ha: number | null;
  log_oi_ha_err: number | null;
}

export interface Classification {
  bpt: BptClass;
  agn_type: 'seyfert' | 'liner' | null;
  sii: SecondaryClass;
  oi: SecondaryClass;
  /** Lines each diagram needs that lack S/N ≥ 3 (or are not covered). */
  missing: string[];
  point: DiagramPoint;
  /** True when a broad Balmer component was fitted: a type-1 AGN whatever the narrow-line class. */
  broad_balmer: boolean;
  method: string;
}

const METHOD =
  'Narrow-line ratios on the [N II] diagram (Kauffmann et al. 2003; Kewley et al. 2001) and the [S II] and [O I] ' +
  'diagrams (Kewley et al. 2001 maximum starburst lines; Kewley et al. 2006 Seyfert/LINER lines); a diagram is ' +
  '"insufficient" when one of its lines has S/N < 3. Errors ignore the covariance of lines fitted in the same group.';

const LN10 = Math.log(10);

function logRatio(num: LineMeasurement[], den: LineMeasurement[]): { v: number; e: number } | null {
  const a = num.reduce((s, l) => s + l.flux, 0);
  const b = den.reduce((s, l) => s + l.flux, 0);
  if (!(a > 0 && b > 0)) return null;
  const ea = Math.sqrt(num.reduce((s, l) => s + l.flux_err ** 2, 0));
  const eb = Math.sqrt(den.reduce((s, l) => s + l.flux_err ** 2, 0));
  return { v: Math.log10(a / b), e: Math.hypot(ea / a, eb / b) / LN10 };
}

function secondary(x: number, y: number, max: (x: number) => number, asymptote: number, seyfertLiner: (x: number) => number): SecondaryClass {
  if (!aboveHyperbola(max, asymptote, x, y)) return 'star-forming';
  return y > seyfertLiner(x) ? 'seyfert' : 'liner';
}

export function classify(lines: LineMeasurement[]): Classification {
  const narrow = new Map(lines.filter((l) => l.component === 'narrow').map((l) => [l.name, l]));
  const missing = new Set<string>();
  const need = (ids: string[]): LineMeasurement[] | null => {
    const found = ids.map((id) => narrow.get(id));
    let ok = true;
    ids.forEach((id, i) => {
      const l = found[i];
      if (!l || l.limit || !(l.sn >= DETECTION_SN)) {
        missing.add(id);
        ok = false;
      }
    });
    return ok ? (found as LineMeasurement[]) : null;
  };
  const ha = need(['Halpha']);
  const hb = need(['Hbeta']);
  const o3 = need(['[OIII]5008']);
  const n2 = need(['[NII]6585']);
  const s2 = need(['[SII]6718', '[SII]6733']);
  const o1 = need(['[OI]6302']);
  const y = hb && o3 ? logRatio(o3, hb) : null;
  const xn = ha && n2 ? logRatio(n2, ha) : null;
  const xs = ha && s2 ? logRatio(s2, ha) : null;
  const xo = ha && o1 ? logRatio(o1, ha) : null;

  let bpt: BptClass = 'insufficient';
  if (y && xn) {
    if (aboveHyperbola(kewley01Nii, ASYMPTOTE.kewley01Nii, xn.v, y.v)) bpt = 'agn';
    else if (aboveHyperbola(kauffmann03, ASYMPTOTE.kauffmann03, xn.v, y.v)) bpt = 'composite';
    else bpt = 'star-forming';
  }
  const sii: SecondaryClass = y && xs ? secondary(xs.v, y.v, kewley01Sii, ASYMPTOTE.kewley01Sii, kewley06SiiSeyfertLiner) : 'insufficient';
  const oi: SecondaryClass = y && xo ? secondary(xo.v, y.v, kewley01Oi, ASYMPTOTE.kewley01Oi, kewley06OiSeyfertLiner) : 'insufficient';
  // The AGN type comes from the [S II] and [O I] diagrams; when they disagree it stays open.
  const types = [sii, oi].filter((c): c is 'seyfert' | 'liner' => c === 'seyfert' || c === 'liner');
  const agnType = bpt === 'agn' && types.length > 0 && types.every((t) => t === types[0]) ? types[0] : null;
  return {
    bpt,
    agn_type: agnType,
    sii,
    oi,
    missing: [...missing],
    point: {
      log_nii_ha: xn?.v ?? null,
      log_nii_ha_err: xn?.e ?? null,
      log_oiii_hb: y?.v ?? null,
      log_oiii_hb_err: y?.e ?? null,
      log_sii_ha: xs?.v ?? null,
      log_sii_ha_err: xs?.e ?? null,
      log_oi_ha: xo?.v ?? null,
      log_oi_ha_err: xo?.e ?? null,
    },
    broad_balmer: lines.some((l) => l.component === 'broad' && !l.limit),
    method: METHOD,
  };
}

// zvet's line fluxes and classes against the survey's own emission-line fits: SDSS spec-*.fits
// HDU 3 (SPZLINE: LINENAME, LINEWAVE vacuum Å, LINEAREA flux, LINEAREA_ERR), read with Debian's
// astropy; the spectra are read by zvet and measured at the survey's redshift (HDU 2 Z).
import { describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { analyseHost, type HostAnalysis } from '../../core/hosts/analyse.js';
import { aboveHyperbola, ASYMPTOTE, kauffmann03, kewley01Nii } from '../../core/hosts/demarcation.js';
import { readSpectrumFile } from '../../core/node/read-spectrum-file.js';
import { OPEN_SPECTRA } from '../support/paths.js';
import { astropyJson } from '../support/tools.js';

// Narrow-line galaxies of the open set (star-forming and passive). Excluded, with the reason:
// the survey's BROADLINE objects (0907-0419, 2295-0017, 3655-0660): the survey fits one Gaussian
// per line with one width for all Balmer lines, zvet a narrow plus a broad component, so their
// "Hα flux" is not the same quantity; quasars and stars carry no host lines in range.
const FILES = [
  'spec-0395-51783-0525.fits',
  'spec-1678-53433-0425.fits',
  'spec-2095-53474-0355.fits',
  'spec-2580-54092-0470.fits',
  'spec-0266-51602-0001.fits',
  'spec-2515-54180-0377.fits',
  'spec-4055-55359-0006.fits',
];

interface SurveyLine { name: string; wave: number; area: number; err: number }
interface SurveyFit { z: number; lines: SurveyLine[] }

const SCRIPT = `
import sys, json
from astropy.io import fits
out = {}
for f in sys.argv[1:]:
    with fits.open(f) as h:
        t = h[3].data
        out[f.split('/')[-1]] = {
            'z': float(h[2].data['Z'][0]),
            'lines': [dict(name=str(r['LINENAME']).strip(), wave=float(r['LINEWAVE']),
                           area=float(r['LINEAREA']), err=float(r['LINEAREA_ERR'])) for r in t],
        }
print(json.dumps(out))
`;

function bptFrom(nii: number, ha: number, oiii: number, hb: number): string {
  const x = Math.log10(nii / ha);
  const y = Math.log10(oiii / hb);
  if (aboveHyperbola(kewley01Nii, ASYMPTOTE.kewley01Nii, x, y)) return 'agn';
  if (aboveHyperbola(kauffmann03, ASYMPTOTE.kauffmann03, x, y)) return 'composite';
  return 'star-forming';
}

/** Distance (dex, in log [O III]/Hβ) of a point from the nearer of the two [N II] lines. */
function marginDex(nii: number, ha: number, oiii: number, hb: number): number {
  const x = Math.log10(nii / ha);
  const y = Math.log10(oiii / hb);
  const d = (curve: (x: number) => number, asym: number) => (x >= asym ? Infinity : Math.abs(y - curve(x)));
  return Math.min(d(kauffmann03, ASYMPTOTE.kauffmann03), d(kewley01Nii, ASYMPTOTE.kewley01Nii));
}

describe('host lines against the survey line fits', async () => {
  const survey = astropyJson<Record<string, SurveyFit>>(SCRIPT, FILES.map((f) => join(OPEN_SPECTRA, 'sdss', f)));
  const analyses = new Map<string, HostAnalysis>();
  for (const f of FILES) analyses.set(f, analyseHost(await readSpectrumFile(join(OPEN_SPECTRA, 'sdss', f)), survey[f].z));

  it('fluxes of lines with survey S/N > 10: median ratio within 15 %, ≥ 80 % within 25 %', () => {
    const ratios: number[] = [];
    const rows: string[] = [];
    for (const f of FILES) {
      for (const s of survey[f].lines) {
        if (!(s.err > 0 && s.area / s.err > 10)) continue;
        const mine = analyses.get(f)!.lines.find((l) => l.component === 'narrow' && Math.abs(l.rest_wave - s.wave) < 0.5);
        if (!mine) continue; // a line zvet does not fit (Hγ, [Ne III], [Ar III], ...)
        ratios.push(mine.flux / s.area);
        rows.push(`${f} ${mine.name} zvet ${mine.flux.toFixed(1)}±${mine.flux_err.toFixed(1)} survey ${s.area.toFixed(1)}±${s.err.toFixed(1)} ratio ${(mine.flux / s.area).toFixed(3)}`);
      }
    }
    console.log(rows.join('\n'));
    const sorted = [...ratios].sort((a, b) => a - b);
    const median = sorted[Math.floor(sorted.length / 2)];
    const within25 = ratios.filter((r) => Math.abs(r - 1) <= 0.25).length / ratios.length;
    console.log(`lines compared: ${ratios.length}, median ratio ${median.toFixed(3)}, within 25 %: ${(100 * within25).toFixed(0)} %`);
    expect(ratios.length).toBeGreaterThan(30);
    expect(Math.abs(median - 1)).toBeLessThan(0.15);
    expect(within25).toBeGreaterThanOrEqual(0.8);
  });

  it('the [N II] class agrees with what the same lines give from the survey fluxes', () => {
    const rows: string[] = [];
    for (const f of FILES) {
      const a = analyses.get(f)!;
      const get = (wave: number) => survey[f].lines.find((l) => Math.abs(l.wave - wave) < 0.5)!;
      const [nii, ha, oiii, hb] = [6585.27, 6564.61, 5008.24, 4862.68].map(get);
      const enough = [nii, ha, oiii, hb].every((l) => l.err > 0 && l.area / l.err >= 3);
      const surveyClass = enough ? bptFrom(nii.area, ha.area, oiii.area, hb.area) : 'insufficient';
      const margin = enough ? marginDex(nii.area, ha.area, oiii.area, hb.area) : Infinity;
      rows.push(`${f} zvet ${a.classification.bpt} survey ${surveyClass} (survey point ${margin.toFixed(3)} dex from the nearer line)`);
      // Points within 0.1 dex of a demarcation line are on it within the few-per-cent systematic
      // differences of two line-fitting methods (continuum model, profile, tied widths); there the
      // classes may differ and zvet's point must then lie within 0.1 dex of that line as well.
      if (margin > 0.1) expect(a.classification.bpt, f).toBe(surveyClass);
      else if (a.classification.bpt !== surveyClass) {
        const p = a.classification.point;
        const x = p.log_nii_ha!;
        const y = p.log_oiii_hb!;
        expect(Math.min(Math.abs(y - kauffmann03(x)), Math.abs(y - kewley01Nii(x))), f).toBeLessThan(0.1);
      }
    }
    console.log(rows.join('\n'));
  });

  it('a passive galaxy gets no false Hα detection and no SFR', () => {
    const a = analyses.get('spec-2515-54180-0377.fits')!;
    expect(a.lines.find((l) => l.name === 'Halpha')!.limit).toBe(true);
    expect(a.sfr.sfr_kennicutt98_msun_yr).toBeNull();
  });
});

// Host diagnostics on synthetic spectra with injected lines, and the published formulas they use.
import { describe, expect, it } from 'vitest';
import { analyseHost } from '../../core/hosts/analyse.js';
import { kCalzetti2000, kCcm89 } from '../../core/hosts/attenuation.js';
import { balmerDecrement } from '../../core/hosts/balmer.js';
import { kauffmann03, kewley01Nii, kewley01Oi, kewley01Sii, kewley06OiSeyfertLiner, kewley06SiiSeyfertLiner } from '../../core/hosts/demarcation.js';
import { parseFluxDensityUnit } from '../../core/hosts/flux-unit.js';
import { measureLines } from '../../core/hosts/measure-lines.js';
import { haLuminosityErgS, sfrKennicutt98, sfrKennicuttEvans12 } from '../../core/hosts/sfr.js';
import { restLine } from '../../core/redshift/line-list.js';
import { syntheticSpectrum, type InjectedLine } from './host-synthetic.js';

const w = (id: string) => restLine(id).waveVacuumAngstrom;

function starForming(sigmaKmS = 110): InjectedLine[] {
  return [
    { restWaveAngstrom: w('Halpha'), flux: 600, sigmaKmS },
    { restWaveAngstrom: w('[NII]6585'), flux: 120, sigmaKmS },
    { restWaveAngstrom: w('[NII]6550'), flux: 120 / 3.05, sigmaKmS },
    { restWaveAngstrom: w('Hbeta'), flux: 600 / 3.5, sigmaKmS },
    { restWaveAngstrom: w('[OIII]5008'), flux: 150, sigmaKmS },
    { restWaveAngstrom: w('[OIII]4960'), flux: 150 / 2.98, sigmaKmS },
    { restWaveAngstrom: w('[SII]6718'), flux: 80, sigmaKmS },
    { restWaveAngstrom: w('[SII]6733'), flux: 60, sigmaKmS },
    { restWaveAngstrom: w('[OI]6302'), flux: 20, sigmaKmS },
    { restWaveAngstrom: w('[OII]3727'), flux: 200, sigmaKmS },
    { restWaveAngstrom: w('[OII]3730'), flux: 260, sigmaKmS },
  ];
}

describe('line measurement on injected Gaussians', () => {
  it('recovers fluxes within their errors: pulls over 100 noise realisations have rms ≈ 1, mean ≈ 0 off the Balmer lines', () => {
    const lines = starForming();
    const truth = new Map<string, number>(lines.map((l) => [REST_ID.get(l.restWaveAngstrom)!, l.flux]));
    const balmer = new Set(['Halpha', 'Hbeta']);
    const pulls = { balmer: [] as number[], other: [] as number[] };
    for (let seed = 1; seed <= 100; seed++) {
      const m = measureLines(syntheticSpectrum({ z: 0.04, lines, noise: 0.6, seed }), 0.04);
      for (const l of m.lines) {
        if (l.component !== 'narrow' || l.limit) continue;
        pulls[balmer.has(l.name) ? 'balmer' : 'other'].push((l.flux - truth.get(l.name)!) / l.flux_err);
      }
    }
    const mean = (p: number[]) => p.reduce((s, x) => s + x, 0) / p.length;
    const rms = (p: number[]) => Math.sqrt(p.reduce((s, x) => s + (x - mean(p)) ** 2, 0) / p.length);
    // ≈ 900 pulls off the Balmer lines: the mean has σ ≈ 0.035 (more, since lines of one group
    // share their noise); allow 0.15. The rms of a correct error is 1 (±0.03); the free
    // [O II]/[S II] ratios may inflate errors slightly, so 0.8–1.2 is required.
    expect(pulls.other.length).toBeGreaterThan(850);
    expect(Math.abs(mean(pulls.other))).toBeLessThan(0.15);
    expect(rms(pulls.other)).toBeGreaterThan(0.8);
    expect(rms(pulls.other)).toBeLessThan(1.2);
    // Hα and Hβ carry a fitted stellar absorption component that cannot go below zero: with
    // none injected it soaks up downward noise only, so their fluxes come out high by about
    // 0.3–0.4σ (measured over 600 realisations). The bias is bounded here, not hidden.
    expect(pulls.balmer.length).toBeGreaterThan(190);
    expect(mean(pulls.balmer)).toBeGreaterThan(0);
    expect(mean(pulls.balmer)).toBeLessThan(0.6);
    expect(rms(pulls.balmer)).toBeGreaterThan(0.8);
    expect(rms(pulls.balmer)).toBeLessThan(1.2);
  });

  it('gives widths with the instrument removed and rest-frame equivalent widths', () => {
    const sigmaIntrinsic = 100;
    const instFwhmAngstrom = 3.0;
    const z = 0.05;
    const obsHa = w('Halpha') * (1 + z);
    const sigmaInst = (299792.458 * instFwhmAngstrom) / 2.3548 / obsHa;
    const lines = starForming(Math.hypot(sigmaIntrinsic, sigmaInst));
    const s = syntheticSpectrum({ z, lines, noise: 0.05, seed: 3, continuum: () => 10 });
    const m = measureLines(s, z, { instrumentalFwhmAngstrom: instFwhmAngstrom });
    const ha = m.lines.find((l) => l.name === 'Halpha')!;
    expect(ha.fwhm_kms!).toBeCloseTo(2.3548 * sigmaIntrinsic, -1);
    // EW_rest = F / (continuum · (1+z)) = 600 / (10 · 1.05).
    expect(ha.ew_rest).toBeCloseTo(600 / 10 / 1.05, 0);
  });

  it('reports undetected lines as 3σ upper limits', () => {
    const lines = starForming().filter((l) => l.restWaveAngstrom !== w('[OI]6302'));
    const m = measureLines(syntheticSpectrum({ z: 0.03, lines, noise: 0.6, seed: 9 }), 0.03);
    const oi = m.lines.find((l) => l.name === '[OI]6302')!;
    expect(oi.limit).toBe(true);
    expect(oi.flux).toBeCloseTo(3 * oi.flux_err, 10);
    expect(oi.fwhm_kms).toBeNull();
  });

  it('lists lines outside the spectrum as not covered', () => {
    const m = measureLines(syntheticSpectrum({ z: 0.5, lines: starForming(), noise: 0.6, seed: 2 }), 0.5);
    expect(m.not_covered).toEqual(expect.arrayContaining(['Halpha', '[NII]6585', '[SII]6718']));
    expect(m.lines.some((l) => l.name === 'Hbeta')).toBe(true);
  });

  it('fits stellar Balmer absorption under Hβ, so the emission flux is not eaten by it', () => {
    const lines: InjectedLine[] = [...starForming(), { restWaveAngstrom: w('Hbeta'), flux: -40, sigmaKmS: 700 }];
    const m = measureLines(syntheticSpectrum({ z: 0.04, lines, noise: 0.3, seed: 5, continuum: () => 10 }), 0.04);
    const hb = m.lines.find((l) => l.name === 'Hbeta')!;
    const abs = m.stellar_absorption.find((a) => a.line === 'Hbeta')!;
    expect(Math.abs(hb.flux - 600 / 3.5)).toBeLessThan(3 * hb.flux_err);
    // Injected absorption EW: 40 / (10 · 1.04) = 3.85 Å rest.
    expect(abs.ew_rest).toBeGreaterThan(2.5);
    expect(abs.ew_rest).toBeLessThan(5.5);
  });

  it('keeps the absorption under a strong Hα line within its cap (5 Å rest against the continuum)', () => {
    // A deep, wide trough (EW 120 / (10 · 1.04) = 11.5 Å rest) under bright Hα: the fit may take
    // only up to the cap, not a depth scaled to the emission peak (which allowed 15 Å).
    const lines: InjectedLine[] = [...starForming().map((l) => (l.restWaveAngstrom === w('Halpha') ? { ...l, flux: 3000 } : l)), { restWaveAngstrom: w('Halpha'), flux: -120, sigmaKmS: 600 }];
    const m = measureLines(syntheticSpectrum({ z: 0.04, lines, noise: 0.3, seed: 7, continuum: () => 10 }), 0.04);
    const abs = m.stellar_absorption.find((a) => a.line === 'Halpha')!;
    expect(abs.ew_rest).toBeGreaterThan(4);
    expect(abs.ew_rest).toBeLessThan(5.5);
  });

  it('separates a broad Hα component from the narrow lines', () => {
    const lines: InjectedLine[] = [...starForming(), { restWaveAngstrom: w('Halpha'), flux: 3000, sigmaKmS: 1800 }, { restWaveAngstrom: w('Hbeta'), flux: 900, sigmaKmS: 1800 }];
    const a = analyseHost(syntheticSpectrum({ z: 0.04, lines, noise: 0.4, seed: 6 }), 0.04);
    const broad = a.lines.find((l) => l.name === 'Halpha_broad')!;
    const narrow = a.lines.find((l) => l.name === 'Halpha')!;
    expect(a.classification.broad_balmer).toBe(true);
    expect(Math.abs(broad.flux - 3000)).toBeLessThan(4 * broad.flux_err);
    expect(Math.abs(narrow.flux - 600)).toBeLessThan(4 * narrow.flux_err);
  });
});

const REST_ID = new Map(['Halpha', '[NII]6585', '[NII]6550', 'Hbeta', '[OIII]5008', '[OIII]4960', '[SII]6718', '[SII]6733', '[OI]6302', '[OII]3727', '[OII]3730'].map((id) => [w(id), id]));

describe('classification', () => {
  it('puts an injected star-forming spectrum below Kauffmann (2003) and an injected Seyfert above Kewley (2001)', () => {
    const sf = analyseHost(syntheticSpectrum({ z: 0.04, lines: starForming(), noise: 0.3, seed: 11 }), 0.04);
    expect(sf.classification.bpt).toBe('star-forming');
    expect(sf.classification.sii).toBe('star-forming');
    const sey = starForming().map((l) => {
      const id = REST_ID.get(l.restWaveAngstrom)!;
      const scale: Record<string, number> = { '[OIII]5008': 8, '[OIII]4960': 8, '[NII]6585': 4, '[NII]6550': 4, '[SII]6718': 2.5, '[SII]6733': 2.5, '[OI]6302': 6 };
      return { ...l, flux: l.flux * (scale[id] ?? 1) };
    });
    const agn = analyseHost(syntheticSpectrum({ z: 0.04, lines: sey, noise: 0.3, seed: 12 }), 0.04);
    // log [O III]/Hβ = log(1200/171) = 0.85; log [N II]/Hα = log(480/600) = −0.10: above Kewley 2001.
    expect(agn.classification.bpt).toBe('agn');
    expect(agn.classification.agn_type).toBe('seyfert');
    // An AGN adds to Hα: the SFR is an upper limit there, a value for the star-forming one.
    expect(agn.sfr.upper_limit).toBe(true);
    expect(agn.sfr.caveat).toMatch(/upper limit/);
    expect(sf.sfr.upper_limit).toBe(false);
  });

  it('says which lines are missing when it cannot classify', () => {
    const lines = starForming().filter((l) => l.restWaveAngstrom !== w('Hbeta'));
    const a = analyseHost(syntheticSpectrum({ z: 0.04, lines, noise: 0.6, seed: 13 }), 0.04);
    expect(a.classification.bpt).toBe('insufficient');
    expect(a.classification.missing).toContain('Hbeta');
  });
});

describe('published curves and constants', () => {
  it('demarcation curves at points computed from the published formulas', () => {
    // Kauffmann et al. (2003) eq. 1 at log([N II]/Hα) = −0.5: 0.61/(−0.55) + 1.3 = 0.19091.
    expect(kauffmann03(-0.5)).toBeCloseTo(0.61 / -0.55 + 1.3, 12);
    expect(kauffmann03(-0.5)).toBeCloseTo(0.19091, 5);
    // Kewley et al. (2001) eq. 5 at −0.5: 0.61/(−0.97) + 1.19 = 0.56113.
    expect(kewley01Nii(-0.5)).toBeCloseTo(0.56113, 5);
    // At log([N II]/Hα) = 0 the curves give log([O III]/Hβ) = −10.9 (Kauffmann) and −0.10787 (Kewley).
    expect(kauffmann03(0)).toBeCloseTo(-10.9, 10);
    expect(kewley01Nii(0)).toBeCloseTo(-0.10787, 5);
    // Kewley et al. (2001) eqs. 6, 7 and Kewley et al. (2006) eqs. 6, 7 (the Seyfert/LINER lines,
    // 1.89x + 0.76 and 1.18x + 1.30; coefficients from memory of those papers).
    expect(kewley01Sii(-0.4)).toBeCloseTo(0.72 / -0.72 + 1.3, 12);
    expect(kewley01Oi(-1.2)).toBeCloseTo(0.73 / -0.61 + 1.33, 12);
    expect(kewley06SiiSeyfertLiner(0)).toBeCloseTo(0.76, 12);
    expect(kewley06OiSeyfertLiner(-1)).toBeCloseTo(0.12, 12);
  });

  it('attenuation k at Hβ and Hα as commonly quoted (from memory): Calzetti 4.60 / 3.33, CCM 3.61 / 2.53', () => {
    // Quoted to two decimals at air wavelengths; at our vacuum wavelengths k moves by < 0.002.
    expect(Math.abs(kCalzetti2000(w('Hbeta')) - 4.6)).toBeLessThan(0.01);
    expect(Math.abs(kCalzetti2000(w('Halpha')) - 3.33)).toBeLessThan(0.01);
    expect(kCcm89(w('Hbeta'))).toBeCloseTo(3.61, 1);
    expect(kCcm89(w('Halpha'))).toBeCloseTo(2.53, 1);
  });

  it('Balmer decrement of 2.86 gives E(B−V) = 0, and 2.86·10^0.4 gives 1/(k(Hβ)−k(Hα))', () => {
    const mk = (name: string, flux: number) => ({ name, rest_wave: w(name), flux, flux_err: flux / 100, ew_rest: 10, ew_rest_err: 0.1, sn: 100, fwhm_kms: 200, fwhm_kms_err: 5, velocity_offset_kms: 0, limit: false, component: 'narrow' as const, group: '' });
    expect(balmerDecrement([mk('Halpha', 286), mk('Hbeta', 100)], 'calzetti2000').ebv).toBeCloseTo(0, 12);
    const b = balmerDecrement([mk('Halpha', 286 * 10 ** 0.4), mk('Hbeta', 100)], 'ccm89');
    expect(b.ebv!).toBeCloseTo(1 / (b.k_hbeta - b.k_halpha), 10);
    expect(b.halpha_flux_corrected!).toBeCloseTo(286 * 10 ** 0.4 * 10 ** (0.4 * b.k_halpha * b.ebv!), 6);
  });

  it('SFR constants: Kennicutt (1998) 7.9e-42, Kennicutt & Evans (2012) log SFR = log L − 41.27', () => {
    expect(sfrKennicutt98(1e41)).toBeCloseTo(0.79, 12);
    expect(sfrKennicuttEvans12(10 ** 41.27)).toBeCloseTo(1, 12);
    // 1e-17 erg/s/cm² at 100 Mpc: 4π (3.0856776e26 cm)² × 1e-17 = 1.19647e37 erg/s.
    expect(haLuminosityErgS(1e-17, 100) / 1.19647e37).toBeCloseTo(1, 4);
  });

  it('reads flux-density units with their scale, and refuses unknown ones with a reason', () => {
    const sdss = parseFluxDensityUnit('1E-17 erg/cm^2/s/Ang');
    expect(sdss.ok && sdss.scale / 1e-17).toBeCloseTo(1, 12);
    const spaced = parseFluxDensityUnit('10^-17 erg s^-1 cm^-2 Angstrom^-1');
    expect(spaced.ok && spaced.scale / 1e-17).toBeCloseTo(1, 12);
    expect(parseFluxDensityUnit('erg/s/cm2/A')).toMatchObject({ ok: true, scale: 1 });
    expect(parseFluxDensityUnit('counts')).toMatchObject({ ok: false });
    expect(parseFluxDensityUnit('')).toMatchObject({ ok: false });
  });

  it('gives no luminosity for an unknown flux unit and says why', () => {
    const s = syntheticSpectrum({ z: 0.04, lines: starForming(), noise: 0.3, seed: 14, fluxUnit: 'ADU' });
    const a = analyseHost(s, 0.04);
    expect(a.lines.find((l) => l.name === 'Halpha')!.flux).toBeGreaterThan(0);
    expect(a.sfr.l_halpha_erg_s).toBeNull();
    expect(a.sfr.note).toMatch(/ADU/);
    expect(a.sfr.caveat).toMatch(/slit or fibre/);
  });
});

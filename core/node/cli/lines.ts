/**
 * `zvet lines FILE --z Z [--json] [--hdu N] [--preset NAME] [--curve calzetti2000|ccm89]
 * [--instrumental-fwhm Å] [--site NAME] [--air|--vacuum]`: emission-line fluxes, equivalent widths and widths at a
 * given redshift, the diagnostic-diagram classes, the Balmer decrement and the Hα star-formation
 * rate, with the luminosity distance at the CMB-frame z where the header allows that correction.
 */
import type { Command } from 'commander';
import { framesOrNull } from '../../astro/frames.js';
import { analyseHost, type HostAnalysis } from '../../hosts/analyse.js';
import type { AttenuationCurve } from '../../hosts/attenuation.js';
import { maxInstrumentalFwhmAngstrom } from '../../hosts/measure-lines.js';
import { distanceBasis } from '../../hosts/sfr.js';
import { readSpectrumFile } from '../read-spectrum-file.js';
import { modelFromOptions } from './cosmo.js';
import { mediumOption, withMediumOptions, type MediumFlags } from './medium-option.js';
import { numberOption } from './number-option.js';
import { runAction } from './run-action.js';
import { SITE_OPTION_HELP, siteOption } from './site-option.js';
import { UsageError } from './usage-error.js';

interface LinesOptions extends MediumFlags {
  z: string;
  json?: boolean;
  hdu?: string;
  preset?: string;
  curve?: string;
  instrumentalFwhm?: string;
  site?: string;
}

const CURVES: AttenuationCurve[] = ['calzetti2000', 'ccm89'];

export function registerLines(program: Command): void {
  const command = program
    .command('lines')
    .description('measure emission lines at a redshift; classify the host (BPT, [S II], [O I]); dust and Hα SFR')
    .argument('<file>', 'spectrum file (FITS or text)')
    .requiredOption('--z <z>', 'redshift to measure at (a vetted one: the lines are fitted within ±400 km/s of it)')
    .option('--json', 'print one JSON object (snake_case keys, units in the names)')
    .option('--hdu <n>', 'read this HDU (0 = primary)')
    .option('--preset <name>', 'cosmology for the luminosity distance (planck18, round70; default planck18)')
    .option('--curve <name>', `attenuation curve: ${CURVES.join(', ')} (default calzetti2000)`)
    .option('--instrumental-fwhm <angstrom>', 'instrumental FWHM in observed Å, removed from the line widths')
    .option('--site <name>', SITE_OPTION_HELP);
  withMediumOptions(command, "the file's")
    .action(runAction(async (file: string, opts: LinesOptions) => {
      const medium = mediumOption(opts);
      const z = numberOption('--z', opts.z, 0);
      const hdu = opts.hdu === undefined ? undefined : numberOption('--hdu', opts.hdu, 0);
      if (hdu !== undefined && !Number.isInteger(hdu)) throw new UsageError(`--hdu: "${opts.hdu}" is not an HDU number (0 = primary)`);
      const curve = (opts.curve ?? 'calzetti2000') as AttenuationCurve;
      if (!CURVES.includes(curve)) throw new UsageError(`--curve: no curve "${opts.curve}" (known: ${CURVES.join(', ')})`);
      const instrumentalFwhmAngstrom = opts.instrumentalFwhm === undefined ? undefined : numberOption('--instrumental-fwhm', opts.instrumentalFwhm, 0);
      const widest = maxInstrumentalFwhmAngstrom(z);
      if (instrumentalFwhmAngstrom !== undefined && instrumentalFwhmAngstrom > widest.fwhmAngstrom) {
        throw new UsageError(`--instrumental-fwhm: ${opts.instrumentalFwhm} Å is wider than the line fit can work with at z = ${z} (at most ${widest.fwhmAngstrom.toFixed(1)} Å, a third of the narrowest fit window: ${widest.window})`);
      }
      const cosmology = modelFromOptions({ preset: opts.preset });
      const spectrum = await readSpectrumFile(file, { hdu, medium });
      const frames = framesOrNull({ zObs: z, meta: spectrum.meta, site: siteOption(opts.site), cosmology });
      const analysis = analyseHost(spectrum, z, { cosmology, attenuation: curve, instrumentalFwhmAngstrom, frames });
      process.stdout.write(opts.json ? `${JSON.stringify({ file, ...analysis })}\n` : formatAnalysis(file, analysis));
    }));
}

const num = (v: number | null | undefined, digits: number) => (v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(digits));
const sci = (v: number | null | undefined, digits = 3) => (v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toExponential(digits));

/** The readable report: line table, classes, dust and SFR, with units and the caveats. */
export function formatAnalysis(file: string, a: HostAnalysis): string {
  const unit = a.measurement.flux_unit || '(file gives no flux unit)';
  const out: string[] = [];
  out.push(`${file} at z = ${a.z}`);
  out.push(`line fluxes in ${unit} × Å; EW in rest-frame Å (positive = emission); FWHM in km/s${a.measurement.instrumental_fwhm_angstrom === null ? ' (instrumental width NOT removed: give --instrumental-fwhm)' : ` (instrumental ${a.measurement.instrumental_fwhm_angstrom} Å removed)`}`);
  out.push('');
  const header = ['line', 'rest λ vac Å', 'flux', '± 1σ', 'S/N', 'EW rest Å', 'FWHM km/s', 'Δv km/s'];
  const rows = a.lines.map((l) => [
    l.name,
    num(l.rest_wave, 2),
    `${l.limit ? '< ' : ''}${num(l.flux, 2)}`,
    num(l.flux_err, 2),
    num(l.sn, 1),
    `${l.limit ? '< ' : ''}${num(l.ew_rest, 2)}`,
    num(l.fwhm_kms, 0),
    num(l.velocity_offset_kms, 0),
  ]);
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const fmt = (r: string[]) => r.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ');
  out.push(fmt(header), ...rows.map(fmt));
  out.push('("< " = 3σ upper limit, S/N < 3)');
  if (a.measurement.not_covered.length) out.push(`not covered by the spectrum: ${a.measurement.not_covered.join(', ')}`);
  // A component at a bound of its range (none, or the cap) has no error from the covariance.
  for (const s of a.measurement.stellar_absorption) out.push(`stellar absorption under ${s.line}: EW ${num(s.ew_rest, 2)} Å rest ${s.ew_rest_err > 0 ? `± ${num(s.ew_rest_err, 2)} (fitted)` : '(at a bound of the fit: no error)'}`);
  out.push('');
  const c = a.classification;
  out.push(`class ([N II] BPT): ${c.bpt}${c.agn_type ? ` (${c.agn_type})` : ''}${c.broad_balmer ? '; broad Balmer lines: type-1 AGN' : ''}`);
  out.push(`[S II] diagram: ${c.sii}   [O I] diagram: ${c.oi}`);
  if (c.missing.length) out.push(`lines without S/N ≥ 3: ${c.missing.join(', ')}`);
  const p = c.point;
  out.push(`log [N II]/Hα = ${num(p.log_nii_ha, 3)} ± ${num(p.log_nii_ha_err, 3)}   log [O III]/Hβ = ${num(p.log_oiii_hb, 3)} ± ${num(p.log_oiii_hb_err, 3)}`);
  out.push('');
  const b = a.balmer;
  out.push(`Balmer decrement Hα/Hβ = ${num(b.decrement, 2)} ± ${num(b.decrement_err, 2)} (intrinsic ${b.intrinsic}, case B)`);
  out.push(`E(B−V) = ${num(b.ebv, 3)} ± ${num(b.ebv_err, 3)} mag, ${b.curve_source}: k(Hβ) = ${num(b.k_hbeta, 2)}, k(Hα) = ${num(b.k_halpha, 2)}; ${b.note}`);
  const s = a.sfr;
  out.push(`L(Hα) = ${sci(s.l_halpha_erg_s)} ± ${sci(s.l_halpha_err_erg_s, 1)} erg/s${s.dust_corrected ? ' (dust-corrected)' : ''}; D_L = ${num(s.luminosity_distance_mpc, 1)} Mpc (${distanceBasis(s.luminosity_distance_from)}, ${s.cosmology.split(':')[0]})`);
  const sfrText = (v: number | null, err: number | null) => (s.upper_limit && v !== null ? `SFR < ${num(v, 3)} M☉/yr (upper limit: an AGN contributes to Hα)` : `SFR = ${num(v, 3)} ± ${num(err, 3)} M☉/yr`);
  out.push(`${sfrText(s.sfr_kennicutt98_msun_yr, s.sfr_kennicutt98_err_msun_yr)} (Kennicutt 1998, ${s.imf.kennicutt98})`);
  out.push(`${sfrText(s.sfr_ke12_msun_yr, s.sfr_ke12_err_msun_yr)} (Kennicutt & Evans 2012, ${s.imf.ke12})`);
  if (s.note) out.push(`note: ${s.note}`);
  out.push(`caveat: ${s.caveat}`);
  return `${out.join('\n')}\n`;
}

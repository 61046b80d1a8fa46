/**
 * `zvet inspect FILE [--hdu N] [--json] [--pixels] [--air|--vacuum]`: what zvet reads from a
 * spectrum file — layout, HDU, pixels, vacuum wavelength range, air or vacuum and why,
 * dispersion, flux unit, kind of error, mask, sky, object, position, time, exposure, site and
 * velocity frame.
 */
import type { Command } from 'commander';
import { pixelTable, summariseSpectrum, type SpectrumSummary } from '../../spectrum/summary.js';
import { readSpectrumFile } from '../read-spectrum-file.js';
import { mediumOption, withMediumOptions, type MediumFlags } from './medium-option.js';
import { runAction } from './run-action.js';
import { UsageError } from './usage-error.js';
import { parseDecimal } from '../../util/decimal.js';

interface InspectOptions extends MediumFlags {
  hdu?: string;
  json?: boolean;
  pixels?: boolean;
}

export function registerInspect(program: Command): void {
  const command = program
    .command('inspect')
    .description('show what zvet reads from a spectrum file (FITS or text)')
    .argument('<file>', 'spectrum file (FITS, gzip-compressed FITS, CSV/TSV/whitespace text)')
    .option('--hdu <n>', 'read this HDU (0 = primary) instead of the first one holding a spectrum')
    .option('--json', 'print one JSON object (snake_case keys, units in the names)')
    .option('--pixels', 'with --json: add every pixel (vacuum wavelength in Å, flux, 1σ error, mask)');
  withMediumOptions(command, "the file's")
    .action(runAction(async (file: string, opts: InspectOptions) => {
      const medium = mediumOption(opts);
      const hdu = opts.hdu === undefined ? undefined : parseHdu(opts.hdu);
      const spectrum = await readSpectrumFile(file, { hdu, medium });
      const summary = { ...summariseSpectrum(spectrum), file };
      if (opts.json) {
        const out = opts.pixels ? { ...summary, pixels: pixelTable(spectrum) } : summary;
        process.stdout.write(`${JSON.stringify(out)}\n`);
      } else {
        if (opts.pixels) throw new UsageError('--pixels needs --json');
        process.stdout.write(formatSummary(summary));
      }
    }));
}

function parseHdu(text: string): number {
  const n = parseDecimal(text);
  if (n === null || !Number.isInteger(n) || n < 0) throw new UsageError(`--hdu: "${text}" is not an HDU number (0 = primary)`);
  return n;
}

const fixed = (v: number | null, digits: number, unit = '') => (v === null ? '—' : `${v.toFixed(digits)}${unit}`);

/** The readable summary: one aligned 'label  value' line per item, units written out. */
export function formatSummary(s: SpectrumSummary): string {
  const site = s.site
    ? [
        s.site.name,
        s.site.latitude_deg !== null ? `lat ${fixed(s.site.latitude_deg, 5, '°')}` : null,
        s.site.longitude_deg !== null ? `lon ${fixed(s.site.longitude_deg, 5, '° E')}` : null,
        s.site.height_m !== null ? `height ${fixed(s.site.height_m, 0, ' m')}` : null,
      ]
        .filter(Boolean)
        .join(', ')
    : '—';
  const rows: Array<[string, string]> = [
    ['file', s.file],
    ['format', s.format],
    ['HDU read', s.hdu === null ? '— (text)' : `${s.hdu}${s.spectrum_hdus.length > 1 ? ` (spectra in HDUs ${s.spectrum_hdus.join(', ')}; choose with --hdu)` : ''}`],
    ['pixels', `${s.n_pixels}${s.has_mask ? `, ${s.n_masked} masked` : `, ${s.n_masked} unusable (no mask in file)`}`],
    ['wavelength (vacuum)', `${s.wave_min_angstrom.toFixed(2)} – ${s.wave_max_angstrom.toFixed(2)} Å${s.wave_flipped ? ' (file order was descending; flipped)' : ''}`],
    ['in the file', `${s.medium_in_file} wavelengths in ${s.wave_unit_in_file}: ${s.medium_reason}`],
    ['dispersion', s.dispersion],
    ['flux unit', s.flux_unit],
    ['error given as', s.error_kind === 'none' ? 'none' : s.error_kind === 'snr' ? 'S/N per pixel (σ = |flux| / S/N)' : `${s.error_kind} (shown as 1σ)`],
    ['sky', s.has_sky ? 'yes' : 'no'],
    ['object', s.object ?? '—'],
    ['RA, Dec', s.ra_deg === null || s.dec_deg === null ? (s.position_warning ? `—; WARNING: ${s.position_warning}` : '—') : `${s.ra_deg.toFixed(6)}°, ${s.dec_deg.toFixed(6)}°`],
    ['observed (UTC)', `${s.date_obs_utc === null ? '—' : `${s.date_obs_utc} (MJD ${fixed(s.mjd_obs, 5)}) from ${s.obs_time_from}`}${s.obs_time_warning ? `; WARNING: ${s.obs_time_warning}` : ''}`],
    ['exposure', fixed(s.exposure_s, 1, ' s')],
    ['site', site],
    ['velocity frame', `${s.velocity_frame}: ${s.velocity_frame_reason}`],
  ];
  const width = Math.max(...rows.map(([k]) => k.length));
  return rows.map(([k, v]) => `${k.padEnd(width)}  ${v}\n`).join('');
}

/**
 * `zvet export WORKLIST --format csv|ecsv|fits --out FILE [--site NAME] [--preset NAME | --h0 H
 * --om M --ol L]`: the worklist's catalogue, one row per spectrum (pending and unreadable ones
 * included), with the frame-corrected z, distances and host diagnostics of every vetted z,
 * written atomically. WORKLIST is the folder (or one spectrum file); its journal supplies the
 * verdicts.
 */
import type { Command } from 'commander';
import { CATALOGUE_FORMATS, formatFromFileName, type CatalogueFormat } from '../../catalogue/export.js';
import { exportCatalogue } from '../export-catalogue.js';
import { replaceProblem } from '../output-target.js';
import { Worklist } from '../worklist.js';
import { modelFromOptions, withCosmologyOptions } from './cosmo.js';
import { EXIT_OK, EXIT_SOME_FAILED, runAction } from './run-action.js';
import { SITE_OPTION_HELP, siteOption } from './site-option.js';
import { UsageError } from './usage-error.js';

interface ExportOptions {
  format?: string;
  out: string;
  site?: string;
  preset?: string;
  h0?: string;
  om?: string;
  ol?: string;
}

function chooseFormat(opts: ExportOptions): CatalogueFormat {
  const format = opts.format?.toLowerCase() ?? formatFromFileName(opts.out);
  if (format === null) throw new UsageError(`--format is needed: ${opts.out} does not end in .csv, .ecsv or .fits`);
  if (!(CATALOGUE_FORMATS as readonly string[]).includes(format)) throw new UsageError(`--format must be one of ${CATALOGUE_FORMATS.join(', ')}, not ${opts.format}`);
  return format as CatalogueFormat;
}

/** "a.fits" or "3 spectra (a.fits, b.fits, c.fits)". */
function listOf(spectra: string[]): string {
  return spectra.length === 1 ? spectra[0] : `${spectra.length} spectra (${spectra.join(', ')})`;
}

export function registerExport(program: Command): void {
  withCosmologyOptions(program.command('export'))
    .description('write the catalogue of a worklist (verdicts and file metadata, one row per spectrum)')
    .argument('<worklist>', 'worklist folder (its <name>.verdicts.jsonl holds the verdicts)')
    .option('--format <format>', `catalogue format: ${CATALOGUE_FORMATS.join(', ')} (default: from the --out file ending)`)
    .requiredOption('--out <file>', 'catalogue file to write (replaced atomically)')
    .option('--site <name>', SITE_OPTION_HELP)
    .action(runAction(async (worklistPath: string, opts: ExportOptions) => {
      const format = chooseFormat(opts);
      const cosmology = modelFromOptions(opts);
      const site = siteOption(opts.site);
      const worklist = await Worklist.open(worklistPath);
      const problem = await replaceProblem(opts.out, [{ files: [worklist.journalPath], what: 'the journal of verdicts' }, { files: worklist.entries.map((e) => e.absPath), what: 'a spectrum of the worklist' }]);
      if (problem) throw new UsageError(`--out ${opts.out}: ${problem}`);
      const links = worklist.linksWarning();
      for (const w of [...worklist.journal.warnings, ...(links ? [links] : [])]) process.stderr.write(`zvet: warning: ${w}\n`);
      const r = await exportCatalogue(worklist, format, opts.out, { cosmology, site });
      process.stdout.write(`wrote ${r.rows} rows to ${r.path} (${format}): ${r.vetted} vetted, ${r.pending} pending, ${r.unreadable} unreadable\n`);
      if (r.unreadableSpectra.length) process.stderr.write(`zvet: warning: ${listOf(r.unreadableSpectra)} could not be read: ${r.unreadableSpectra.length === 1 ? 'its row gives' : 'their rows give'} the reason (read_problem)\n`);
      if (r.notInWorklist.length) process.stderr.write(`zvet: warning: the journal has verdicts for ${listOf(r.notInWorklist)}, no longer in the worklist: left out of the catalogue (the journal keeps them)\n`);
      // Written in full either way; exit 1 says some rows lack what their file would have given.
      return r.unreadableSpectra.length ? EXIT_SOME_FAILED : EXIT_OK;
    }));
}

/**
 * `zvet measure PATH... [--out FILE|-] [--format csv|jsonl] [--jobs N] [--templates LIST]
 * [--zmin Z] [--zmax Z] [--line-list FILE] [--template-spectrum FILE] [--site NAME]
 * [--preset NAME | --h0 H --om M --ol L] [--lines] [--air|--vacuum]`: automatic redshift candidates for every
 * spectrum file (folders: every spectrum file below them), measured in parallel, one row per
 * input in input order, streamed; each row also has the best z in the barycentric (or
 * heliocentric) and CMB frames with distances, and with --lines the host diagnostics at that z.
 * Exit 0 when all were measured, 1 when some failed, 2 for usage errors. Automatic redshifts
 * are suggestions until vetted.
 */
import { SingleBar } from 'cli-progress';
import type { Command } from 'commander';
import { createWriteStream, type WriteStream } from 'node:fs';
import { readFile, realpath } from 'node:fs/promises';
import { availableParallelism } from 'node:os';
import { basename, resolve } from 'node:path';
import { MEASURE_LINE_COLUMNS, MEASURE_MEDIUM_COLUMNS, measureFrameColumns } from '../../catalogue/measure-derived-columns.js';
import { csvCells, csvHeader, csvLine, jsonlLine, MEASURE_COLUMNS, type MeasureColumn } from '../../redshift/measure-columns.js';
import { resolveTemplates, TemplateChoiceError } from '../../redshift/template-set.js';
import type { MeasureOptions } from '../../redshift/types.js';
import { LineListError, parseUserLineList } from '../../redshift/user-line-list.js';
import { defaultJobs, MAX_JOBS_PER_CORE, maxJobs, MeasurePool, type MeasureFileResult } from '../measure-pool.js';
import { realTarget } from '../output-target.js';
import { readSpectrumFile } from '../read-spectrum-file.js';
import { listSpectrumFiles } from '../spectrum-files.js';
import { ChunkedLines } from './chunked-lines.js';
import { mediumOption, withMediumOptions, type MediumFlags } from './medium-option.js';
import { modelFromOptions, withCosmologyOptions } from './cosmo.js';
import { SITE_OPTION_HELP, siteOption } from './site-option.js';
import { EXIT_OK, EXIT_SOME_FAILED, runAction } from './run-action.js';
import { UsageError } from './usage-error.js';
import { parseDecimal } from '../../util/decimal.js';

interface MeasureCliOptions extends MediumFlags {
  out?: string;
  format?: string;
  jobs?: string;
  templates?: string;
  zmin?: string;
  zmax?: string;
  lineList?: string;
  templateSpectrum?: string[];
  stageTimes?: boolean;
  site?: string;
  preset?: string;
  h0?: string;
  om?: string;
  ol?: string;
  lines?: boolean;
}

/** Exit code after Ctrl+C, as shells report a process ended by SIGINT (128 + 2). */
const EXIT_INTERRUPTED = 130;

/** Files submitted ahead of the one being written, per job (keeps memory flat). */
const AHEAD_PER_JOB = 8;

export function registerMeasure(program: Command, columns: MeasureColumn[] = MEASURE_COLUMNS): void {
  const command = withCosmologyOptions(program.command('measure'))
    .description('automatic redshift candidates for spectrum files and folders (suggestions until vetted)')
    .argument('<paths...>', 'spectrum files or folders (searched recursively)')
    .option('--out <file>', 'write the table here ("-" = standard output)', '-')
    .option('--format <format>', 'csv or jsonl (default: from the --out name, .jsonl/.ndjson or .csv; else csv)')
    .option('--jobs <n>', 'worker threads (default: all cores, one per 200 spectra in shorter batches)')
    .option('--templates <list>', 'comma-separated template names (default: all)')
    .option('--zmin <z>', 'lowest redshift searched by the galaxy and QSO templates; the star template (z = 0 ± 0.005, ±1500 km/s) is searched only when [zmin, zmax] includes 0, and is narrowed only by a bound inside ±0.005 on its own side of 0')
    .option('--zmax <z>', 'highest redshift searched by the galaxy and QSO templates (the star template: see --zmin)')
    .option('--line-list <file>', 'extra template from a JSON line list (rest-frame vacuum Å)')
    .option('--template-spectrum <file...>', 'extra templates from rest-frame spectra (any file zvet reads)')
    .option('--site <name>', SITE_OPTION_HELP)
    .option('--lines', 'also measure the host lines at the best z: Hα, Hβ, [O III], [N II] fluxes, BPT class, E(B−V), SFR')
    .option('--stage-times', 'print the time spent per stage (read, preprocess, correlate, refine) to standard error');
  withMediumOptions(command, "every file's")
    .action(runAction(async (paths: string[], opts: MeasureCliOptions) => measure(paths, opts, columns)));
}

async function measure(paths: string[], opts: MeasureCliOptions, baseColumns: MeasureColumn[]): Promise<number> {
  const medium = mediumOption(opts);
  const cosmology = modelFromOptions(opts);
  const site = siteOption(opts.site);
  const columns = [...baseColumns, ...MEASURE_MEDIUM_COLUMNS, ...measureFrameColumns({ site, cosmology }), ...(opts.lines ? MEASURE_LINE_COLUMNS : [])];
  const format = opts.format ?? formatFromOut(opts.out);
  if (format !== 'csv' && format !== 'jsonl') throw new UsageError(`--format: "${format}" is not csv or jsonl`);
  const jobs = opts.jobs === undefined ? undefined : positiveInt(opts.jobs, '--jobs');
  if (jobs !== undefined && jobs > maxJobs()) throw new UsageError(`--jobs: ${jobs} is more than ${maxJobs()} (${MAX_JOBS_PER_CORE} per core, ${availableParallelism()} cores here); workers beyond the cores only add memory`);
  const options: MeasureOptions = {
    templates: opts.templates ? opts.templates.split(',').map((s) => s.trim()).filter(Boolean) : undefined,
    zmin: opts.zmin === undefined ? undefined : finite(opts.zmin, '--zmin'),
    zmax: opts.zmax === undefined ? undefined : finite(opts.zmax, '--zmax'),
  };
  if (opts.lineList) {
    try {
      options.userLineTemplates = [parseUserLineList(await readFile(opts.lineList, 'utf8'), opts.lineList)];
    } catch (err) {
      if (err instanceof LineListError) throw new UsageError(err.message);
      throw err;
    }
  }
  if (opts.templateSpectrum?.length) {
    options.userSpectrumTemplates = [];
    for (const f of opts.templateSpectrum) {
      const s = await readSpectrumFile(f);
      options.userSpectrumTemplates.push({ name: basename(f).replace(/\.(fits|fit|fts|csv|tsv|txt|dat|ascii)(\.gz)?$/i, ''), waveRestAngstrom: s.waveAngstrom, flux: s.flux });
    }
  }
  try {
    resolveTemplates(options);
  } catch (err) {
    if (err instanceof TemplateChoiceError) throw new UsageError(err.message);
    throw err;
  }
  const listed = await listSpectrumFiles(paths, { followLinks: true });
  const files = opts.out === undefined || opts.out === '-' ? listed : await withoutOutput(listed, paths, opts.out);
  if (files.length === 0) throw new UsageError('no spectrum files found in the paths given');

  const out = opts.out === undefined || opts.out === '-' ? process.stdout : await openOutput(opts.out);
  const lines = new ChunkedLines(out);
  // No bar when the rows themselves go to the same terminal: the two would interleave.
  const bar = process.stderr.isTTY && !(out === process.stdout && process.stdout.isTTY) ? new SingleBar({ format: 'measuring [{bar}] {value}/{total} spectra', stream: process.stderr, hideCursor: true }) : null;
  bar?.start(files.length, 0);

  // Never more workers than spectra.
  const workers = Math.min(jobs ?? defaultJobs(files.length), files.length);
  const pool = new MeasurePool({ jobs: workers });
  const ahead = AHEAD_PER_JOB * workers;
  const pending: Promise<MeasureFileResult>[] = [];
  let submitted = 0, failed = 0, written = 0;
  // Ctrl+C ends the batch after the row being written, so the table holds whole rows, in input
  // order, for the first `written` inputs; a second Ctrl+C stops at once.
  let interrupted = false;
  const interrupt = () => (interrupted = true);
  process.once('SIGINT', interrupt);
  try {
    if (format === 'csv') await lines.write(csvLine(csvHeader(columns)));
    for (let i = 0; i < files.length && !interrupted; i++) {
      while (submitted < files.length && submitted < i + ahead) pending.push(pool.measureFile(files[submitted++], { ...options, medium, hostLines: opts.lines ? { cosmology, site } : undefined }));
      const result = await pending.shift()!;
      if (result.status !== 'ok') failed++;
      await lines.write(format === 'csv' ? csvLine(csvCells(columns, result)) : jsonlLine(columns, result));
      written++;
      bar?.increment();
    }
  } finally {
    process.removeListener('SIGINT', interrupt);
    bar?.stop();
    if (opts.stageTimes) {
      const t = pool.totals;
      process.stderr.write(`stage_times_ms ${JSON.stringify({ files: t.files, read_ms: t.readMs, preprocess_ms: t.preprocessMs, correlate_ms: t.correlateMs, refine_ms: t.refineMs })}\n`);
    }
    await pool.close();
    await lines.end();
    if (out !== process.stdout) await closeOutput(out as WriteStream);
  }
  if (interrupted) {
    process.stderr.write(`zvet: interrupted: the first ${written} of ${files.length} spectra were measured and written (whole rows, in input order); the rest were not\n`);
    return EXIT_INTERRUPTED;
  }
  // The last line on standard error says how the batch went, so a long run ends with its tally.
  if (failed < files.length) process.stderr.write('the z and confidence of every row are automatic suggestions until a person vets them (zvet serve)\n');
  process.stderr.write(`${files.length} ${files.length === 1 ? 'spectrum' : 'spectra'}: ${files.length - failed} measured, ${failed} failed\n`);
  return failed ? EXIT_SOME_FAILED : EXIT_OK;
}

/** The table's file, open: one that cannot be written is named, with the reason, before any work. */
async function openOutput(path: string): Promise<WriteStream> {
  const stream = createWriteStream(path);
  // Write errors (a full disk) name the file too.
  stream.on('error', (err: NodeJS.ErrnoException) => (err.path ??= path));
  await new Promise<void>((resolve, reject) => {
    stream.once('open', () => resolve());
    stream.once('error', reject);
  });
  return stream;
}

/** Ends the file; a write error was already reported by the writes, so it only settles here. */
function closeOutput(stream: WriteStream): Promise<void> {
  if (stream.destroyed) return Promise.resolve();
  return new Promise<void>((resolve) => {
    stream.once('error', () => resolve());
    stream.end(resolve);
  });
}

/**
 * The inputs without the output file: one found by a folder walk is an earlier run's output and
 * is left out; one named as an input is a usage error (it would be emptied before it is read).
 */
async function withoutOutput(files: string[], named: string[], out: string): Promise<string[]> {
  const target = await realTarget(out);
  const isTarget = async (f: string) => basename(f) === basename(target) && (await realpath(f).catch(() => resolve(f))) === target;
  for (const p of named) if (await isTarget(p)) throw new UsageError(`--out ${out} is also an input: it would be emptied before it is read`);
  const keep = await Promise.all(files.map(async (f) => !(await isTarget(f))));
  return files.filter((_, i) => keep[i]);
}

/** The format a --out name asks for: .jsonl/.ndjson, .csv, or no extension (CSV); another extension is a usage error. */
function formatFromOut(out: string | undefined): 'csv' | 'jsonl' {
  if (!out || out === '-') return 'csv';
  const ext = /\.([^./\\]+)$/.exec(out)?.[1]?.toLowerCase();
  if (ext === undefined || ext === 'csv' || ext === 'txt') return 'csv';
  if (ext === 'jsonl' || ext === 'ndjson') return 'jsonl';
  throw new UsageError(`--out ${out}: zvet measure writes CSV or JSON Lines; name the file .csv or .jsonl, or give --format`);
}

function positiveInt(text: string, flag: string): number {
  const n = parseDecimal(text);
  if (n === null || !Number.isInteger(n) || n < 1) throw new UsageError(`${flag}: "${text}" is not a positive whole number`);
  return n;
}

function finite(text: string, flag: string): number {
  const n = parseDecimal(text);
  if (n === null || n <= -1) throw new UsageError(`${flag}: "${text}" is not a redshift (a number above −1)`);
  return n;
}

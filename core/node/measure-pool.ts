/**
 * Measures spectrum files on worker threads. Each worker reads its file itself; a bad file is a
 * result with status 'error' and a one-line reason; a worker that dies is replaced and the files
 * it held are reported as errors. Results come back as promises, one per file.
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { CosmologyModel } from '../astro/cosmology.js';
import type { MeasureRowExtras } from '../catalogue/measure-derived-columns.js';
import type { Measurement, MeasureOptions } from '../redshift/types.js';
import type { Site, Spectrum, WavelengthMedium } from '../spectrum/spectrum.js';

/** Carries the spectrum's metadata always, and host diagnostics when asked for. */
export interface MeasureFileResult extends MeasureRowExtras {
  file: string;
  hdu: number | null;
  status: 'ok' | 'error';
  /** One-line reason when status is 'error'. */
  error: string | null;
  measurement: Measurement | null;
  spectrum?: Spectrum;
}

/** Milliseconds spent per stage, summed over the files measured. */
export interface StageTotals {
  readMs: number;
  preprocessMs: number;
  correlateMs: number;
  refineMs: number;
  files: number;
}

export interface WorkerRequest {
  id: number;
  path: string;
  options: MeasureOptions;
  /** Medium of the file's wavelengths set by the user, null = as the file says (or zvet assumes). */
  medium: WavelengthMedium | null;
  includeSpectrum: boolean;
  /** Measure the host lines at the best z, null = don't. */
  hostLines: HostLinesRequest | null;
}

/** The cosmology and site of the rows' frame correction, whose luminosity distance the SFR takes. */
export interface HostLinesRequest {
  cosmology: CosmologyModel;
  site?: Site;
}

export interface WorkerReply {
  id: number;
  result: MeasureFileResult;
  times: Omit<StageTotals, 'files'>;
}

/** The engine's options, and how to read the file and what to return besides the measurement. */
export interface FileMeasureOptions extends MeasureOptions {
  medium?: WavelengthMedium;
  includeSpectrum?: boolean;
  hostLines?: HostLinesRequest;
}

interface Job {
  req: WorkerRequest;
  resolve: (r: MeasureFileResult) => void;
}

interface Slot {
  worker: Worker;
  inFlight: Map<number, Job>;
}

/**
 * Young-generation cap per worker, MB: V8's default let two workers grow to about 300 MB resident
 * over 10,000 spectra; at 16 MB it stays near 245 MB at no speed cost we could measure.
 */
const WORKER_YOUNG_GENERATION_MB = 16;

/**
 * Spectra per worker below which a batch gets fewer workers than cores by default. A worker's
 * first ~0.7 s go to warming up (code run before V8 has optimised it, while V8 compiles it on
 * the other cores): about 100 spectra's worth, and workers warming up together compete for the
 * cores. On 2 cores, 128 spectra took 1.72 s with one worker and 2.06 s with two, 256 took 2.74 s
 * and 2.55 s (medians of 3; our measurement, no source).
 */
export const SPECTRA_PER_DEFAULT_WORKER = 200;

/** The default number of workers for a batch of `files` spectra: all cores, fewer for short batches. */
export function defaultJobs(files: number): number {
  return Math.min(availableParallelism(), Math.max(1, Math.ceil(files / SPECTRA_PER_DEFAULT_WORKER)));
}

/** The most workers --jobs may ask for, per core: beyond the cores each one only adds its memory (~40 MB). */
export const MAX_JOBS_PER_CORE = 4;

export function maxJobs(): number {
  return MAX_JOBS_PER_CORE * availableParallelism();
}

/** Jobs sent ahead to each worker, so it never waits for the main thread. */
const PER_WORKER_IN_FLIGHT = 2;

/** The worker bundle: next to this module when bundled (dist/), else the built one in dist/. */
function workerUrl(): URL {
  const beside = new URL('./measure-worker.js', import.meta.url);
  if (existsSync(fileURLToPath(beside))) return beside;
  const built = new URL('../../dist/measure-worker.js', import.meta.url);
  if (existsSync(fileURLToPath(built))) return built;
  throw new Error('the measuring worker is not built: run `npm run build`');
}

export class MeasurePool {
  private readonly slots: Slot[] = [];
  private readonly queue: Job[] = [];
  private nextId = 1;
  private closed = false;
  private readonly url: URL;
  readonly totals: StageTotals = { readMs: 0, preprocessMs: 0, correlateMs: 0, refineMs: 0, files: 0 };

  constructor(opts: { jobs?: number } = {}) {
    const jobs = Math.max(1, Math.floor(opts.jobs ?? availableParallelism()));
    this.url = workerUrl();
    for (let i = 0; i < jobs; i++) this.slots.push(this.spawn());
  }

  measureFile(path: string, options: FileMeasureOptions = {}): Promise<MeasureFileResult> {
    if (this.closed) return Promise.reject(new Error('MeasurePool is closed'));
    const { includeSpectrum, hostLines, medium, ...measureOptions } = options;
    return new Promise((resolve) => {
      this.queue.push({ req: { id: this.nextId++, path, options: measureOptions, medium: medium ?? null, includeSpectrum: !!includeSpectrum, hostLines: hostLines ?? null }, resolve });
      this.dispatch();
    });
  }

  async close(): Promise<void> {
    this.closed = true;
    await Promise.all(this.slots.map((s) => s.worker.terminate()));
  }

  private spawn(): Slot {
    const slot: Slot = { worker: new Worker(this.url, { resourceLimits: { maxYoungGenerationSizeMb: WORKER_YOUNG_GENERATION_MB } }), inFlight: new Map() };
    slot.worker.on('message', (reply: WorkerReply) => {
      const job = slot.inFlight.get(reply.id);
      if (!job) return;
      slot.inFlight.delete(reply.id);
      this.totals.readMs += reply.times.readMs;
      this.totals.preprocessMs += reply.times.preprocessMs;
      this.totals.correlateMs += reply.times.correlateMs;
      this.totals.refineMs += reply.times.refineMs;
      this.totals.files++;
      job.resolve(reply.result);
      this.dispatch();
    });
    const fail = (why: string) => {
      if (this.closed) return;
      for (const job of slot.inFlight.values()) {
        job.resolve({ file: job.req.path, hdu: null, status: 'error', error: `the measuring worker stopped (${why})`, measurement: null });
      }
      slot.inFlight.clear();
      const i = this.slots.indexOf(slot);
      if (i >= 0) this.slots[i] = this.spawn();
      this.dispatch();
    };
    slot.worker.on('error', (err) => fail(err.message.split('\n')[0]));
    slot.worker.on('exit', (code) => fail(`exit code ${code}`));
    return slot;
  }

  private dispatch(): void {
    for (const slot of this.slots) {
      while (slot.inFlight.size < PER_WORKER_IN_FLIGHT && this.queue.length) {
        const job = this.queue.shift()!;
        slot.inFlight.set(job.req.id, job);
        slot.worker.postMessage(job.req);
      }
    }
  }
}

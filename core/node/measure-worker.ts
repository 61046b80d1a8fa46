/**
 * Worker thread of MeasurePool: reads a spectrum file itself, measures it and posts the result
 * back with the spectrum's metadata (and, when asked, the host lines at the best z); the
 * spectrum's arrays are transferred, not copied, when the caller wants them.
 */
import { parentPort } from 'node:worker_threads';
import { summariseHost } from '../catalogue/host-fields.js';
import { analyseHost } from '../hosts/analyse.js';
import { measureRedshift, type StageTimes } from '../redshift/measure.js';
import type { Candidate, MeasureOptions } from '../redshift/types.js';
import { framesOrNull } from '../astro/frames.js';
import { SpectrumReadError, type Spectrum } from '../spectrum/spectrum.js';
import { readSpectrumFile } from './read-spectrum-file.js';
import type { HostLinesRequest, MeasureFileResult, WorkerRequest, WorkerReply } from './measure-pool.js';

if (!parentPort) throw new Error('measure-worker must run in a worker thread');
const port = parentPort;

// One job at a time, in arrival order. The pool keeps two jobs in flight so the worker never
// waits; run concurrently, the second job's read would wait out the first one's measurement at
// its first await and be timed as reading.
let previous: Promise<void> = Promise.resolve();
port.on('message', (req: WorkerRequest) => {
  previous = previous.then(() => handle(req));
});

async function handle(req: WorkerRequest): Promise<void> {
  const times: StageTimes & { readMs: number } = { readMs: 0, preprocessMs: 0, correlateMs: 0, refineMs: 0 };
  const t0 = performance.now();
  let spectrum: Spectrum | undefined;
  let result: MeasureFileResult;
  try {
    spectrum = await readSpectrumFile(req.path, req.medium ? { medium: req.medium } : undefined);
    times.readMs = performance.now() - t0;
    const measurement = measureRedshift(spectrum, req.options as MeasureOptions, times);
    const { medium, mediumReason } = spectrum.provenance;
    result = { file: req.path, hdu: spectrum.provenance.hdu, status: 'ok', error: null, measurement, meta: spectrum.meta, medium: { inFile: medium, reason: mediumReason } };
    if (req.hostLines) Object.assign(result, hostLinesAt(spectrum, measurement.best, req.hostLines));
  } catch (err) {
    if (!times.readMs) times.readMs = performance.now() - t0;
    result = { file: req.path, hdu: spectrum?.provenance.hdu ?? null, status: 'error', error: oneLine(err), measurement: null };
  }
  const transfer: ArrayBuffer[] = [];
  if (req.includeSpectrum && spectrum) {
    result.spectrum = spectrum;
    for (const a of [spectrum.waveAngstrom, spectrum.flux, spectrum.error, spectrum.mask, spectrum.sky]) {
      if (a && a.buffer instanceof ArrayBuffer && !transfer.includes(a.buffer)) transfer.push(a.buffer);
    }
  }
  const reply: WorkerReply = { id: req.id, result, times };
  try {
    port.postMessage(reply, transfer);
  } catch {
    delete result.spectrum;
    port.postMessage(reply);
  }
}

function hostLinesAt(spectrum: Spectrum, best: Candidate | null, { cosmology, site }: HostLinesRequest): Pick<MeasureFileResult, 'lines' | 'linesNote'> {
  if (!best) return { lines: null, linesNote: 'no redshift to measure the lines at' };
  try {
    const frames = framesOrNull({ zObs: best.z, zErr: best.zErr, meta: spectrum.meta, site, cosmology });
    return { lines: summariseHost(analyseHost(spectrum, best.z, { cosmology, frames })), linesNote: null };
  } catch (err) {
    return { lines: null, linesNote: `lines not measured: ${oneLine(err)}` };
  }
}

function oneLine(err: unknown): string {
  const text = err instanceof SpectrumReadError ? err.reason : err instanceof Error ? err.message : String(err);
  return text.replace(/\s*[\r\n]+\s*/g, ' ').trim();
}

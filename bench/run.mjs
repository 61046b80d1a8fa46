// Benchmark of `zvet measure` on the open survey spectra (run by `npm run bench` after the
// build): the floor of a fresh process that only reads the files; spectra per second with
// --jobs 1 and with all cores, end to end and beyond a first run of start-up and warm-up; the
// time per stage; a short batch on one worker and on all cores (the evidence for zvet measure's
// default worker count); the peak resident memory over a long batch; then the CPU time per
// spectrum of the engine run in this process (steadier than wall-clock rates on a shared
// machine), in all and with fewer templates. Prints figures against the targets; asserts nothing.
import { build } from 'esbuild';
import { spawn } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const sdss = resolve(root, '../shared/spectra-open/sdss');
const bin = join(root, 'bin/zvet.js');
const survey = readdirSync(sdss).filter((f) => f.startsWith('spec-') && f.endsWith('.fits')).map((f) => join(sdss, f));
const cores = availableParallelism();
// `--long N` sets the length of the memory run (default 10,000 spectra).
const longArg = process.argv.indexOf('--long');
const long = longArg > 0 ? Number(process.argv[longArg + 1]) : 10000;

function repeated(n) {
  return Array.from({ length: n }, (_, i) => survey[i % survey.length]);
}

/** Runs zvet measure on the files; returns wall seconds, peak RSS (MB) and the stage times. */
function run(files, jobs) {
  return new Promise((resolvePromise, reject) => {
    const t0 = process.hrtime.bigint();
    const child = spawn(process.execPath, [bin, 'measure', ...files, '--jobs', String(jobs), '--out', '/dev/null', '--stage-times'], { stdio: ['ignore', 'ignore', 'pipe'] });
    let stderr = '';
    let peakKb = 0;
    child.stderr.on('data', (d) => (stderr += d));
    const poll = setInterval(() => {
      try {
        const m = /VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${child.pid}/status`, 'utf8'));
        if (m) peakKb = Math.max(peakKb, Number(m[1]));
      } catch {
        // the process has just ended
      }
    }, 20);
    child.on('error', reject);
    child.on('exit', (code) => {
      clearInterval(poll);
      const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
      const m = /stage_times_ms (\{.*\})/.exec(stderr);
      if (code !== 0 || !m) return reject(new Error(`zvet measure exited ${code}: ${stderr.split('\n')[0]}`));
      resolvePromise({ seconds, peakMb: peakKb / 1024, stages: JSON.parse(m[1]) });
    });
  });
}

/** Wall seconds of bench/read-only.mjs reading the files in a fresh process. */
function readOnly(files) {
  return new Promise((resolvePromise, reject) => {
    const t0 = process.hrtime.bigint();
    const child = spawn(process.execPath, [join(root, 'bench/read-only.mjs'), engine, ...files], { stdio: ['ignore', 'ignore', 'inherit'] });
    child.on('error', reject);
    child.on('exit', (code) => (code === 0 ? resolvePromise(Number(process.hrtime.bigint() - t0) / 1e9) : reject(new Error(`bench/read-only.mjs exited ${code}`))));
  });
}

const median = (xs) => [...xs].sort((a, b) => a - b)[xs.length >> 1];

function stageLine(s) {
  const per = (ms) => `${(ms / s.files).toFixed(2)} ms`;
  return `read ${per(s.read_ms)}, preprocess ${per(s.preprocess_ms)}, correlate ${per(s.correlate_ms)}, refine ${per(s.refine_ms)} per spectrum (worker time)`;
}

// The engine, for the in-process figures at the end, and the default worker count.
const engine = join(root, 'dist/bench-engine.mjs');
await build({
  stdin: { contents: "export { readSpectrum } from './core/spectrum/read.ts'; export { measureRedshift } from './core/redshift/measure.ts'; export { defaultJobs } from './core/node/measure-pool.ts';", resolveDir: root, loader: 'ts' },
  bundle: true, platform: 'node', format: 'esm', outfile: engine, logLevel: 'warning',
});
const { readSpectrum, measureRedshift, defaultJobs } = await import(pathToFileURL(engine).href);

const n = Math.max(500, survey.length * Math.ceil(500 / survey.length));
console.log(`zvet measure bench: ${survey.length} SDSS/BOSS/eBOSS survey spectra repeated to ${n}, default templates, ${cores} cores`);
// A run of one pass of the survey spectra gives the start-up and JIT warm-up of each run: the
// rate beyond it is the steady one.
// The floor under the end-to-end rates: a fresh process that only reads the files (medians of 3).
{
  const files = repeated(n), seconds = [];
  for (let round = 0; round < 3; round++) seconds.push(await readOnly(files));
  const floor = median(seconds);
  console.log(`reading alone, ${n} spectra in a fresh process: ${floor.toFixed(2)} s (${(n / floor).toFixed(0)} spectra/s); at 600 spectra/s the whole run would have ${(n / 600).toFixed(2)} s`);
}
for (const jobs of [1, cores]) {
  const short = await run(survey, jobs);
  const r = await run(repeated(n), jobs);
  const steady = (n - survey.length) / (r.seconds - short.seconds);
  console.log(`--jobs ${jobs}: ${(n / r.seconds).toFixed(1)} spectra/s end to end (target ≥ ${jobs === 1 ? 600 : 1000}); ${stageLine(r.stages)}; peak RSS ${r.peakMb.toFixed(0)} MB`);
  console.log(`  beyond the first ${survey.length} spectra: ${steady.toFixed(1)} spectra/s; start-up and warm-up ≈ ${(short.seconds - survey.length / steady).toFixed(2)} s per run`);
}
// Short batches: one worker against all cores, the evidence for defaultJobs (core/node/measure-pool.ts).
if (cores > 1) {
  const shortBatch = 128, times = { 1: [], [cores]: [] };
  for (let round = 0; round < 3; round++) for (const jobs of [1, cores]) times[jobs].push((await run(repeated(shortBatch), jobs)).seconds);
  console.log(`${shortBatch} spectra (medians of 3): ${median(times[1]).toFixed(2)} s with --jobs 1, ${median(times[cores]).toFixed(2)} s with --jobs ${cores}; zvet measure's default for this batch: ${defaultJobs(shortBatch)} worker(s)`);
}
const r = await run(repeated(long), cores);
console.log(`${long} spectra, --jobs ${cores}: ${(long / r.seconds).toFixed(1)} spectra/s; peak RSS ${r.peakMb.toFixed(0)} MB (target < 300 MB)`);

// The engine in this process: CPU time (user + system) per spectrum, read and measured, after a
// warm-up pass, over 10 passes of the survey spectra.
const bytes = survey.map((f) => ({ name: f, data: new Uint8Array(readFileSync(f)) }));
const cpuMs = () => { const u = process.cpuUsage(); return (u.user + u.system) / 1000; };
for (const b of bytes) measureRedshift(readSpectrum(b.data, b.name));
let readCpu = 0, measureCpu = 0;
for (let pass = 0; pass < 10; pass++) {
  for (const b of bytes) {
    const t0 = cpuMs();
    const spectrum = readSpectrum(b.data, b.name);
    const t1 = cpuMs();
    measureRedshift(spectrum);
    measureCpu += cpuMs() - t1;
    readCpu += t1 - t0;
  }
}
const per = (ms) => ms / (10 * bytes.length);
console.log(`engine in one thread: ${per(readCpu + measureCpu).toFixed(2)} ms CPU per spectrum (read ${per(readCpu).toFixed(2)}, measure ${per(measureCpu).toFixed(2)}), ≈ ${(1000 / per(readCpu + measureCpu)).toFixed(0)} spectra/s per core before file reading and worker overheads`);

// Where that work lies: preprocessing and refinement are paid once per spectrum, correlation
// per template, so fewer templates save only part of it (5 passes after a warm-up pass each).
const spectra = bytes.map((b) => readSpectrum(b.data, b.name));
const TEMPLATE_SETS = [['all five (default)', null], ['without qso', ['star-forming', 'agn-narrow', 'passive', 'star']], ['star-forming only', ['star-forming']], ['passive only', ['passive']], ['star only', ['star']]];
for (const [label, templates] of TEMPLATE_SETS) {
  const options = templates ? { templates } : {};
  for (const s of spectra) measureRedshift(s, options);
  const stages = { preprocessMs: 0, correlateMs: 0, refineMs: 0 };
  const t0 = cpuMs();
  for (let pass = 0; pass < 5; pass++) for (const s of spectra) measureRedshift(s, options, stages);
  const each = (ms) => (ms / (5 * spectra.length)).toFixed(2);
  console.log(`  templates ${label}: ${each(cpuMs() - t0)} ms CPU per spectrum measured (wall: preprocess ${each(stages.preprocessMs)}, correlate ${each(stages.correlateMs)}, refine ${each(stages.refineMs)} ms)`);
}

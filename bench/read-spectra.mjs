// Benchmark (prints figures, asserts nothing): median time of readSpectrum per file, 20 passes
// over the open SDSS spectra (../shared/spectra-open/sdss) and over the demo night
// (sample-spectra/kestrel-2026-03-14, files that read). Run: node bench/read-spectra.mjs
import { build } from 'esbuild';
import { readFileSync, readdirSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const out = join(root, 'dist/bench-read.mjs');
await build({ entryPoints: [join(root, 'core/spectrum/read.ts')], bundle: true, platform: 'neutral', format: 'esm', outfile: out, logLevel: 'warning' });
const { readSpectrum } = await import(pathToFileURL(out).href);

const PASSES = 20;
const load = (dir, wanted) =>
  readdirSync(dir)
    .filter(wanted)
    .map((f) => ({ name: f, bytes: new Uint8Array(readFileSync(join(dir, f))) }));
const readable = (f) => {
  try {
    readSpectrum(f.bytes, f.name);
    return true;
  } catch {
    return false;
  }
};
const sets = [
  ['SDSS files', load(resolve(root, '../shared/spectra-open/sdss'), (f) => f.endsWith('.fits'))],
  ['demo files', load(join(root, 'sample-spectra/kestrel-2026-03-14'), (f) => /\.(fits|fits\.gz|csv|txt|dat)$/.test(f)).filter(readable)],
];
for (const [label, files] of sets) {
  for (const f of files) readSpectrum(f.bytes, f.name);
  const times = [];
  for (let pass = 0; pass < PASSES; pass++) {
    for (const f of files) {
      const t0 = performance.now();
      readSpectrum(f.bytes, f.name);
      times.push(performance.now() - t0);
    }
  }
  times.sort((a, b) => a - b);
  const q = (p) => times[Math.floor(p * (times.length - 1))].toFixed(2);
  console.log(`readSpectrum, ${files.length} ${label} × ${PASSES}: median ${q(0.5)} ms, p10 ${q(0.1)} ms, p90 ${q(0.9)} ms`);
}

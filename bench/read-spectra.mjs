// Benchmark (prints figures, asserts nothing): median time of readSpectrum per open SDSS
// spectrum, 20 passes over ../shared/spectra-open/sdss. Run: node bench/read-spectra.mjs
import { build } from 'esbuild';
import { readFileSync, readdirSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const out = join(root, 'dist/bench-read.mjs');
await build({ entryPoints: [join(root, 'core/spectrum/read.ts')], bundle: true, platform: 'neutral', format: 'esm', outfile: out, logLevel: 'warning' });
const { readSpectrum } = await import(pathToFileURL(out).href);

const dir = resolve(root, '../shared/spectra-open/sdss');
const files = readdirSync(dir)
  .filter((f) => f.endsWith('.fits'))
  .map((f) => ({ name: f, bytes: new Uint8Array(readFileSync(join(dir, f))) }));
for (const f of files) readSpectrum(f.bytes, f.name);
const times = [];
for (let pass = 0; pass < 20; pass++) {
  for (const f of files) {
    const t0 = performance.now();
    readSpectrum(f.bytes, f.name);
    times.push(performance.now() - t0);
  }
}
times.sort((a, b) => a - b);
const q = (p) => times[Math.floor(p * (times.length - 1))].toFixed(2);
console.log(`readSpectrum, ${files.length} SDSS files × 20: median ${q(0.5)} ms, p10 ${q(0.1)} ms, p90 ${q(0.9)} ms`);

// Run by bench/run.mjs in a fresh process: reads each spectrum file given (from disk, as zvet
// measure's workers do) with the engine bundle's reader and measures nothing. Its wall time is
// the floor under any end-to-end measuring rate: start-up, file reading and the reader's warm-up.
// Usage: node bench/read-only.mjs ENGINE_BUNDLE FILE...
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';

const [bundle, ...files] = process.argv.slice(2);
const { readSpectrum } = await import(pathToFileURL(bundle).href);
for (const f of files) readSpectrum(new Uint8Array(readFileSync(f)), f);

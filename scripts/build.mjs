// Bundles the command-line program (and, as they exist, the worker, the window and the
// Electron host) with esbuild into dist/. Run by `npm run build` and on install (`prepare`).
import { copyFileSync } from 'node:fs';
import { build } from 'esbuild';

const nodeEsm = {
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  sourcemap: true,
  logLevel: 'warning',
  // Bundled CommonJS dependencies call require(); give ESM output one.
  banner: { js: "import { createRequire as __zvetCreateRequire } from 'node:module'; const require = __zvetCreateRequire(import.meta.url);" },
};

await build({ ...nodeEsm, entryPoints: { cli: 'core/node/cli/main.ts' }, outdir: 'dist' });
// The measuring worker runs beside the command-line program (core/node/measure-pool.ts finds it).
await build({ ...nodeEsm, entryPoints: { 'measure-worker': 'core/node/measure-worker.ts' }, outdir: 'dist' });

// The Electron host: main process and sandboxed preload, CommonJS, Electron itself left external.
const electronCjs = {
  bundle: true,
  platform: 'node',
  format: 'cjs',
  target: 'node20',
  sourcemap: true,
  logLevel: 'warning',
  external: ['electron'],
  outdir: 'dist/electron',
  outExtension: { '.js': '.cjs' },
};
// In the main process import.meta.url (used to find the measuring worker) is the bundle's own URL.
await build({
  ...electronCjs,
  entryPoints: { main: 'electron/main.ts' },
  define: { 'import.meta.url': '__zvetModuleUrl' },
  banner: { js: "const __zvetModuleUrl = require('node:url').pathToFileURL(__filename).href;" },
});
// The sandboxed preload may require nothing but 'electron'.
await build({ ...electronCjs, entryPoints: { preload: 'electron/preload.ts' } });
copyFileSync('packaging/icons/512x512.png', 'dist/electron/icon.png');

// The window: app.js and app.css by esbuild, beside index.html and the locally bundled plotly.min.js
// (loaded as its own script, so nothing ever comes from a network). The window draws only scatter
// traces, shapes and annotations, so plotly's basic partial bundle (1.2 MB) serves instead of the
// full one (4.8 MB), which took about 2 s of a cold start to load.
await build({ bundle: true, platform: 'browser', format: 'esm', target: 'es2022', sourcemap: true, logLevel: 'warning', outdir: 'dist/renderer', entryPoints: [{ in: 'renderer/main.ts', out: 'app' }, { in: 'renderer/app.css', out: 'app' }] });
copyFileSync('renderer/index.html', 'dist/renderer/index.html');
copyFileSync('packaging/icons/32x32.png', 'dist/renderer/favicon.png');
copyFileSync('node_modules/plotly.js-basic-dist-min/plotly-basic.min.js', 'dist/renderer/plotly.min.js');

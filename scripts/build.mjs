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

// The Electron host: main process and sandboxed preload, CommonJS, Electron itself left external.
const electronCjs = { bundle: true, platform: 'node', format: 'cjs', target: 'node20', sourcemap: true, logLevel: 'warning', external: ['electron'], outdir: 'dist/electron', outExtension: { '.js': '.cjs' } };
await build({ ...electronCjs, entryPoints: { main: 'electron/main.ts' } });
await build({ ...electronCjs, entryPoints: { preload: 'electron/preload.ts' } });
copyFileSync('packaging/icons/512x512.png', 'dist/electron/icon.png');

// The window: app.js and app.css by esbuild, beside index.html and the locally bundled plotly.min.js
// (loaded as its own script, so nothing ever comes from a network).
await build({ bundle: true, platform: 'browser', format: 'esm', target: 'es2022', sourcemap: true, logLevel: 'warning', outdir: 'dist/renderer', entryPoints: [{ in: 'renderer/main.ts', out: 'app' }, { in: 'renderer/app.css', out: 'app' }] });
copyFileSync('renderer/index.html', 'dist/renderer/index.html');
copyFileSync('node_modules/plotly.js-dist-min/plotly.min.js', 'dist/renderer/plotly.min.js');

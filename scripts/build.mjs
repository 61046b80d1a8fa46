// Bundles the command-line program (and, as they exist, the worker, the window and the
// Electron host) with esbuild into dist/. Run by `npm run build` and on install (`prepare`).
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

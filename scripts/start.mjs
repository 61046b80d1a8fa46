// `npm start`: the desktop window on the demo worklist, or browser mode where the Electron
// binary cannot be had. npm does not run Electron's download at install time (allowScripts in
// package.json denies it), so that an offline `npm ci` still succeeds; it is fetched here, once.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const demo = join(root, 'sample-spectra', 'kestrel-2026-03-14');
const require = createRequire(import.meta.url);
const DOWNLOAD_TIMEOUT_MS = 15 * 60 * 1000;

function electronBinary() {
  try {
    const path = require('electron');
    return typeof path === 'string' && existsSync(path) ? path : null;
  } catch {
    return null;
  }
}

/** Runs Electron's own installer; returns why there is still no binary, or null when there is one. */
function fetchElectronBinary() {
  let installer;
  try {
    installer = require.resolve('electron/install.js');
  } catch {
    return 'the electron package is not installed (run npm ci)';
  }
  if (process.env.ELECTRON_SKIP_BINARY_DOWNLOAD) return 'ELECTRON_SKIP_BINARY_DOWNLOAD is set';
  process.stderr.write('zvet: fetching the Electron desktop binary (once, about 100 MB)...\n');
  const result = spawnSync(process.execPath, [installer], {
    cwd: dirname(installer),
    encoding: 'utf8',
    stdio: ['ignore', 'inherit', 'pipe'],
    timeout: DOWNLOAD_TIMEOUT_MS,
  });
  if (result.status === 0 && electronBinary()) return null;
  const firstLine = (result.stderr ?? '').split('\n').find((line) => line.trim() !== '');
  return `it could not be fetched (${firstLine?.trim() ?? result.error?.message ?? `installer exit ${result.status}`})`;
}

function run(command, args) {
  const child = spawn(command, args, { stdio: 'inherit', cwd: root });
  for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => child.kill(signal));
  child.on('exit', (code, signal) => process.exit(code ?? (signal ? 0 : 1)));
}

const missingBecause = electronBinary() ? null : fetchElectronBinary();
if (missingBecause === null) {
  run(electronBinary(), [join(root, 'dist', 'electron', 'main.cjs'), demo]);
} else {
  process.stderr.write(
    `zvet: the Electron desktop binary is not installed: ${missingBecause}.\n` +
      'zvet: opening browser mode instead (the address below works in any browser on this machine).\n',
  );
  // Arguments after `npm start --` go to `zvet serve` (--port N, --no-open).
  run(process.execPath, [join(root, 'bin', 'zvet.js'), 'serve', demo, ...process.argv.slice(2)]);
}

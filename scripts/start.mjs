// `npm start`: the desktop window on the demo worklist, or browser mode where the Electron
// binary is not installed (it is fetched by npm install unless ELECTRON_SKIP_BINARY_DOWNLOAD is set).
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const demo = join(root, 'sample-spectra', 'kestrel-2026-03-14');

function electronBinary() {
  try {
    const path = createRequire(import.meta.url)('electron');
    return typeof path === 'string' && existsSync(path) ? path : null;
  } catch {
    return null;
  }
}

function run(command, args) {
  const child = spawn(command, args, { stdio: 'inherit', cwd: root });
  for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => child.kill(signal));
  child.on('exit', (code, signal) => process.exit(code ?? (signal ? 0 : 1)));
}

const electron = electronBinary();
if (electron) {
  run(electron, [join(root, 'dist', 'electron', 'main.cjs'), demo]);
} else {
  process.stderr.write(
    'zvet: the Electron desktop binary is not installed, so the desktop window cannot open.\n' +
      'zvet: opening browser mode instead (the address below works in any browser on this machine).\n',
  );
  run(process.execPath, [join(root, 'bin', 'zvet.js'), 'serve', demo]);
}

/**
 * `zvet serve [FOLDER] [--port N] [--no-open]`: browser mode. Serves the window and the host API
 * on 127.0.0.1 only, prints exactly one line (the address with its token) on stdout, opens the
 * system browser unless --no-open, and stops cleanly on SIGINT/SIGTERM.
 */
import { spawn } from 'node:child_process';
import { stat } from 'node:fs/promises';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Command } from 'commander';
import { createHostHandlers } from '../host/handlers.js';
import { startHostServer } from '../host/http-server.js';
import { runAction } from './run-action.js';
import { UsageError } from './usage-error.js';
import { parseDecimal } from '../../util/decimal.js';

/** dist/renderer/, beside the bundled dist/cli.js. */
function rendererRoot(): string {
  return resolve(dirname(fileURLToPath(import.meta.url)), 'renderer');
}

function parsePort(text: string): number {
  const port = parseDecimal(text);
  if (port === null || !Number.isInteger(port) || port < 0 || port > 65535) throw new UsageError(`--port: "${text}" is not a port number (0–65535; 0 picks a free one)`);
  return port;
}

/** Best effort: when no browser can be started, the printed line is enough. */
function openBrowser(url: string): void {
  const [command, args] =
    process.platform === 'darwin' ? ['open', [url]] : process.platform === 'win32' ? ['cmd', ['/c', 'start', '""', url]] : ['xdg-open', [url]];
  try {
    const child = spawn(command, args as string[], { stdio: 'ignore', detached: true });
    child.on('error', () => process.stderr.write('zvet: could not open a browser; open the address above yourself\n'));
    child.unref();
  } catch {
    process.stderr.write('zvet: could not open a browser; open the address above yourself\n');
  }
}

export function registerServe(program: Command): void {
  program
    .command('serve')
    .description('Open a worklist in browser mode: serves the window on 127.0.0.1 only, behind a token printed with the address')
    .argument('[folder]', 'worklist folder to open')
    .option('--port <n>', 'port on 127.0.0.1 (0 picks a free one)', '0')
    .option('--no-open', 'do not start the system browser')
    .action(
      runAction(async (folder: string | undefined, opts: { port: string; open: boolean }) => {
        const port = parsePort(opts.port);
        const handlers = createHostHandlers();
        let server: Awaited<ReturnType<typeof startHostServer>>;
        try {
          if (folder !== undefined) {
            const path = resolve(folder);
            const info = await stat(path);
            if (!info.isDirectory()) throw new UsageError(`${path}: not a folder (give the worklist folder)`);
            const state = await handlers.openWorklist({ path });
            for (const w of state.warnings) process.stderr.write(`zvet: ${w}\n`);
          }
          server = await startHostServer({ api: handlers, staticRoot: rendererRoot(), port });
        } catch (err) {
          // The worklist's measuring threads would keep the process alive after the message.
          await handlers.close();
          if ((err as NodeJS.ErrnoException).code === 'EADDRINUSE') throw new UsageError(`port ${port} on 127.0.0.1 is in use (another zvet serve?): give another with --port, or --port 0 for a free one`);
          throw err;
        }
        // Listen for the stop signals before printing: a pipe write is synchronous on Linux, so
        // whoever reads the line may signal at once.
        const stopped = new Promise<void>((done) => {
          process.once('SIGINT', () => done());
          process.once('SIGTERM', () => done());
        });
        process.stdout.write(`${server.url}\n`);
        if (opts.open) openBrowser(server.url);
        await stopped;
        await server.close();
        await handlers.close();
        return 0;
      }),
    );
}

// `npm start` where the Electron binary cannot be had (an offline machine, or the download
// skipped): it must say so in one line and open browser mode on the demo worklist, and an
// offline `npm ci` must not fail on Electron's download in the first place.
import { mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_WORKLIST, ROOT } from '../support/paths';
import { call, request, startServingScript, type ServeProcess } from './server-harness';

describe('npm start without the Electron binary', () => {
  let scratch: string;
  let started: ServeProcess;
  let stopped = false;

  beforeAll(async () => {
    scratch = mkdtempSync(join(tmpdir(), 'zvet-start-'));
    // Electron's locator looks for the binary under ELECTRON_OVERRIDE_DIST_PATH: an empty folder.
    started = await startServingScript([resolve(ROOT, 'scripts/start.mjs'), '--port', '0', '--no-open'], {
      ELECTRON_OVERRIDE_DIST_PATH: scratch,
      ELECTRON_SKIP_BINARY_DOWNLOAD: '1',
      ZVET_CONFIG_DIR: scratch,
    });
  });

  afterAll(async () => {
    if (!stopped) await started?.stop();
    rmSync(scratch, { recursive: true, force: true });
  });

  it('says why in one line and that it opens browser mode instead', () => {
    const lines = started.stderr().trim().split('\n');
    expect(lines[0]).toBe('zvet: the Electron desktop binary is not installed: ELECTRON_SKIP_BINARY_DOWNLOAD is set.');
    expect(lines[1]).toMatch(/^zvet: opening browser mode instead/);
  });

  it('serves the window with the demo worklist open', async () => {
    expect((await request(started.port, 'GET', `/?token=${started.token}`)).status).toBe(200);
    const list = JSON.parse((await call(started.port, started.token, 'listSpectra', {})).body);
    // Every file of the demo night is a spectrum.
    const demoFiles = readdirSync(DEMO_WORKLIST);
    expect(list.items.length).toBe(demoFiles.length);
    expect(list.items.map((i: { id: string }) => i.id).sort()).toEqual(demoFiles.sort());
  });

  it('passes a stop signal on and exits cleanly', async () => {
    stopped = true;
    expect(await started.stop('SIGINT')).toBe(0);
  });
});

describe('npm install policy for Electron', () => {
  it('keeps npm from running Electron’s download at install time; npm start fetches it', () => {
    const pkg = JSON.parse(readFileSync(resolve(ROOT, 'package.json'), 'utf8'));
    expect(pkg.allowScripts.electron).toBe(false);
    expect(pkg.allowScripts.esbuild).toBe(true);
    expect(readFileSync(resolve(ROOT, 'scripts/start.mjs'), 'utf8')).toContain("require.resolve('electron/install.js')");
  });
});

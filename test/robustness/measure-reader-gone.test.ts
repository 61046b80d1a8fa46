// `zvet measure … | head`: when whatever reads the table goes away, the batch ends promptly with
// a one-line reason on standard error (no stack trace) instead of waiting forever for room in
// the pipe.
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { OPEN_SPECTRA, ZVET_BIN } from '../support/paths';

describe('zvet measure whose reader goes away', () => {
  it('stops with one line on standard error', async () => {
    const child = spawn(process.execPath, [ZVET_BIN, 'measure', join(OPEN_SPECTRA, 'sdss'), '--jobs', '1'], { stdio: ['ignore', 'pipe', 'pipe'] });
    let stderr = '';
    child.stderr.on('data', (d) => (stderr += d));
    // Close our end of the pipe as soon as the first rows arrive, as `head -1` does.
    child.stdout.once('data', () => child.stdout.destroy());
    const code = await new Promise<number | null>((resolve) => child.on('exit', resolve));
    expect(code).not.toBe(0);
    expect(stderr).not.toMatch(/\n\s+at /);
    expect(stderr.trim().split('\n')).toHaveLength(1);
    expect(stderr).toMatch(/EPIPE/);
  }, 60000);
});

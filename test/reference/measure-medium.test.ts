// `zvet measure --air|--vacuum`: the medium of the files' wavelengths, which zvet must otherwise
// assume for a text file that does not say. An emission-line spectrum written in vacuum
// wavelengths (a synthetic case with a known answer) comes back at its true z with --vacuum; read
// as air (the assumption for a file that says nothing) it comes back higher by the refractive index
// of air, which the IAU standard (Morton 1991, ApJS 77, 119) sets: Hα is 6562.80 Å in air and
// 6564.61 Å in vacuum, so 1 + z grows by 6564.61/6562.80 (the check values of our design notes).
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { normalDeviates } from '../support/prng.js';
import { ZVET_BIN } from '../support/paths.js';

const SPEED_OF_LIGHT_KMS = 299792.458;
const Z_TRUE = 0.05;
/** Rest vacuum wavelengths, Å (NIST ASD), and relative strengths of a star-forming galaxy (invented). */
const LINES: [number, number][] = [[3727.09, 2], [3729.88, 2.6], [4862.68, 1], [4960.30, 0.5], [5008.24, 1.5], [6549.86, 0.3], [6564.61, 3], [6585.27, 0.9], [6718.29, 0.5], [6732.67, 0.4]];
const AIR_OVER_VACUUM_HALPHA = 6564.61 / 6562.8;

const dir = mkdtempSync(join(tmpdir(), 'zvet-medium-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A text spectrum in vacuum wavelengths whose header names the column plainly "wave" (no medium). */
function writeVacuumSpectrum(): string {
  const noise = normalDeviates(20261204);
  const rows = ['wave flux error'];
  const sigmaKmS = 80, errorLevel = 0.05;
  for (let lam = 3700; lam <= 9000; lam += 1.5) {
    let f = 1 + 0.2 * Math.sin(lam / 900);
    for (const [rest, strength] of LINES) {
      const c = rest * (1 + Z_TRUE), s = (c * sigmaKmS) / SPEED_OF_LIGHT_KMS;
      f += strength * Math.exp(-0.5 * ((lam - c) / s) ** 2);
    }
    rows.push(`${lam.toFixed(2)} ${(f + errorLevel * noise()).toFixed(5)} ${errorLevel}`);
  }
  const file = join(dir, 'host-vacuum.txt');
  writeFileSync(file, `${rows.join('\n')}\n`);
  return file;
}

function measure(file: string, ...flags: string[]) {
  const r = spawnSync(process.execPath, [ZVET_BIN, 'measure', file, '--format', 'jsonl', '--jobs', '1', ...flags], { encoding: 'utf8', timeout: 120_000 });
  return { status: r.status, stderr: r.stderr, row: r.status === 0 ? JSON.parse(r.stdout) : null };
}

describe('zvet measure --air / --vacuum', () => {
  const file = writeVacuumSpectrum();

  it('recovers the true z with --vacuum and says the medium was set by the user', () => {
    const { status, row } = measure(file, '--vacuum');
    expect(status).toBe(0);
    expect(row.medium_in_file).toBe('vacuum');
    expect(row.medium_reason).toBe('set by the user, whatever the file says');
    expect(Math.abs(row.z - Z_TRUE)).toBeLessThan(3 * row.z_err);
    expect((Math.abs(row.z - Z_TRUE) / (1 + Z_TRUE)) * SPEED_OF_LIGHT_KMS).toBeLessThan(10);
  });

  it('reads a file that says nothing as air, says so in the row, and the z grows by the air/vacuum ratio (Morton 1991)', () => {
    const assumed = measure(file);
    const vacuum = measure(file, '--vacuum');
    expect(assumed.row.medium_in_file).toBe('air');
    expect(assumed.row.medium_reason).toMatch(/^assumed air: nothing in the file says/);
    // n − 1 changes by under 2 % across 3900–7000 Å (Edlén's dispersion, from memory), so the lines' common shift is the Hα one to 1e-5.
    expect((1 + assumed.row.z) / (1 + vacuum.row.z)).toBeCloseTo(AIR_OVER_VACUUM_HALPHA, 5);
    expect(measure(file, '--air').row.z).toBe(assumed.row.z);
  });

  it('refuses --air with --vacuum (exit 2, one line)', () => {
    const r = measure(file, '--air', '--vacuum');
    expect(r.status).toBe(2);
    expect(r.stderr).toBe('zvet: --air and --vacuum exclude each other\n');
  });
});

// External reference tools used by the tests. With CI=true (and locally too) a missing tool
// fails the test that needs it; nothing is skipped.
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';

export const PYTHON = '/usr/bin/python3';
export const CHROMIUM = '/usr/bin/chromium';
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--no-first-run',
];

/** Preamble for every astropy script: offline, no IERS download. */
const ASTROPY_PREAMBLE = `
import warnings
warnings.simplefilter('ignore')
from astropy.utils import iers
iers.conf.auto_download = False
iers.conf.auto_max_age = None
`;

/**
 * Python source of vac_from_air(w): air wavelengths (Å) to vacuum, Morton (1991, ApJS 77, 119)
 * eq. 3 inverted by iteration, ≥ 2000 Å only; for the scripts that compare with zvet's own
 * conversion. Needs numpy imported as np.
 */
export const PYTHON_VAC_FROM_AIR = String.raw`
def vac_from_air(w):
    w = np.asarray(w, dtype=float); v = w.copy()
    for _ in range(8):
        s2 = (1e4 / v) ** 2
        v = np.where(w >= 2000, w * (1 + (6432.8 + 2949810 / (146 - s2) + 25540 / (41 - s2)) * 1e-8), w)
    return v
`;

/**
 * Runs a Python script with Debian's astropy and returns its stdout parsed as JSON.
 * The script receives `args` as sys.argv[1:] and must print one JSON document.
 */
export function astropyJson<T = unknown>(script: string, args: string[] = [], input?: string): T {
  const out = execFileSync(PYTHON, ['-c', ASTROPY_PREAMBLE + script, ...args], {
    encoding: 'utf8',
    input,
    maxBuffer: 512 * 1024 * 1024,
  });
  return JSON.parse(out) as T;
}

/** Runs fitsverify on a file; returns its exit status and the report text. */
export function fitsverify(file: string): { status: number; report: string } {
  const r = spawnSync('fitsverify', ['-q', file], { encoding: 'utf8' });
  if (r.error) throw new Error(`fitsverify could not run: ${r.error.message}`);
  return { status: r.status ?? -1, report: `${r.stdout}${r.stderr}` };
}

/** Throws (failing the test) when the Chromium binary is missing. */
export function requireChromium(): string {
  if (!existsSync(CHROMIUM)) throw new Error(`${CHROMIUM} is missing: install Debian's chromium`);
  return CHROMIUM;
}

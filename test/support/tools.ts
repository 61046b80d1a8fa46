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

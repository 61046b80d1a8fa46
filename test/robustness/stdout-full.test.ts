// Every command whose standard output is a full disk (`zvet … > file` on a disk that fills)
// ends with one line that says so and exit code 2, never a stack trace. Linux's /dev/full
// answers every write with ENOSPC, as a full disk does.
import { spawnSync } from 'node:child_process';
import { closeSync, openSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, expect, it } from 'vitest';
import { DEMO_WORKLIST, ZVET_BIN } from '../support/paths';

const full = openSync('/dev/full', 'w');
afterAll(() => closeSync(full));
const spectrum = join(DEMO_WORKLIST, 'KRT-26-0011.fits');

it.each([
  ['cosmo', ['cosmo', '0.1', '0.5']],
  ['inspect', ['inspect', spectrum]],
  ['lines', ['lines', spectrum, '--z', '0.0682', '--json']],
  ['measure', ['measure', DEMO_WORKLIST]],
])('%s says that standard output is full (exit 2)', (_name, args) => {
  const r = spawnSync(process.execPath, [ZVET_BIN, ...args], { stdio: ['ignore', full, 'pipe'], encoding: 'utf8', timeout: 60_000 });
  expect(r.stderr).not.toMatch(/\n\s+at /);
  expect(r.stderr.trimEnd().split('\n').at(-1)).toBe('zvet: standard output: the disk is full');
  expect(r.status).toBe(2);
});

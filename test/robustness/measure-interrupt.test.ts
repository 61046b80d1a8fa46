// Ctrl+C in the middle of a long `zvet measure` batch: the rows already written stay whole and
// in input order, standard error says how many of the inputs they cover, and the exit code is
// the shell's for an interrupt (130 = 128 + SIGINT).
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, expect, it } from 'vitest';
import { OPEN_SPECTRA, ZVET_BIN } from '../support/paths';

const dir = mkdtempSync(join(tmpdir(), 'zvet-interrupt-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

it('ends an interrupted batch with whole rows for the first inputs, a line saying how many, and exit code 130', async () => {
  const sdss = join(OPEN_SPECTRA, 'sdss');
  const survey = readdirSync(sdss).filter((f) => f.startsWith('spec-')).map((f) => join(sdss, f));
  const files = Array.from({ length: 3000 }, (_, i) => survey[i % survey.length]);
  const out = join(dir, 'rows.jsonl');
  const child = spawn(process.execPath, [ZVET_BIN, 'measure', ...files, '--out', out, '--jobs', '1'], { stdio: ['ignore', 'ignore', 'pipe'] });
  let stderr = '';
  child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
  const exited = new Promise<number | null>((done) => child.on('exit', (code) => done(code)));
  // Interrupted once some rows are out, long before the batch could end.
  await expect.poll(() => (existsSync(out) ? readFileSync(out, 'utf8').split('\n').length : 0), { timeout: 60_000, interval: 50 }).toBeGreaterThan(20);
  child.kill('SIGINT');
  expect(await exited).toBe(130);
  const m = /^zvet: interrupted: the first (\d+) of 3000 spectra were measured and written \(whole rows, in input order\); the rest were not$/.exec(stderr.trimEnd().split('\n').at(-1) ?? '');
  expect(m, stderr).not.toBeNull();
  const rows = readFileSync(out, 'utf8').trimEnd().split('\n').map((line) => JSON.parse(line));
  expect(rows).toHaveLength(Number(m![1]));
  expect(rows.length).toBeLessThan(3000);
  expect(rows.map((r) => r.file)).toEqual(files.slice(0, rows.length));
});

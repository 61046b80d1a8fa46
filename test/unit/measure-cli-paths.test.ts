// `zvet measure` with paths and outputs that go wrong: a path that does not exist is a row with
// its reason and the batch goes on (exit 1); folders are walked through symbolic links, each
// once; an output that cannot be written, and more workers than make sense, are usage errors
// (exit 2) named in one line before any work.
import { spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, symlinkSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { listSpectrumFiles } from '../../core/node/spectrum-files.js';
import { MAX_JOBS_PER_CORE } from '../../core/node/measure-pool.js';
import { DEMO_WORKLIST, ZVET_BIN } from '../support/paths.js';

const GOOD = join(DEMO_WORKLIST, 'KRT-26-0011.fits');
const dir = mkdtempSync(join(tmpdir(), 'zvet-measure-paths-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function zvet(...args: string[]) {
  const r = spawnSync(process.execPath, [ZVET_BIN, 'measure', ...args], { encoding: 'utf8', timeout: 120_000 });
  return { status: r.status, signal: r.signal, error: r.error, stdout: r.stdout, stderr: r.stderr };
}

describe('zvet measure paths and outputs', () => {
  it('gives a path that does not exist its own error row and measures the rest (exit 1)', () => {
    const missing = join(dir, 'no-such-night', 'KRT-99-0001.fits');
    const r = zvet(GOOD, missing, '--format', 'jsonl');
    const rows = r.stdout.trimEnd().split('\n').map((l) => JSON.parse(l));
    expect(rows.map((row) => [row.file, row.status])).toEqual([[GOOD, 'ok'], [missing, 'error']]);
    expect(rows[1].error).toBe('no such file');
    expect(r.status).toBe(1);
    expect(r.stderr.trimEnd().split('\n').at(-1)).toBe('2 spectra: 1 measured, 1 failed');
  });

  it('says "1 spectrum" in the tally of one', () => {
    const r = zvet(GOOD, '--out', join(dir, 'one.csv'));
    expect(r.status).toBe(0);
    expect(r.stderr.trimEnd().split('\n')).toEqual(['the z and confidence of every row are automatic suggestions until a person vets them (zvet serve)', '1 spectrum: 1 measured, 0 failed']);
  });

  it('follows symbolic links in folders, walks each folder once, keeps a broken link as a failed row', async () => {
    const night = join(dir, 'linked-night');
    mkdirSync(join(night, 'sub'), { recursive: true });
    symlinkSync(GOOD, join(night, 'a.fits'));
    symlinkSync(join(dir, 'gone.fits'), join(night, 'b.fits'));
    symlinkSync(night, join(night, 'sub', 'loop'));
    copyFileSync(join(DEMO_WORKLIST, 'KRT-26-0018.csv'), join(night, 'sub', 'c.csv'));
    expect(await listSpectrumFiles([night], { followLinks: true })).toEqual([join(night, 'a.fits'), join(night, 'b.fits'), join(night, 'sub', 'c.csv')]);
    // The window's worklist passes links over (test/unit/server-hostile.test.ts).
    expect(await listSpectrumFiles([night])).toEqual([join(night, 'sub', 'c.csv')]);
  });

  it.each([
    ['a folder that does not exist', () => join(dir, 'missing', 'out.csv'), 'no such file or folder'],
    ['a folder', () => dir, 'is a folder, not a file'],
  ])('refuses --out into %s, naming it, before any work (exit 2)', (_what, out, reason) => {
    const r = zvet(GOOD, '--out', out());
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toBe(`zvet: ${out()}: ${reason}\n`);
  });

  it('gives a named pipe or a device its own error row at once instead of waiting on it (exit 1)', () => {
    const fifo = join(dir, 'KRT-26-0099.fits');
    expect(spawnSync('mkfifo', [fifo]).status).toBe(0);
    const r = zvet(fifo, '/dev/zero', GOOD, '--format', 'jsonl');
    const rows = r.stdout.trimEnd().split('\n').map((l) => JSON.parse(l));
    expect(rows.map((row) => [row.file, row.status, row.error])).toEqual([
      [fifo, 'error', 'is not a regular file (a device, pipe or socket)'],
      ['/dev/zero', 'error', 'is not a regular file (a device, pipe or socket)'],
      [GOOD, 'ok', null],
    ]);
    expect(r.status).toBe(1);
  });

  it('names the output when the disk fills (exit 2)', () => {
    const r = zvet(DEMO_WORKLIST, '--out', '/dev/full');
    expect(r.status).toBe(2);
    expect(r.stderr.trimEnd().split('\n').at(-1)).toBe('zvet: /dev/full: the disk is full');
  });

  it('takes the format from the --out name, and refuses a name of another format', () => {
    const r = zvet(GOOD, '--out', join(dir, 'rows.xml'));
    expect(r.status).toBe(2);
    expect(r.stderr).toBe(`zvet: --out ${join(dir, 'rows.xml')}: zvet measure writes CSV or JSON Lines; name the file .csv or .jsonl, or give --format\n`);
    expect(existsSync(join(dir, 'rows.xml'))).toBe(false);
    expect(zvet(GOOD, '--out', join(dir, 'rows.ndjson')).status).toBe(0);
    expect(JSON.parse(readFileSync(join(dir, 'rows.ndjson'), 'utf8').split('\n')[0]).status).toBe('ok');
    expect(zvet(GOOD, '--out', join(dir, 'rows.xml'), '--format', 'csv').status).toBe(0);
  });

  it('never empties an input: --out that is an input is refused, an earlier output in a walked folder is left out', () => {
    const night = join(dir, 'night-out');
    mkdirSync(night);
    copyFileSync(GOOD, join(night, 'KRT-26-0011.fits'));
    copyFileSync(join(DEMO_WORKLIST, 'KRT-26-0018.csv'), join(night, 'KRT-26-0018.csv'));
    const before = readFileSync(join(night, 'KRT-26-0018.csv'), 'utf8');
    const clash = zvet(join(night, 'KRT-26-0011.fits'), join(night, 'KRT-26-0018.csv'), '--out', join(night, 'KRT-26-0018.csv'));
    expect(clash.status).toBe(2);
    expect(clash.stderr).toBe(`zvet: --out ${join(night, 'KRT-26-0018.csv')} is also an input: it would be emptied before it is read\n`);
    expect(readFileSync(join(night, 'KRT-26-0018.csv'), 'utf8')).toBe(before);
    // Run twice into the folder it walks: the second run does not measure the first one's rows.
    for (let run = 0; run < 2; run++) {
      const r = zvet(night, '--out', join(night, 'rows.csv'));
      expect(r.status, `run ${run + 1}: signal ${r.signal}, ${r.error?.message ?? ''} ${r.stderr}`).toBe(0);
    }
    const rows = readFileSync(join(night, 'rows.csv'), 'utf8').trim().split('\n');
    expect(rows).toHaveLength(3);
    expect(rows.some((r) => r.includes('rows.csv'))).toBe(false);
  });

  it('says in words when the reader of its output stops early (| head)', () => {
    const r = spawnSync('bash', ['-c', `"${process.execPath}" "${ZVET_BIN}" measure "${DEMO_WORKLIST}" --jobs 1 | head -c 10`], { encoding: 'utf8', timeout: 120_000 });
    expect(r.stdout).toBe('file,hdu,s');
    // Rows that fit the pipe's buffer before head exits end normally with the tally; a write
    // after head exited ends with one line in words (was "zvet: write EPIPE").
    expect(r.stderr).not.toMatch(/write EPIPE|\n\s+at /);
    if (r.stderr.includes('EPIPE')) expect(r.stderr).toBe('zvet: the reader of the output stopped (broken pipe, EPIPE): the rest was not written\n');
  });

  it(`refuses more than ${MAX_JOBS_PER_CORE} workers per core (exit 2)`, () => {
    const most = MAX_JOBS_PER_CORE * availableParallelism();
    const r = zvet(GOOD, '--jobs', String(most + 1));
    expect(r.status).toBe(2);
    expect(r.stderr).toBe(`zvet: --jobs: ${most + 1} is more than ${most} (${MAX_JOBS_PER_CORE} per core, ${availableParallelism()} cores here); workers beyond the cores only add memory\n`);
    expect(zvet(GOOD, '--jobs', String(most), '--out', join(dir, 'most.csv')).status).toBe(0);
  });
});

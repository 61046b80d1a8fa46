// Issue 7 item 6: a folder of 1,000 spectra, 5 % of them damaged, through `zvet measure` as a
// user runs it (the built bin/zvet.js, --jobs 2). Every good file is measured (status ok, a z),
// every damaged one listed with a one-line reason saying what is wrong, one row per input file in
// input order, exit code 1 (some failed), and a tally as the last line on standard error. Once as
// JSON Lines, once as CSV (read back with Python's csv module, an RFC 4180 reader outside zvet).
// Good files are byte copies, renamed, of the demo night and the open survey spectra, so every
// copy of one file must get the same z as the others: the batch must not mix up files.
import { spawnSync } from 'node:child_process';
import { chmodSync, copyFileSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ALL_DAMAGE, CONTROL_CHARACTERS as CONTROL, FITS_DAMAGE, type Damage } from '../support/damaged-spectra';
import { DEMO_WORKLIST, OPEN_SPECTRA, ZVET_BIN } from '../support/paths';
import { prng } from '../support/prng';
import { astropyJson } from '../support/tools';

const TOTAL = 1000;
const DAMAGED = 50;

interface Input {
  path: string;
  /** Good file: the file it was copied from. */
  source?: string;
  /** Damaged file: what was done to it. */
  damage?: Damage;
}

/** The ending zvet's folder walk keys on, kept on the copy. */
function ending(name: string): string {
  return /(_1d|_table)?\.(fits\.gz|fits|csv)$/i.exec(name)![0];
}

/** The spectra of the open set: not the 3D-HST redshift-probability files, not the GALAH table. */
function openSpectra(): string[] {
  const sdss = readdirSync(join(OPEN_SPECTRA, 'sdss')).filter((f) => f.endsWith('.fits')).map((f) => join(OPEN_SPECTRA, 'sdss', f));
  const other = readdirSync(join(OPEN_SPECTRA, 'other')).filter((f) => /^\d+\.fits$|\.1D\.fits$/.test(f)).map((f) => join(OPEN_SPECTRA, 'other', f));
  return [...sdss, ...other];
}

let tmp: string;
let dir: string;
let inputs: Input[];
let damageSkipped: string | null = null;

beforeAll(() => {
  tmp = mkdtempSync(join(tmpdir(), 'zvet-batch-'));
  dir = join(tmp, 'night');
  mkdirSync(dir);
  const demo = readdirSync(DEMO_WORKLIST).filter((f) => !f.includes('truncated')).map((f) => join(DEMO_WORKLIST, f));
  const good = [...demo, ...openSpectra()];
  expect(good.length).toBe(12 + 38);
  // Damaged files are made from the demo's 1-D FITS images (the damage needs a primary data array).
  const images = demo.filter((f) => /\d\.fits(\.gz)?$|_1d\.fits$/.test(f));

  const random = prng(2026_03_14);
  const damagedAt = new Set<number>();
  while (damagedAt.size < DAMAGED) damagedAt.add(Math.floor(random() * TOTAL));

  const damages: Damage[] = [...ALL_DAMAGE];
  if (process.getuid?.() !== 0) {
    damages.push({ name: 'unreadable (no read permission)', ending: '.fits', make: (b) => b, reason: /^permission denied$/ });
  } else {
    // Running as root: a file without read permission is still readable, so that variant is left out.
    damageSkipped = 'unreadable (no read permission): running as root, permissions do not stop reading';
  }

  const made: Input[] = [];
  let goodCount = 0;
  let damageCount = 0;
  for (let i = 0; i < TOTAL; i++) {
    const stem = `KRT-26-${String(i + 1).padStart(4, '0')}`;
    if (damagedAt.has(i)) {
      const damage = damages[damageCount % damages.length];
      const from = damage.demoSource ? join(DEMO_WORKLIST, damage.demoSource) : images[damageCount % images.length];
      damageCount++;
      const path = join(dir, stem + damage.ending);
      writeFileSync(path, damage.make(readFileSync(from), random));
      if (damage.name.startsWith('unreadable')) chmodSync(path, 0o000);
      made.push({ path, damage });
    } else {
      const source = good[goodCount++ % good.length];
      const path = join(dir, stem + ending(source.split('/').pop()!));
      copyFileSync(source, path);
      made.push({ path, source });
    }
  }
  // A folder named like a file, holding the 1,000th good copy: zvet searches folders whatever
  // their name, so it must measure the file inside and not stumble on the folder's name.
  let last = made.length - 1;
  while (!made[last].source) last--;
  const folder = join(dir, 'KRT-26-0500b.fits');
  mkdirSync(folder);
  const inner = join(folder, `KRT-26-0500c${ending(made[last].path)}`);
  copyFileSync(made[last].path, inner);
  rmSync(made[last].path);
  made[last] = { path: inner, source: made[last].source };
  // Input order is the folder walk's: names sorted, a folder's files at the folder's place.
  const key = (p: string) => p.slice(dir.length + 1);
  inputs = made.sort((a, b) => (key(a.path) < key(b.path) ? -1 : key(a.path) > key(b.path) ? 1 : 0));
});

afterAll(() => {
  if (tmp) rmSync(tmp, { recursive: true, force: true });
});

interface Row {
  file: string;
  status: string;
  error: string | null;
  z: number | null;
}

function runMeasure(format: 'jsonl' | 'csv'): { status: number | null; stderr: string; out: string } {
  const out = join(tmp, `measured.${format}`);
  const r = spawnSync(process.execPath, [ZVET_BIN, 'measure', dir, '--format', format, '--out', out, '--jobs', '2'], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  if (r.error) throw r.error;
  return { status: r.status, stderr: r.stderr, out };
}

/** Checks the rows against the inputs; returns the figures. */
function checkRows(rows: Row[], stderr: string, status: number | null) {
  expect(rows).toHaveLength(TOTAL);
  const zBySource = new Map<string, number>();
  let measured = 0;
  let failed = 0;
  for (const [i, input] of inputs.entries()) {
    const row = rows[i];
    expect(row.file, `row ${i + 1}`).toBe(input.path);
    if (input.source) {
      expect(row.status, `${row.file} (copy of ${input.source}): ${row.error}`).toBe('ok');
      expect(row.error).toBeNull();
      expect(Number.isFinite(row.z), `${row.file}: z ${row.z}`).toBe(true);
      const seen = zBySource.get(input.source);
      if (seen === undefined) zBySource.set(input.source, row.z!);
      else expect(row.z, `${row.file}: same bytes as ${input.source}, another z`).toBe(seen);
      measured++;
    } else {
      const damage = input.damage!;
      expect(row.status, `${row.file} (${damage.name})`).toBe('error');
      expect(row.z).toBeNull();
      expect(row.error, `${row.file} (${damage.name})`).toMatch(damage.reason);
      expect(row.error).not.toMatch(CONTROL);
      failed++;
    }
  }
  expect(status).toBe(1);
  const lines = stderr.trimEnd().split('\n');
  expect(lines.at(-1)).toBe(`${TOTAL} spectra: ${TOTAL - DAMAGED} measured, ${DAMAGED} failed`);
  expect(stderr).not.toMatch(/\n\s+at /);
  return { rows: rows.length, measured, failed, distinctGoodSources: zBySource.size, summary: lines.at(-1) };
}

describe(`zvet measure on ${TOTAL} spectra, ${DAMAGED} damaged`, () => {
  it('has the folder as built: every variant of damage used, good copies of all 50 good files', () => {
    const used = new Set(inputs.filter((i) => i.damage).map((i) => i.damage!.name));
    expect(used.size).toBe(ALL_DAMAGE.length + (damageSkipped ? 0 : 1));
    expect(FITS_DAMAGE.length).toBeGreaterThan(5);
    expect(new Set(inputs.filter((i) => i.source).map((i) => i.source)).size).toBe(50);
    if (damageSkipped) console.log(`batch: variant left out: ${damageSkipped}`);
  });

  it('JSON Lines: every good one measured, every damaged one listed with its reason, exit 1, a tally', () => {
    const r = runMeasure('jsonl');
    const rows = readFileSync(r.out, 'utf8').trimEnd().split('\n').map((l) => JSON.parse(l) as Row);
    const figures = checkRows(rows, r.stderr, r.status);
    const reasons = new Map<string, string>();
    for (const [i, input] of inputs.entries()) if (input.damage && !reasons.has(input.damage.name)) reasons.set(input.damage.name, rows[i].error!);
    console.log(`batch jsonl: ${JSON.stringify(figures)}`);
    console.log(`batch reasons:\n${[...reasons].map(([k, v]) => `  ${k}: ${v}`).join('\n')}`);
  }, 900_000);

  it('CSV: the same rows, read back by an RFC 4180 reader', () => {
    const r = runMeasure('csv');
    const read = astropyJson<Record<string, string>[]>(
      'import csv, json, sys\nprint(json.dumps(list(csv.DictReader(open(sys.argv[1], newline="", encoding="utf-8")))))',
      [r.out],
    );
    const rows: Row[] = read.map((o) => ({ file: o.file, status: o.status, error: o.error === '' ? null : o.error, z: o.z === '' ? null : Number(o.z) }));
    console.log(`batch csv: ${JSON.stringify(checkRows(rows, r.stderr, r.status))}`);
  }, 900_000);
});

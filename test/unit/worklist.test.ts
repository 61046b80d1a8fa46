// Opening a worklist: a folder (every spectrum below it) or a list of files (root = their
// common folder); spectra named by '/'-separated relative paths; the journal beside them.
import { afterAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Worklist } from '../../core/node/worklist.js';

const base = mkdtempSync(join(tmpdir(), 'zvet-worklist-'));
const night = join(base, 'night-a');
mkdirSync(join(night, 'red'), { recursive: true });
for (const f of ['b.fits', 'a.csv', 'red/c.fits.gz', 'red/d.txt.gz', 'notes.md', 'night-a.verdicts.jsonl']) writeFileSync(join(night, f), '');
afterAll(() => rmSync(base, { recursive: true, force: true }));

describe('Worklist.open', () => {
  it('takes every spectrum below a folder, sorted, and puts the journal in it', async () => {
    const w = await Worklist.open(night);
    expect(w.root).toBe(night);
    expect(w.name).toBe('night-a');
    expect(w.journalPath).toBe(join(night, 'night-a.verdicts.jsonl'));
    expect(w.journal.path).toBe(w.journalPath);
    expect(w.entries.map((e) => e.spectrum)).toEqual(['a.csv', 'b.fits', 'red/c.fits.gz', 'red/d.txt.gz']);
    expect(w.entries[2].absPath).toBe(join(night, 'red', 'c.fits.gz'));
  });

  it('roots a list of files at their common folder', async () => {
    const w = await Worklist.open([join(night, 'red', 'c.fits.gz'), join(night, 'b.fits')]);
    expect(w.root).toBe(night);
    expect(w.entries.map((e) => e.spectrum)).toEqual(['red/c.fits.gz', 'b.fits']);
    const one = await Worklist.open([join(night, 'red', 'c.fits.gz')]);
    expect(one.root).toBe(join(night, 'red'));
    expect(one.journalPath).toBe(join(night, 'red', 'red.verdicts.jsonl'));
  });

  it('fails with the missing path named', async () => {
    await expect(Worklist.open(join(base, 'no-such-night'))).rejects.toMatchObject({ code: 'ENOENT', path: join(base, 'no-such-night') });
  });
});

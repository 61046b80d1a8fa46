// `zvet export` through the built program (npm test builds first) on a copy of the demo
// worklist with a hand-written journal: every spectrum gets a row, the journal's rules hold
// (last verdict wins, undo, torn last line warned about), and astropy (ascii.ecsv, io.fits)
// and fitsverify read what it writes.
import { spawnSync } from 'node:child_process';
import { afterAll, describe, expect, it } from 'vitest';
import { cpSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DEMO_WORKLIST, ZVET_BIN } from '../support/paths.js';
import { fitsverify } from '../support/tools.js';
import { readTableWithAstropy } from './astropy-table.js';

const base = mkdtempSync(join(tmpdir(), 'zvet-cli-export-'));
const night = join(base, 'kestrel-2026-03-14');
cpSync(DEMO_WORKLIST, night, { recursive: true, filter: (src) => !src.endsWith('.verdicts.jsonl') });
afterAll(() => rmSync(base, { recursive: true, force: true }));

// Written by hand, as the window would have appended it during the night; the last line was
// cut off by a crash.
const journal = [
  '{"v":1,"kind":"verdict","verdict":{"spectrum":"KRT-26-0011.fits","hdu":0,"status":"accepted","z":0.04823,"zErr":0.00011,"confidence":"secure","objectClass":"galaxy","template":"star-forming","note":"","time":"2026-03-14T03:20:00.000Z","user":"observer"}}',
  '{"v":1,"kind":"verdict","verdict":{"spectrum":"KRT-26-0014.fits","hdu":0,"status":"accepted","z":0.0871,"zErr":0.0003,"confidence":"likely","objectClass":"galaxy","template":"passive","note":"","time":"2026-03-14T04:30:00.000Z","user":"observer"}}',
  '{"v":1,"kind":"verdict","verdict":{"spectrum":"KRT-26-0014.fits","hdu":0,"status":"revised","z":0.08762,"zErr":0.00009,"confidence":"secure","objectClass":"agn","template":"narrow-line AGN","note":"strong [O III], \\"Seyfert 2\\"","time":"2026-03-14T04:31:00.000Z","user":"observer"}}',
  '{"v":1,"kind":"verdict","verdict":{"spectrum":"KRT-26-0012.fits","hdu":0,"status":"accepted","z":0.9,"zErr":0.001,"confidence":"tentative","objectClass":"galaxy","template":"passive","note":"","time":"2026-03-14T04:40:00.000Z","user":"observer"}}',
  '{"v":1,"kind":"undo","spectrum":"KRT-26-0012.fits","time":"2026-03-14T04:40:05.000Z"}',
  '{"v":1,"kind":"verdict","verdict":{"spectrum":"KRT-26-0021.fits","hdu":0,"status":"no-redshift","z":null,"zErr":null,"confidence":null,"objectClass":"unknown","template":null,"note":"S/N too low","time":"2026-03-14T08:30:00.000Z","user":"observer"}}',
  // A spectrum that was moved out of the folder after it was vetted.
  '{"v":1,"kind":"verdict","verdict":{"spectrum":"KRT-26-0099.fits","hdu":0,"status":"accepted","z":0.3,"zErr":0.0002,"confidence":"secure","objectClass":"galaxy","template":"passive","note":"","time":"2026-03-14T08:40:00.000Z","user":"observer"}}',
  '{"v":1,"kind":"verdict","verdict":{"spectrum":"KRT-26-0016.fi',
].join('\n');
writeFileSync(join(night, 'kestrel-2026-03-14.verdicts.jsonl'), journal);

function zvet(...args: string[]) {
  const r = spawnSync(process.execPath, [ZVET_BIN, ...args], { encoding: 'utf8' });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe('zvet export on the demo worklist', () => {
  it.each(['csv', 'ecsv', 'fits'] as const)('writes the %s catalogue with every spectrum and the verdicts in force', (format) => {
    const out = join(base, `night.${format}`);
    const r = zvet('export', night, '--format', format, '--out', out);
    expect(r.stderr).toMatch(/^zvet: warning: .*kestrel-2026-03-14\.verdicts\.jsonl: line 8 \(the last\) is incomplete/);
    // Nothing is left out without a word: the unreadable file and the verdict without a file are named.
    expect(r.stderr).toContain('zvet: warning: KRT-26-0023_truncated.fits could not be read: its row gives the reason (read_problem)\n');
    expect(r.stderr).toContain('zvet: warning: the journal has verdicts for KRT-26-0099.fits, no longer in the worklist: left out of the catalogue (the journal keeps them)\n');
    // Exit 1: one file of the worklist could not be read (README: 1 when some inputs failed).
    expect(r.status).toBe(1);
    expect(r.stdout).toBe(`wrote 13 rows to ${out} (${format}): 3 vetted, 10 pending, 1 unreadable\n`);
    const { rows, units } = readTableWithAstropy(out, ({ csv: 'ascii.csv', ecsv: 'ascii.ecsv', fits: 'fits' } as const)[format]);
    expect(rows).toHaveLength(13);
    const by = Object.fromEntries(rows.map((row) => [row.spectrum, row]));
    expect(by['KRT-26-0011.fits']).toMatchObject({ status: 'accepted', z: 0.04823, class: 'galaxy', object: 'KRT-26-0011' });
    expect(by['KRT-26-0014.fits']).toMatchObject({ status: 'revised', z: 0.08762, class: 'agn', note: 'strong [O III], "Seyfert 2"' });
    expect(by['KRT-26-0012.fits']).toMatchObject({ status: 'pending', z: null });
    expect(by['KRT-26-0021.fits']).toMatchObject({ status: 'no-redshift', z: null, note: 'S/N too low' });
    expect(by['KRT-26-0016.fits']).toMatchObject({ status: 'pending', object: 'KRT-26-0016' });
    expect(by['KRT-26-0023_truncated.fits'].status).toBe('pending');
    expect(by['KRT-26-0023_truncated.fits'].read_problem).toMatch(/truncated/);
    if (format !== 'csv') expect(units.ra_deg).toBe('deg');
    if (format === 'fits') expect(fitsverify(out).report).toMatch(/^verification OK/);
    // Nothing but the catalogues was added to the worklist copy, and no temporary file stays.
    expect(readdirSync(base).filter((n) => n.includes('.tmp'))).toEqual([]);
    expect(readFileSync(join(night, 'kestrel-2026-03-14.verdicts.jsonl'), 'utf8')).toBe(journal);
  });

  it('refuses to write over the journal, a spectrum or anything but a plain file', () => {
    const folderNamedCsv = join(base, 'a-folder.csv');
    mkdirSync(folderNamedCsv);
    for (const [out, why] of [
      [join(night, 'kestrel-2026-03-14.verdicts.jsonl'), 'it would overwrite the journal of verdicts'],
      [join(night, 'KRT-26-0011.fits'), 'it would overwrite a spectrum of the worklist'],
      [folderNamedCsv, 'it is not a plain file'],
    ]) {
      const before = out.endsWith('.csv') ? null : readFileSync(out);
      const r = zvet('export', night, '--format', 'csv', '--out', out);
      expect(r.status, out).toBe(2);
      expect(r.stderr.trimEnd().split('\n').at(-1)).toBe(`zvet: --out ${out}: ${why}`);
      if (before) expect(readFileSync(out).equals(before)).toBe(true);
    }
  });

  it('takes the format from the --out ending, and refuses what it cannot do with one line and exit 2', () => {
    const out = join(base, 'by-ending.ecsv');
    // Exit 1 for the truncated file of the demo night, as in every export of it.
    expect(zvet('export', night, '--out', out).status).toBe(1);
    expect(readFileSync(out, 'utf8').startsWith('# %ECSV 1.0\n')).toBe(true);

    const noFormat = zvet('export', night, '--out', join(base, 'catalogue.txt'));
    expect(noFormat.status).toBe(2);
    expect(noFormat.stderr).toMatch(/^zvet: --format is needed: .*catalogue\.txt does not end in \.csv, \.ecsv or \.fits\n$/);

    const badFormat = zvet('export', night, '--format', 'votable', '--out', join(base, 'c.xml'));
    expect(badFormat.status).toBe(2);
    expect(badFormat.stderr).toBe('zvet: --format must be one of csv, ecsv, fits, not votable\n');

    const missing = zvet('export', join(base, 'no-such-night'), '--out', join(base, 'c.csv'));
    expect(missing.status).toBe(2);
    expect(missing.stderr).toBe(`zvet: ${join(base, 'no-such-night')}: no such file or folder\n`);

    const noFolder = zvet('export', night, '--out', join(base, 'no-such-folder', 'c.csv'));
    expect(noFolder.status).toBe(2);
    const lines = noFolder.stderr.trimEnd().split('\n').filter((l) => !l.startsWith('zvet: warning: '));
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^zvet: .*no-such-folder.*: no such file or folder$/);
  });
});

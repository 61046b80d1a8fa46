// The catalogue exporters read back by independent software: Debian's astropy 5.2 reads the
// CSV (ascii.csv), the ECSV with its units and descriptions (ascii.ecsv, APE 6) and the FITS
// binary table (io.fits, TUNITn); fitsverify checks the FITS file against the standard.
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildCatalogue, CATALOGUE_COLUMNS, type CatalogueColumn, type CatalogueSource } from '../../core/catalogue/catalogue.js';
import { formatFromFileName, serialiseTable, type CatalogueFormat } from '../../core/catalogue/export.js';
import type { Verdict } from '../../core/catalogue/verdict.js';
import type { SpectrumMeta } from '../../core/spectrum/spectrum.js';
import { fitsverify } from '../support/tools.js';
import { readTableWithAstropy } from './astropy-table.js';

const dir = mkdtempSync(join(tmpdir(), 'zvet-catalogue-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const meta: SpectrumMeta = {
  object: 'KRT-26-0011', raDeg: 150.123456, decDeg: -2.5, dateObsUtc: '2026-03-14T02:48:00.000', mjdObs: 61113.116667, exposureS: 900,
  velocityFrame: 'topocentric', velocityFrameReason: 'SPECSYS',
};
const accepted: Verdict = {
  spectrum: 'KRT-26-0011.fits', hdu: 0, status: 'accepted', z: 0.048231, zErr: 0.00012, confidence: 'secure', objectClass: 'galaxy',
  template: 'star-forming', note: 'Hα, [N II], "clean", 2nd line\nhere', time: '2026-03-14T03:10:00.000Z', user: 'observer',
};
const sources: CatalogueSource[] = [
  { spectrum: accepted.spectrum, verdict: accepted, meta, hdu: 0, readProblem: null },
  { spectrum: 'KRT-26-0012.fits', verdict: null, meta: { ...meta, object: 'KRT-26-0012', exposureS: undefined }, hdu: 0, readProblem: null },
  { spectrum: 'KRT-26-0018.csv', verdict: { ...accepted, spectrum: 'KRT-26-0018.csv', hdu: null, status: 'no-redshift', z: null, zErr: null, confidence: null, template: null, note: '' }, meta, hdu: null, readProblem: null },
  { spectrum: 'KRT-26-0023_truncated.fits', verdict: null, meta: null, hdu: null, readProblem: 'the data unit ends after 20880 of 37440 bytes' },
];
const table = buildCatalogue(sources, { worklist: 'kestrel-2026-03-14', exported: '2026-03-14T13:00:00Z', caveat: 'z is vetted only where status is accepted or revised' });

function save(format: CatalogueFormat): string {
  const path = join(dir, `catalogue.${format}`);
  writeFileSync(path, serialiseTable(table, format));
  return path;
}

describe('catalogue table', () => {
  it('has one row per spectrum, pending ones included, and the unreadable file with its reason', () => {
    expect(table.rows).toHaveLength(4);
    const col = (name: string) => table.columns.findIndex((c) => c.name === name);
    expect(table.rows.map((r) => r[col('status')])).toEqual(['accepted', 'pending', 'no-redshift', 'pending']);
    expect(table.rows[3][col('read_problem')]).toMatch(/data unit ends/);
  });

  it('takes extra columns by appending definitions', () => {
    const extra: CatalogueColumn = { name: 'z_plus_one', unit: null, type: 'float64', description: '1 + z', value: (s) => (s.verdict?.z == null ? null : 1 + s.verdict.z) };
    const t = buildCatalogue(sources, {}, [...CATALOGUE_COLUMNS, extra]);
    expect(t.columns.at(-1)?.name).toBe('z_plus_one');
    expect(t.rows[0].at(-1)).toBe(1.048231);
  });

  it('knows the format from a file ending', () => {
    expect(['a.csv', 'b.ECSV', 'c.fits', 'd.fit', 'e.txt'].map(formatFromFileName)).toEqual(['csv', 'ecsv', 'fits', 'fits', null]);
  });
});

describe.each(['csv', 'ecsv', 'fits'] as const)('%s export read back by astropy', (format) => {
  const path = save(format);
  const got = readTableWithAstropy(path, format === 'csv' ? 'ascii.csv' : format === 'ecsv' ? 'ascii.ecsv' : 'fits');

  it('has every column and row with the values written', () => {
    expect(got.names).toEqual(table.columns.map((c) => c.name));
    expect(got.rows).toHaveLength(4);
    const [first, pending, noz, broken] = got.rows;
    expect(first.z).toBe(0.048231);
    expect(first.z_err).toBe(0.00012);
    expect(first.ra_deg).toBe(150.123456);
    expect(first.mjd_obs).toBe(61113.116667);
    expect(first.hdu).toBe(0);
    expect(first.status).toBe('accepted');
    expect(first.class).toBe('galaxy');
    // FITS text is ASCII (FITS Standard 4.0, binary-table character fields; from memory): the Greek letter spelled out, the line break as " / ".
    expect(first.note).toBe(format === 'fits' ? 'Halpha, [N II], "clean", 2nd line / here' : accepted.note);
    expect(pending.status).toBe('pending');
    expect(pending.z).toBeNull();
    expect(pending.exptime_s).toBeNull();
    expect(noz.z).toBeNull();
    expect(noz.hdu).toBeNull();
    expect(broken.object).toBeNull();
    expect(broken.read_problem).toBe('the data unit ends after 20880 of 37440 bytes');
  });

  if (format !== 'csv') {
    it('carries units, descriptions and the table meta', () => {
      expect(got.units.ra_deg).toBe('deg');
      expect(got.units.exptime_s).toBe('s');
      expect(got.units.mjd_obs).toBe('d');
      expect(got.units.z).toBeNull();
      expect(got.meta[format === 'fits' ? 'WORKLIST' : 'worklist']).toBe('kestrel-2026-03-14');
      if (format === 'ecsv') expect(got.descriptions.z).toMatch(/redshift measured on the file wavelengths/);
    });
  }

  if (format === 'fits') {
    it('passes fitsverify', () => {
      const { status, report } = fitsverify(path);
      expect(report, report).toMatch(/^verification OK/);
      expect(status).toBe(0);
    });
  }
});

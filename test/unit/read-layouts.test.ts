// Each spectrum layout built by hand and read through readSpectrum, with the header evidence
// for medium, frame and metadata. Formulas: WCS Paper I/III (linear, -LOG), IRAF DC-FLAG,
// SDSS data model (loglam, ivar, and_mask), 3D-HST (flux − contam)/sensitivity.
import { describe, expect, it } from 'vitest';
import { airToVacuum } from '../../core/spectrum/air-vacuum.js';
import { readSpectrum } from '../../core/spectrum/read.js';
import { EMPTY_PRIMARY, beBytes, binTable, card, concat, fitsBytes, imageCards, linearWcs, testFlux } from './fits-fixtures.js';

const N = 20;
const flux = testFlux(N);

describe('1-D images', () => {
  it('primary image, CTYPE1 WAVE in nm: λ = CRVAL1 + CDELT1·(p − CRPIX1), vacuum', () => {
    const s = readSpectrum(fitsBytes([{ cards: imageCards(-64, [N], linearWcs(400, 0.5, 'WAVE', 'nm')), data: beBytes('f64', flux) }]), 'a.fits');
    expect(s.waveAngstrom[0]).toBeCloseTo(4000, 9);
    expect(s.waveAngstrom[N - 1]).toBeCloseTo(4000 + 5 * (N - 1), 9);
    expect(s.provenance.medium).toBe('vacuum');
    expect(s.provenance.mediumReason).toMatch(/CTYPE1 = 'WAVE'/);
    expect(s.provenance.format).toBe('fits-image-1d');
    expect(Array.from(s.flux)).toEqual(flux);
  });
  it('AWAV axis is converted from air to vacuum (Morton 1991): Hα 6562.80 → 6564.61 Å', () => {
    const s = readSpectrum(fitsBytes([{ cards: imageCards(-64, [N], linearWcs(6562.8, 1, 'AWAV')), data: beBytes('f64', flux) }]), 'a.fits');
    expect(s.waveAngstrom[0]).toBeCloseTo(6564.61, 2);
    expect(s.provenance.medium).toBe('air');
  });
  it('CD1_1 wins over CDELT1, CRPIX1 offsets the reference pixel', () => {
    const cards = [card('CRVAL1', 5000), card('CD1_1', 2), card('CDELT1', 99), card('CRPIX1', 3), card('AIRORVAC', 'vac')];
    const s = readSpectrum(fitsBytes([{ cards: imageCards(-32, [N], cards), data: beBytes('f32', flux) }]), 'a.fits');
    expect(s.waveAngstrom[0]).toBeCloseTo(4996, 9);
    expect(s.provenance.mediumReason).toMatch(/AIRORVAC/);
  });
  it('DC-FLAG = 1 is log10-linear; -LOG is WCS Paper III logarithmic', () => {
    const dc = readSpectrum(fitsBytes([{ cards: imageCards(-32, [N], [card('CRVAL1', 3.6), card('CDELT1', 1e-4), card('DC-FLAG', 1), card('VACUUM', true)]), data: beBytes('f32', flux) }]), 'a.fits');
    expect(dc.waveAngstrom[5]).toBeCloseTo(10 ** (3.6 + 5e-4), 8);
    expect(dc.provenance.dispersion).toBe('log10');
    const log = readSpectrum(fitsBytes([{ cards: imageCards(-32, [N], linearWcs(5000, 2, 'WAVE-LOG')), data: beBytes('f32', flux) }]), 'a.fits');
    expect(log.waveAngstrom[10]).toBeCloseTo(5000 * Math.exp((2 * 10) / 5000), 8);
    expect(log.provenance.dispersion).toBe('ln');
  });
  it('extension image with ERROR/SKY/MASK companions found by EXTNAME', () => {
    const ext = (name: string, values: number[]) => ({ cards: imageCards(-64, [N], [card('EXTNAME', name)], true), data: beBytes('f64', values) });
    const sci = { cards: imageCards(-64, [N], [card('EXTNAME', 'SCI'), ...linearWcs(4000, 1)], true), data: beBytes('f64', flux) };
    const mask = Array.from({ length: N }, (_, i) => (i === 4 ? 1 : 0));
    const s = readSpectrum(fitsBytes([EMPTY_PRIMARY, sci, ext('ERROR', flux.map(() => 0.5)), ext('SKY', flux.map(() => 2)), ext('MASK', mask)]), 'a.fits');
    expect(s.provenance.hdu).toBe(1);
    expect(s.provenance.spectrumHdus).toEqual([1]);
    expect(s.error[0]).toBe(0.5);
    expect(s.sky?.[3]).toBe(2);
    expect(Array.from(s.mask).indexOf(1)).toBe(4);
  });
  it('GALAH-style files: HDU 0 counts, relative_error is σ/flux, frame barycentric, air assumed', () => {
    const hdr = [...linearWcs(4714, 0.05, 'LINEAR', 'angstroms')];
    const ext = (name: string, values: number[]) => ({ cards: imageCards(-32, [N], [card('EXTNAME', name), ...hdr], true), data: beBytes('f32', values) });
    const bytes = fitsBytes([
      { cards: imageCards(-32, [N], [...hdr, card('LAT_OBS', -31.27704), card('LONG_OBS', 149.0661), card('ALT_OBS', 1164)]), data: beBytes('f32', flux) },
      ext('normalized', flux.map((f) => f / 10)),
      ext('relative_error', flux.map(() => 0.05)),
      ext('sky', flux.map(() => 3)),
      ext('teluric', flux.map(() => 1)),
    ]);
    const s = readSpectrum(bytes, 'g.fits');
    expect(s.provenance.spectrumHdus).toEqual([0, 1]);
    expect(s.error[2]).toBeCloseTo(0.05 * Math.fround(flux[2]), 6);
    expect(s.sky?.[0]).toBe(3);
    expect(s.meta.velocityFrame).toBe('barycentric');
    expect(s.provenance.medium).toBe('air');
    expect(s.meta.site).toMatchObject({ latitudeDeg: -31.27704, longitudeDeg: 149.0661, heightM: 1164 });
    const normalised = readSpectrum(bytes, 'g.fits', { hdu: 1 });
    expect(normalised.flux[0]).toBeCloseTo(flux[0] / 10, 5);
    expect(normalised.sky).toBeUndefined();
    expect(() => readSpectrum(bytes, 'g.fits', { hdu: 3 })).toThrow(/HDU 3 \(sky\) holds no spectrum .*spectrum HDUs: 0, 1/);
  });
});

describe('banded images', () => {
  it('multispec/equispec 3-D: bands found by BANDIDn label, aperture 1', () => {
    const bands = [flux, flux.map((f) => f + 5), flux.map(() => 7), flux.map(() => 0.25)];
    const cards = imageCards(-32, [N, 1, 4], [
      card('WAT0_001', 'system=equispec'), ...linearWcs(3600, 4, 'LINEAR', 'angstroms'),
      card('BANDID1', 'raw - background fit, weights none, clean no'),
      card('BANDID2', 'spectrum - background fit, weights variance, clean no'),
      card('BANDID3', 'background - background fit'),
      card('BANDID4', 'sigma - background fit, weights variance, clean no'),
    ]);
    const s = readSpectrum(fitsBytes([{ cards, data: beBytes('f32', bands.flat()) }]), 'm.fits');
    expect(s.provenance.format).toBe('fits-multispec');
    expect(s.flux[0]).toBeCloseTo(flux[0] + 5, 5);
    expect(s.sky?.[0]).toBe(7);
    expect(s.error[0]).toBe(0.25);
    expect(s.waveAngstrom[0]).toBeCloseTo(airToVacuum(3600), 9);
    expect(s.provenance.mediumReason).toMatch(/^assumed air/);
  });
  it('SDSS spSpec: rows by ARRAYn, λ = 10^(COEFF0 + COEFF1·i), σ row, SDSS mask bits, vacuum', () => {
    const mask = flux.map((_, i) => (i === 2 ? 1 << 23 : i === 3 ? 1 << 2 : 0));
    const rows = [flux, flux.map(() => 0), flux.map(() => 0.3), mask, flux.map(() => 0)];
    const cards = imageCards(-32, [N, 5], [
      card('TELESCOP', 'SDSS 2.5-M'), card('COEFF0', 3.5796), card('COEFF1', 1e-4),
      card('ARRAY1', 'SPECTRUM'), card('ARRAY2', 'CONTINUUM-SUBTRACTED SPECTRUM'), card('ARRAY3', 'ERROR'), card('ARRAY4', 'MASK'),
      card('RA', 150.09221), card('DEC', 10.308277), card('DATE-OBS', '2003-12-26'),
    ]);
    const s = readSpectrum(fitsBytes([{ cards, data: beBytes('f32', rows.flat()) }]), 'sp.fits');
    expect(s.provenance.format).toBe('fits-survey-image');
    expect(s.waveAngstrom[3]).toBeCloseTo(10 ** (3.5796 + 3e-4), 6);
    expect(s.error[0]).toBeCloseTo(0.3, 6);
    // BRIGHTSKY (bit 23) marks a bad pixel; BADFLAT (bit 2) flags the whole fibre and does not.
    expect([s.mask[2], s.mask[3]]).toEqual([1, 0]);
    expect(s.provenance.medium).toBe('vacuum');
    expect(s.meta.velocityFrame).toBe('heliocentric');
    expect(s.meta.dateObsUtc).toBe('2003-12-26T00:00:00.000Z');
  });
  it('IRAF multispec: a function block cut short is refused as incomplete, not read', () => {
    // The WAT2 string over cards of 68 characters, as IRAF writes it.
    const wat = (text: string) => Array.from({ length: Math.ceil(text.length / 68) }, (_, i) => card(`WAT2_00${i + 1}`, text.slice(68 * i, 68 * i + 68)));
    const ms = (spec1: string) => fitsBytes([{ cards: imageCards(-32, [N], [card('CTYPE1', 'MULTISPE'), card('WAT0_001', 'system=multispec'), ...wat(`wtype=multispec spec1 = "${spec1}"`)]), data: beBytes('f32', flux) }]);
    expect(() => readSpectrum(ms('1 1 2 4000. 2. 20 0. 1. 2. 1. 0. 1'), 'ms.fits')).toThrow(/spec1' function is incomplete/);
    expect(() => readSpectrum(ms('1 1 2 4000. 2. 20 0. 1. 2. 0. 0. 1 2 1. 20. 4000. 20.'), 'ms.fits')).toThrow(/spec1' function is incomplete/);
    expect(readSpectrum(ms('1 1 0 4000. 2. 20 0. 1. 2.'), 'ms.fits').provenance.dispersion).toBe('linear');
  });
  it('IRAF multispec 2-D image of 12 apertures: aperture 1 (image line 1) is read with its spec1 wavelengths', () => {
    const lines = Array.from({ length: 12 }, (_, a) => flux.map((f) => f + 100 * a));
    const cards = imageCards(-32, [N, 12], [card('CTYPE1', 'MULTISPE'), card('CTYPE2', 'MULTISPE'), card('WAT0_001', 'system=multispec'), card('WAT2_001', 'wtype=multispec spec1 = "1 1 0 4000. 2. 20 0. 1. 2."')]);
    const s = readSpectrum(fitsBytes([{ cards, data: beBytes('f32', lines.flat()) }]), 'apall.fits');
    expect(s.flux[3]).toBeCloseTo(flux[3], 5);
    expect(s.waveAngstrom[1]).toBeCloseTo(airToVacuum(4002), 8);
    expect(s.provenance.format).toBe('fits-multispec (aperture 1 of 12)');
  });
  it('a 2-D image whose first row is the wavelength (XUNITS nm): rows flux, error, flag; not taken when row 1 is not a wavelength', () => {
    const w = flux.map((_, i) => 500 + i);
    const rows = [w, flux, flux.map(() => 0.2), flux.map((_, i) => (i === 4 ? 1 : 0))];
    const cards = imageCards(-32, [N, 4], [card('XUNITS', 'nm'), card('YUNITS', 'erg/s/cm2/A'), card('WAVETYPE', 'air')]);
    const s = readSpectrum(fitsBytes([{ cards, data: beBytes('f32', rows.flat()) }]), 'rows.fits');
    expect(s.provenance.format).toBe('fits-image-rows (wavelength, flux, error)');
    expect(s.waveAngstrom[0]).toBeCloseTo(airToVacuum(5000), 6);
    expect([s.mask[4], s.mask[3], s.error[0]]).toEqual([1, 0, Math.fround(0.2)]);
    expect(s.fluxUnit).toBe('erg/s/cm2/A');
    const notWave = [flux, w, flux.map(() => 0.2)];
    expect(() => readSpectrum(fitsBytes([{ cards: imageCards(-32, [N, 3], []), data: beBytes('f32', notWave.flat()) }]), 'x.fits')).toThrow(/no wavelength axis/);
  });
  it('a 2-D image with many rows and no labels is not a spectrum', () => {
    const cards = imageCards(8, [N, 20], linearWcs(4000, 1));
    expect(() => readSpectrum(fitsBytes([{ cards, data: new Uint8Array(N * 20) }]), 'img.fits')).toThrow(/not a spectrum.*without band labels/);
  });
});

describe('tables', () => {
  const loglam = Array.from({ length: N }, (_, i) => 3.58 + 1e-4 * i);
  const sdssRows = (upper: boolean) => {
    const names = ['flux', 'loglam', 'ivar', 'and_mask'].map((n) => (upper ? n.toUpperCase() : n));
    const ivar = flux.map((_, i) => (i === 1 ? 0 : 4));
    const andMask = flux.map((_, i) => (i === 6 ? 1 << 24 : 1 << 2));
    const data = concat(...flux.map((f, i) => concat(beBytes('f32', [f, loglam[i], ivar[i]]), beBytes('i32', [andMask[i]]))));
    const primary = { cards: [...EMPTY_PRIMARY.cards, card('TELESCOP', 'SDSS 2.5-M'), card('PLUG_RA', 146.71421), card('PLUG_DEC', -1.0413043), card('TAI', 4458436689.74)] };
    return fitsBytes([primary, binTable(16, N, names.map((name, i) => ({ name, form: i === 3 ? 'J' : 'E' })), data)]);
  };
  for (const upper of [false, true]) {
    it(`SDSS coadd rows (${upper ? 'upper-case DR16 re-packaging, no EXTNAME' : 'lower case'}): 10^loglam, σ = 1/√ivar, mask`, () => {
      const s = readSpectrum(sdssRows(upper), 'spec.fits');
      expect(s.provenance.format).toBe('fits-table-rows');
      expect(s.waveAngstrom[4]).toBeCloseTo(10 ** Math.fround(loglam[4]), 6);
      expect(s.error[0]).toBe(0.5);
      expect([s.mask[1], s.mask[6], s.mask[0]]).toEqual([1, 1, 0]);
      expect(s.provenance.errorKind).toBe('ivar');
      expect(s.meta.raDeg).toBe(146.71421);
      // TAI 4458436689.74 s = MJD 51602.2763... TAI; UTC is 32 s earlier (IERS Bulletin C, 1999–2005).
      expect(s.meta.mjdObs!).toBeCloseTo(4458436689.74 / 86400 - 32 / 86400, 9);
    });
  }
  it('single-row table of array columns, wavelength in µm by TUNIT', () => {
    const w = Array.from({ length: N }, (_, i) => 0.6 + 1e-4 * i);
    const data = concat(beBytes('f64', w), beBytes('f32', flux), beBytes('f32', flux.map(() => 0.04)));
    const t = binTable(N * 16, 1, [{ name: 'WAVE', form: `${N}D`, unit: 'um' }, { name: 'FLUX', form: `${N}E` }, { name: 'VAR', form: `${N}E` }], data, [card('CTYPE1', 'WAVE')]);
    const s = readSpectrum(fitsBytes([EMPTY_PRIMARY, t]), 't.fits');
    expect(s.provenance.format).toBe('fits-table-arrays');
    expect(s.waveAngstrom[0]).toBeCloseTo(6000, 9);
    expect(s.error[0]).toBeCloseTo(0.2, 6);
    expect(s.provenance.errorKind).toBe('variance');
  });
  it('single-row ESO-style table: WAVE in nm, FLUX, ERR, QUAL (non-zero is bad), SPECSYS barycentric', () => {
    const w = Array.from({ length: N }, (_, i) => 500 + 0.1 * i);
    const qual = flux.map((_, i) => (i === 5 ? 2 : 0));
    const data = concat(beBytes('f64', w), beBytes('f32', flux), beBytes('f32', flux.map(() => 0.3)), beBytes('i32', qual));
    const cols = [{ name: 'WAVE', form: `${N}D`, unit: 'nm' }, { name: 'FLUX', form: `${N}E` }, { name: 'ERR', form: `${N}E` }, { name: 'QUAL', form: `${N}J` }];
    const s = readSpectrum(fitsBytes([EMPTY_PRIMARY, binTable(N * 20, 1, cols, data, [card('SPECSYS', 'BARYCENT'), card('AIRORVAC', 'air')])]), 'eso.fits');
    expect(s.waveAngstrom[0]).toBeCloseTo(airToVacuum(5000), 6);
    expect([s.mask[5], s.mask[4]]).toEqual([1, 0]);
    expect(s.error[0]).toBeCloseTo(0.3, 6);
    expect(s.meta.velocityFrame).toBe('barycentric');
  });
  it('PypeIt spec1d table: OPT_ columns of one extraction, OPT_MASK True = good, vacuum, VEL_TYPE frame (PypeIt data model)', () => {
    const names = ['BOX_WAVE', 'BOX_FLAM', 'OPT_WAVE', 'OPT_COUNTS', 'OPT_COUNTS_IVAR', 'OPT_FLAM', 'OPT_FLAM_IVAR', 'OPT_MASK'];
    const cols = names.map((name) => ({ name, form: name.endsWith('MASK') ? 'L' : 'D' }));
    const rows = flux.map((f, i) => concat(beBytes('f64', [5000 + i, 99, 5000 + i, 1000 * f, 1e-4, f, 16]), beBytes('u8', [i === 3 ? 70 : 84])));
    const primary = { cards: [...EMPTY_PRIMARY.cards, card('PYP_SPEC', 'keck_lris_red_mark4')] };
    const table = binTable(57, N, cols, concat(...rows), [card('VEL_TYPE', 'barycentric'), card('VEL_CORR', 1.0000312)]);
    const s = readSpectrum(fitsBytes([primary, table]), 'spec1d.fits');
    expect([s.flux[2], s.error[2]]).toEqual([flux[2], 0.25]);
    expect([s.mask[3], s.mask[2]]).toEqual([1, 0]);
    expect(s.provenance.medium).toBe('vacuum');
    expect(s.provenance.mediumReason).toMatch(/PypeIt/);
    expect(s.meta.velocityFrame).toBe('barycentric');
  });
  it('PypeIt coadd (OneSpec): wave, flux, ivar, mask with 1 = good', () => {
    const cols = ['wave', 'flux', 'ivar', 'mask'].map((name) => ({ name, form: name === 'mask' ? 'J' : 'D' }));
    const rows = flux.map((f, i) => concat(beBytes('f64', [6000 + i, f, 4]), beBytes('i32', [i === 7 ? 0 : 1])));
    const table = binTable(28, N, cols, concat(...rows), [card('PYP_SPEC', 'shane_kast_blue')]);
    const s = readSpectrum(fitsBytes([EMPTY_PRIMARY, table]), 'coadd.fits');
    expect(Array.from(s.mask).filter((m) => m).length).toBe(1);
    expect(s.mask[7]).toBe(1);
  });
  it('per-pixel table with an SNR column: σ = |flux| / SNR', () => {
    const cols = ['WAVE', 'FLUX', 'SNR'].map((name) => ({ name, form: 'D' }));
    const rows = flux.map((f, i) => beBytes('f64', [5000 + i, f, 25]));
    const s = readSpectrum(fitsBytes([EMPTY_PRIMARY, binTable(24, N, cols, concat(...rows))]), 'snr.fits');
    expect(s.provenance.errorKind).toBe('snr');
    expect(s.error[7]).toBeCloseTo(Math.abs(flux[7]) / 25, 12);
  });
  it('grism table: (flux − contam)/sensitivity and error/sensitivity; sensitivity 0 masked', () => {
    const cols = ['wave', 'flux', 'error', 'contam', 'sensitivity'].map((name) => ({ name, form: 'D', unit: name === 'sensitivity' ? 'E/S / 1E-17 CGS' : undefined }));
    const rows = flux.map((f, i) => beBytes('f64', [11000 + 46 * i, f, 0.2, 1, i === 0 ? 0 : 2]));
    const s = readSpectrum(fitsBytes([EMPTY_PRIMARY, binTable(40, N, cols, concat(...rows))]), 'g.1D.fits');
    expect(s.flux[1]).toBeCloseTo((flux[1] - 1) / 2, 12);
    expect(s.error[1]).toBeCloseTo(0.1, 12);
    expect(s.mask[0]).toBe(1);
    expect(s.fluxUnit).toBe('1e-17 erg/s/cm^2/Angstrom');
    expect(s.provenance.medium).toBe('vacuum');
  });
  it('descending wavelengths are flipped and flagged', () => {
    const rows = flux.map((f, i) => beBytes('f64', [9000 - i, f]));
    const s = readSpectrum(fitsBytes([EMPTY_PRIMARY, binTable(16, N, [{ name: 'lambda', form: 'D' }, { name: 'flux', form: 'D' }], concat(...rows), [card('VACUUM', true)])]), 'r.fits');
    expect(s.provenance.flipped).toBe(true);
    expect(s.waveAngstrom[0]).toBe(9000 - (N - 1));
    expect(s.flux[0]).toBe(flux[N - 1]);
  });
});

describe('metadata keywords', () => {
  const read = (extra: string[]) =>
    readSpectrum(fitsBytes([{ cards: imageCards(-64, [N], [...linearWcs(4000, 1), ...extra]), data: beBytes('f64', flux) }]), 'a.fits').meta;
  it('sexagesimal RA is in hours, Dec in degrees', () => {
    const m = read([card('RA', '09:43:44.6'), card('DEC', '-01:02:28.7'), card('OBJECT', 'KRT-26-0017')]);
    expect(m.raDeg).toBeCloseTo((9 + 43 / 60 + 44.6 / 3600) * 15, 9);
    expect(m.decDeg).toBeCloseTo(-(1 + 2 / 60 + 28.7 / 3600), 9);
    expect(m.object).toBe('KRT-26-0017');
  });
  it('says so when the position keywords are not a sky position, and takes the next pair that is', () => {
    const bad = read([card('RA', '99:99:99'), card('DEC', 95)]);
    expect(bad.raDeg).toBeUndefined();
    expect(bad.positionWarning).toBe('RA = "99:99:99", DEC = 95 is not a sky position (RA 0–360° or 0–24 h, Dec −90…+90°): ignored');
    const next = read([card('RA', '99:99:99'), card('DEC', 95), card('OBJCTRA', '09:43:44.6'), card('OBJCTDEC', '-01:02:28.7')]);
    expect(next.raDeg).toBeCloseTo((9 + 43 / 60 + 44.6 / 3600) * 15, 9);
    expect(next.positionWarning).toBeUndefined();
    // (0, 0) is a placeholder, not a refused position.
    expect(read([card('RA', 0), card('DEC', 0)]).positionWarning).toBeUndefined();
  });
  it('DATE-OBS + TIME-OBS, MJD-OBS and JD give both ISO UTC and MJD', () => {
    expect(read([card('DATE-OBS', '2026-03-14'), card('TIME-OBS', '03:12:30.5')])).toMatchObject({ dateObsUtc: '2026-03-14T03:12:30.500Z' });
    // MJD 61113.0 = 2026-03-14T00:00 UTC (MJD 40587 = 1970-01-01).
    expect(read([card('MJD-OBS', 61113.5)])).toMatchObject({ dateObsUtc: '2026-03-14T12:00:00.000Z', mjdObs: 61113.5 });
    expect(read([card('JD', 2461113.5)]).mjdObs).toBe(61113);
    expect(read([card('DATE-OBS', '2026-03-14T03:00:00')]).mjdObs).toBeCloseTo(61113.125, 9);
    // FITS time paper (Rots et al. 2015): MJD-BEG / DATE-BEG start, MJD-AVG / DATE-AVG mid-time.
    expect(read([card('MJD-BEG', 61113.25)]).mjdObs).toBe(61113.25);
    expect(read([card('DATE-BEG', '2026-03-14T06:00:00'), card('MJD-AVG', 61113.3)])).toMatchObject({ mjdObs: 61113.25, mjdAvg: 61113.3, avgTimeFrom: 'MJD-AVG' });
    expect(read([card('DATE-AVG', '2026-03-14T12:00:00')])).toMatchObject({ mjdAvg: 61113.5, avgTimeFrom: 'DATE-AVG' });
  });
  it('names the keyword the time came from, and prints a whole second as read (not …59.999)', () => {
    expect(read([card('DATE-OBS', '2026-03-14'), card('TIME-OBS', '04:28:00')])).toMatchObject({ dateObsUtc: '2026-03-14T04:28:00.000Z', obsTimeFrom: 'DATE-OBS + TIME-OBS' });
    expect(read([card('DATE-OBS', '2026-03-14T04:28:00')]).obsTimeFrom).toBe('DATE-OBS');
    expect(read([card('MJD-OBS', 61113.5)]).obsTimeFrom).toBe('MJD-OBS');
  });
  it('refuses a date or time that does not exist instead of rolling it over, and says so', () => {
    for (const text of ['2026-02-30T04:28:00', '2025-02-29', '2026-04-31', '2026-03-14T24:00:00', '2026-03-14T05:99:00', '2026-13-01']) {
      const m = read([card('DATE-OBS', text)]);
      expect(m.dateObsUtc, text).toBeUndefined();
      expect(m.obsTimeWarning, text).toBe(`DATE-OBS '${text}' is not a date and time that exist`);
    }
    // 2024 is a leap year (Gregorian rule); 23:59:60 is a leap second's label.
    expect(read([card('DATE-OBS', '2024-02-29T00:00:00')]).dateObsUtc).toBe('2024-02-29T00:00:00.000Z');
    expect(read([card('DATE-OBS', '2016-12-31T23:59:60')]).obsTimeWarning).toBeUndefined();
  });
  it('warns when DATE-OBS and MJD-OBS disagree by more than a day, and says which is used', () => {
    const m = read([card('DATE-OBS', '2026-03-14T04:28:00'), card('MJD-OBS', 60000)]);
    expect(m.mjdObs).toBe(60000);
    expect(m.obsTimeWarning).toBe("DATE-OBS '2026-03-14T04:28:00' is 1113.2 days from MJD-OBS 60000; MJD-OBS used");
    // The date of the night's start beside a time after midnight agrees.
    expect(read([card('DATE-OBS', '2026-03-13'), card('MJD-OBS', 61113.2)]).obsTimeWarning).toBeUndefined();
    expect(read([card('DATE-OBS', '2026-03-11'), card('MJD-OBS', 61113.2)]).obsTimeWarning).toBe("DATE-OBS '2026-03-11' is 3.2 days from MJD-OBS 61113.2; MJD-OBS used");
  });
  it('EXPTIME and site keyword families with their sign conventions (east-positive result)', () => {
    const geo = read([card('EXPTIME', 1200), card('OBSGEO-B', 28.76), card('OBSGEO-L', -17.88), card('OBSGEO-H', 2348), card('OBSERVAT', 'Kestrel Ridge')]);
    expect(geo.exposureS).toBe(1200);
    expect(geo.site).toEqual({ name: 'Kestrel Ridge', latitudeDeg: 28.76, longitudeDeg: -17.88, heightM: 2348 });
    // ING practice: LONGITUD positive to the west (La Palma +17.88).
    expect(read([card('LATITUDE', 28.76), card('LONGITUD', 17.88)]).site?.longitudeDeg).toBe(-17.88);
    // A comment naming the direction wins.
    expect(read([card('SITELAT', '+31:40:51.4'), card('SITELONG', '-110:52:39.0', 'longitude, degrees east')]).site?.longitudeDeg).toBeCloseTo(-(110 + 52 / 60 + 39 / 3600), 9);
    expect(read([card('OBS-LAT', -30.2), card('OBS-LONG', -70.7), card('OBS-ELEV', 2200)]).site).toMatchObject({ longitudeDeg: -70.7, heightM: 2200 });
    // ESO HIERARCH cards, east-positive.
    const eso = ['HIERARCH ESO TEL GEOLAT = -24.6270 / [deg] Tel geo latitude (+=North)', 'HIERARCH ESO TEL GEOLON = -70.4040 / [deg] Tel geo longitude (+=East)', 'HIERARCH ESO TEL GEOELEV = 2648. / [m] Elevation above sea level'].map((t) => t.padEnd(80));
    expect(read(eso).site).toEqual({ latitudeDeg: -24.627, longitudeDeg: -70.404, heightM: 2648 });
    // OBSGEO-X/Y/Z far from the Earth's surface is not a site.
    expect(read([card('OBSGEO-X', 1), card('OBSGEO-Y', 2), card('OBSGEO-Z', 3)]).site).toBeUndefined();
  });
  it('velocity frame from SPECSYS, VELFRAME, correction keywords, else unknown', () => {
    expect(read([card('SPECSYS', 'TOPOCENT')]).velocityFrame).toBe('topocentric');
    expect(read([card('VELFRAME', 'HELIOCEN')]).velocityFrame).toBe('heliocentric');
    expect(read([card('BARYCORR', 12.3)])).toMatchObject({ velocityFrame: 'barycentric', velocityFrameReason: expect.stringMatching(/BARYCORR/) });
    expect(read([]).velocityFrame).toBe('unknown');
  });
  it('the user override of the medium beats the header', () => {
    const bytes = fitsBytes([{ cards: imageCards(-64, [N], linearWcs(6562.8, 1, 'WAVE')), data: beBytes('f64', flux) }]);
    const s = readSpectrum(bytes, 'a.fits', { medium: 'air' });
    expect(s.waveAngstrom[0]).toBeCloseTo(6564.61, 2);
    expect(s.provenance.mediumReason).toBe('set by the user, whatever the file says');
  });
});

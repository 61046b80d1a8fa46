// Issue 7 item 1: fuzzing every reader through readSpectrum. `npm test` runs a 10,000-case
// slice; `npm run fuzz` (vitest.fuzz.config.ts) runs 100,000+. Cases: random bytes, real
// files cut short or mutated (bytes and header values), FITS headers with absurd
// NAXIS/BITPIX/TFORM/PCOUNT/THEAP values, endless CONTINUE chains and missing END, random
// text tables, and gzip bombs. Each must end as a Spectrum or a one-line SpectrumReadError;
// a reader bug surfacing through the catch-all (a TypeError and the like) fails the run.
// The slowest case and the memory peak are printed (times are reported, not asserted).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { constants, deflateRawSync, gzipSync } from 'node:zlib';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readSpectrum } from '../../core/spectrum/read.js';
import { SpectrumReadError } from '../../core/spectrum/spectrum.js';
import { beBytes, binTable, card, concat as concatBytes, EMPTY_PRIMARY, fitsBytes, imageCards, testFlux } from '../unit/fits-fixtures.js';
import { DEMO_WORKLIST, OPEN_SPECTRA } from '../support/paths.js';

const CASES = Number(process.env.ZVET_FUZZ_CASES ?? 10_000);

const SEEDS: Uint8Array[] = [
  join(DEMO_WORKLIST, 'KRT-26-0011.fits'),
  join(DEMO_WORKLIST, 'KRT-26-0015_1d.fits'),
  join(DEMO_WORKLIST, 'KRT-26-0017_table.fits'),
  join(DEMO_WORKLIST, 'KRT-26-0018.csv'),
  join(DEMO_WORKLIST, 'KRT-26-0019.fits.gz'),
  join(OPEN_SPECTRA, 'sdss/spec-0266-51602-0001.fits'),
  join(OPEN_SPECTRA, 'sdss/sample_sdss.fits'),
  join(OPEN_SPECTRA, 'other/cosmos-01-G141_20062.1D.fits'),
].map((p) => new Uint8Array(readFileSync(p)));

// Layouts without a file of their own among the seeds: an IRAF multispec image with a Chebyshev
// dispersion, an image whose first row is the wavelength, and an array table of two rows.
const SEED_PIXELS = 200;
const seedFlux = testFlux(SEED_PIXELS);
SEEDS.push(
  fitsBytes([{ cards: imageCards(-32, [SEED_PIXELS], [card('CTYPE1', 'MULTISPE'), card('WAT0_001', 'system=multispec'), card('WAT1_001', 'wtype=multispec units=angstroms'), card('WAT2_001', 'wtype=multispec spec1 = "1 1 2 4000. 2. 200 0. 1. 2. 1. 0. 1 3 1.'), card('WAT2_002', ' 200. 4200. 200. 1."')]), data: beBytes('f32', seedFlux) }]),
  fitsBytes([{ cards: imageCards(-32, [SEED_PIXELS, 3], [card('XUNITS', 'um'), card('WAVETYPE', 'vacuum')]), data: beBytes('f32', [...seedFlux.map((_, i) => 1 + 0.005 * i), ...seedFlux, ...seedFlux.map(() => 0.1)]) }]),
  fitsBytes([EMPTY_PRIMARY, binTable(SEED_PIXELS * 8, 2, [{ name: 'WAVELENGTH', form: `${SEED_PIXELS / 2}D` }, { name: 'FLUX', form: `${SEED_PIXELS / 2}D` }], concatBytes(beBytes('f64', seedFlux.map((_, i) => 6000 + i).slice(100)), beBytes('f64', seedFlux.slice(0, 100)), beBytes('f64', seedFlux.map((_, i) => 6000 + i).slice(0, 100)), beBytes('f64', seedFlux.slice(100))))]),
);

/** Header blocks from cards: END appended (or left out, to test a missing one), padded to 2880 bytes. */
function headerBytes(cards: string[], withEnd = true): Uint8Array {
  if (withEnd) return fitsBytes([{ cards }]);
  const text = cards.join('');
  return new TextEncoder().encode(text.padEnd(Math.ceil(text.length / 2880) * 2880));
}

/** Messages that mean a reader bug escaped into the catch-all, not a refused file. */
const BUG_SIGNS = /Cannot read prop|is not a function|is not iterable|undefined|Maximum call stack|Invalid array length|allocation failed/i;

interface Tally {
  cases: number;
  spectra: number;
  refused: number;
  slowestMs: number;
  slowestCase: string;
  peakRssMb: number;
}

function check(bytes: Uint8Array, label: string, tally: Tally): void {
  const t0 = performance.now();
  try {
    const s = readSpectrum(bytes, 'fuzz.fits');
    expect(s.flux.length).toBe(s.waveAngstrom.length);
    for (let i = 1; i < s.waveAngstrom.length; i++) expect(s.waveAngstrom[i] > s.waveAngstrom[i - 1]).toBe(true);
    tally.spectra++;
  } catch (e) {
    if (!(e instanceof SpectrumReadError)) throw e;
    expect(e.message.includes('\n'), e.message).toBe(false);
    expect(BUG_SIGNS.test(e.message), `${label}: ${e.message}`).toBe(false);
    tally.refused++;
  }
  const ms = performance.now() - t0;
  tally.cases++;
  if (ms > tally.slowestMs) [tally.slowestMs, tally.slowestCase] = [ms, label];
  if (tally.cases % 500 === 0) tally.peakRssMb = Math.max(tally.peakRssMb, process.memoryUsage().rss / 2 ** 20);
}

const absurdNumber = fc.oneof(
  fc.constantFrom(-1, 0, 1, 2, 2 ** 31 - 1, 2 ** 31, 2 ** 53, -(2 ** 31), 1e300, 50_000_001, 7_071, 2880),
  fc.integer({ min: -10, max: 100_000 }),
);
const bitpix = fc.oneof(fc.constantFrom(8, 16, 32, 64, -32, -64), fc.integer({ min: -128, max: 128 }));
const tform = fc.oneof(
  fc.constantFrom('1D', '1E', '1J', '1K', '1I', '1B', '1L', '8A', '1X', '4000D', '1PD(4000)', '1QD(9)', '0D', '999999999D', 'D', 'Z', '-1E', '1PE(99999999)'),
  fc.string({ maxLength: 8 }),
);

/** A FITS file: primary header with random structural cards, maybe a table extension, data. */
const structuredFits = fc
  .record({
    bitpix,
    naxis: fc.integer({ min: -1, max: 5 }),
    axes: fc.array(absurdNumber, { maxLength: 5 }),
    wcs: fc.boolean(),
    table: fc.boolean(),
    naxis1: absurdNumber,
    naxis2: absurdNumber,
    pcount: absurdNumber,
    theap: absurdNumber,
    tfields: fc.integer({ min: -1, max: 12 }),
    tforms: fc.array(tform, { maxLength: 12 }),
    names: fc.array(fc.constantFrom('loglam', 'flux', 'ivar', 'WAVE', 'wavelength', 'err', 'and_mask', 'sky', 'contam', 'sensitivity', 'x'), { maxLength: 12 }),
    dataBytes: fc.integer({ min: 0, max: 20_000 }),
    fill: fc.integer({ min: 0, max: 255 }),
  })
  .map((r) => {
    const primary = [card('SIMPLE', true), card('BITPIX', r.bitpix), card('NAXIS', r.naxis), ...r.axes.map((n, i) => card(`NAXIS${i + 1}`, n))];
    if (r.wcs) primary.push(card('CRVAL1', 3600), card('CDELT1', r.axes[0] === 0 ? 0 : 2), card('CRPIX1', 1), card('CTYPE1', 'AWAV'));
    if (r.table) primary.push(card('EXTEND', true));
    const parts = [headerBytes(primary), new Uint8Array(r.dataBytes % 6000).fill(r.fill)];
    if (r.table) {
      const ext = [card('XTENSION', 'BINTABLE'), card('BITPIX', 8), card('NAXIS', 2), card('NAXIS1', r.naxis1), card('NAXIS2', r.naxis2), card('PCOUNT', r.pcount), card('GCOUNT', 1), card('TFIELDS', r.tfields)];
      r.tforms.forEach((f, i) => ext.push(card(`TFORM${i + 1}`, f), card(`TTYPE${i + 1}`, r.names[i] ?? `c${i}`)));
      ext.push(card('THEAP', r.theap));
      parts.push(headerBytes(ext), new Uint8Array(r.dataBytes).fill(r.fill));
    }
    return { bytes: concatBytes(...parts), label: `structured ${JSON.stringify({ ...r, tforms: r.tforms.length })}` };
  });

/** Long-string headers: CONTINUE chains of any length, with or without END. */
const continueChain = fc.record({ links: fc.integer({ min: 0, max: 20_000 }), end: fc.boolean(), broken: fc.boolean() }).map((r) => {
  const cards = [card('SIMPLE', true), card('BITPIX', -32), card('NAXIS', 1), card('NAXIS1', 20), card('OBJECT', 'KRT-26-0017&')];
  for (let i = 0; i < r.links; i++) cards.push(r.broken && i % 7 === 3 ? "CONTINUE  'unterminated" : "CONTINUE  'and on and on&'");
  return { bytes: headerBytes(cards, r.end), label: `CONTINUE x${r.links} end=${r.end}` };
});

/** Real files cut short, with bytes changed, or with a header value replaced. */
const mutatedReal = fc
  .record({
    seed: fc.integer({ min: 0, max: SEEDS.length - 1 }),
    cut: fc.option(fc.double({ min: 0, max: 1, noNaN: true })),
    edits: fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.integer({ min: 0, max: 255 }), fc.boolean()), { maxLength: 8 }),
    key: fc.constantFrom('NAXIS', 'NAXIS1', 'NAXIS2', 'NAXIS3', 'BITPIX', 'PCOUNT', 'THEAP', 'TFORM1', 'TFORM2', 'TFIELDS', 'CDELT1', 'CRVAL1', 'BSCALE', 'COEFF1', 'GCOUNT', 'WAT2_001', 'WAT2_002', 'XUNITS'),
    value: fc.oneof(absurdNumber.map(String), tform.map((t) => `'${t}'`)),
  })
  .map((r) => {
    let bytes: Uint8Array = SEEDS[r.seed].slice();
    const text = new TextDecoder('latin1').decode(bytes.subarray(0, Math.min(bytes.length, 2880 * 8)));
    const at = text.search(new RegExp(`(^|[\\s\\S]{80}*?)${r.key.padEnd(8)}=`.replace('[\\s\\S]{80}*?', '')));
    if (at >= 0) {
      const cardStart = at - (at % 80);
      const replaced = `${r.key.padEnd(8)}= ${r.value.padStart(20)}`.padEnd(80).slice(0, 80);
      bytes.set(new TextEncoder().encode(replaced), cardStart);
    }
    for (const [where, byte, inHeader] of r.edits) {
      const limit = inHeader ? Math.min(bytes.length, 2880 * 4) : bytes.length;
      bytes[Math.floor(where * limit) % bytes.length] = byte;
    }
    if (r.cut !== null) bytes = bytes.subarray(0, Math.floor(bytes.length * r.cut));
    return { bytes, label: `mutated seed ${r.seed} ${r.key}=${r.value} edits=${r.edits.length} cut=${r.cut}` };
  });

/** Text tables with odd numbers, missing fields and junk. */
const textTable = fc
  .array(fc.array(fc.oneof(fc.double().map(String), fc.constantFrom('NaN', 'inf', '-', '', '1e999', 'nan', '#', ',', 'wave_A', 'flux[erg]')), { maxLength: 5 }), { maxLength: 300 })
  .chain((rows) => fc.constantFrom(',', '\t', ' ').map((sep) => ({ bytes: new TextEncoder().encode(rows.map((r) => r.join(sep)).join('\n')), label: `text ${rows.length} rows sep=${JSON.stringify(sep)}` })));

const randomBytes = fc
  .tuple(fc.constantFrom('', 'SIMPLE  = ', '\x1f\x8b', 'wave,flux\n'), fc.uint8Array({ maxLength: 6000 }))
  .map(([p, body]) => ({ bytes: concatBytes(new TextEncoder().encode(p), body), label: `random ${body.length} bytes after ${JSON.stringify(p)}` }));

describe(`readers under fuzzing (${CASES} cases)`, () => {
  it('end every case as a Spectrum or a one-line SpectrumReadError, in bounded memory', () => {
    const tally: Tally = { cases: 0, spectra: 0, refused: 0, slowestMs: 0, slowestCase: '', peakRssMb: 0 };
    const rssStartMb = process.memoryUsage().rss / 2 ** 20;
    fc.assert(
      fc.property(fc.oneof(structuredFits, mutatedReal, continueChain, textTable, randomBytes), ({ bytes, label }) => check(bytes, label, tally)),
      { numRuns: CASES, seed: 7 },
    );
    // Gzip bombs: 1 GiB of zeros in about 1 MB, and one nested inside a FITS-looking name.
    const bomb = gzipSync(Buffer.alloc(64 * 2 ** 20), { level: constants.Z_BEST_COMPRESSION });
    const repeated = concatBytes(...Array.from({ length: 16 }, () => bomb));
    check(repeated, 'gzip bomb: 16 members of 64 MiB zeros', tally);
    check(concatBytes(new Uint8Array([0x1f, 0x8b, 8, 0, 0, 0, 0, 0, 0, 3]), deflateRawSync(Buffer.alloc(300 * 2 ** 20))), 'gzip bomb: one 300 MiB member without trailer', tally);
    tally.peakRssMb = Math.max(tally.peakRssMb, process.memoryUsage().rss / 2 ** 20);
    console.log(
      `reader fuzz: ${tally.cases} cases, ${tally.spectra} read, ${tally.refused} refused; slowest ${tally.slowestMs.toFixed(1)} ms (${tally.slowestCase.slice(0, 160)}); peak RSS ${tally.peakRssMb.toFixed(0)} MB (start ${rssStartMb.toFixed(0)} MB)`,
    );
    expect(tally.cases).toBe(CASES + 2);
    expect(tally.refused).toBeGreaterThan(CASES / 2);
    // Memory stays bounded: no case may allocate anything like the sizes its header claims.
    expect(tally.peakRssMb - rssStartMb).toBeLessThan(1024);
  }, 1_800_000);
});

// The committed demo worklist is exactly what the seeded generator makes, and its FITS files
// are valid for independent tools: fitsverify (the FITS standard) and Debian's astropy.
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { gunzipSync } from 'node:zlib';
import { generateDemoWorklist } from '../../sample-spectra/generate.js';
import { vacuumToAir } from '../../core/spectrum/air-vacuum.js';
import { restLine } from '../../core/redshift/line-list.js';
import { DEMO_WORKLIST, ROOT } from '../support/paths.js';
import { astropyJson, fitsverify } from '../support/tools.js';

const demo = generateDemoWorklist();
const committed = readdirSync(DEMO_WORKLIST).filter((n) => n.startsWith('KRT-26-')).sort();
const truth = readFileSync(resolve(ROOT, 'sample-spectra/truth.csv'), 'utf8');
const fitsFiles = demo.files.map((f) => f.name).filter((n) => /\.fits(\.gz)?$/.test(n));
const broken = demo.files.map((f) => f.name).filter((n) => n.includes('truncated'));

describe('demo worklist', () => {
  it('has the generated files and no others', () => {
    expect(committed).toEqual(demo.files.map((f) => f.name).sort());
    expect(committed.length).toBeGreaterThanOrEqual(12);
    expect(broken).toHaveLength(1);
  });

  it.each(demo.files.map((f) => [f.name, f.bytes] as const))('%s is byte-identical to the generator output', (name, bytes) => {
    const onDisk = new Uint8Array(readFileSync(join(DEMO_WORKLIST, name)));
    if (name.endsWith('.gz')) {
      // Deflate output may change with the zlib build, so the gzip file is compared by its
      // content; the header's mtime is 0 (RFC 1952 §2.3.1: bytes 4–7), so no clock leaks in.
      expect(onDisk.slice(4, 8)).toEqual(new Uint8Array(4));
      expect(new Uint8Array(gunzipSync(onDisk))).toEqual(new Uint8Array(gunzipSync(bytes)));
    } else {
      expect(onDisk).toEqual(bytes);
    }
  });

  it('truth.csv is the generator output, beside the worklist folder, with the agreed columns', () => {
    expect(truth).toBe(demo.truthCsv);
    expect(truth.split('\n')[0]).toBe('file,object,class,z_true,sn_median,layout,notes');
    expect(readdirSync(DEMO_WORKLIST)).not.toContain('truth.csv');
  });

  it('the broken file really is truncated mid-data (fitsverify refuses it)', () => {
    const size = readFileSync(join(DEMO_WORKLIST, broken[0])).length;
    expect(size % 2880).not.toBe(0);
    expect(fitsverify(join(DEMO_WORKLIST, broken[0])).status).not.toBe(0);
  });

  it.each(fitsFiles.filter((n) => !broken.includes(n)))('%s passes fitsverify', (name) => {
    const { status, report } = fitsverify(join(DEMO_WORKLIST, name));
    expect(report, report).toMatch(/^verification OK/);
    expect(status).toBe(0);
  });

  it('every intact FITS file opens in astropy with the scenario metadata, and lines sit where truth.csv says', () => {
    const files = fitsFiles.filter((n) => !broken.includes(n)).map((n) => join(DEMO_WORKLIST, n));
    const got = astropyJson<Record<string, { object: string; observat: string; specsys: string; airorvac: string; dateObs: string; wave: number[]; flux: number[] }>>(
      `
import sys, json
import numpy as np
from astropy.io import fits
out = {}
for path in sys.argv[1:]:
    with fits.open(path) as h:
        p = h[0].header
        if len(h) > 1 and isinstance(h[1], fits.BinTableHDU):
            t = h[1].data
            wave, flux, air = t['WAVE'], t['FLUX'], h[1].header['AIRORVAC']
        else:
            d = h[0].data
            flux = d[0, 0] if d.ndim == 3 else d
            wave = p['CRVAL1'] + p['CDELT1'] * (np.arange(flux.size) + 1 - p['CRPIX1'])
            air = p['AIRORVAC']
        out[path.split('/')[-1]] = dict(object=p['OBJECT'], observat=p['OBSERVAT'], specsys=p['SPECSYS'],
            airorvac=air, dateObs=p['DATE-OBS'], wave=[float(x) for x in wave], flux=[float(x) for x in flux])
print(json.dumps(out))
`,
      files,
    );
    const rows = truth.trim().split('\n').slice(1).map((l) => l.split(','));
    for (const name of Object.keys(got)) {
      const g = got[name];
      const row = rows.find((r) => r[0] === name)!;
      expect(g.object).toBe(row[1]);
      expect(g.observat).toBe('Kestrel Ridge');
      expect(g.specsys).toBe('TOPOCENT');
      expect(g.airorvac).toBe('air');
      expect(g.dateObs.startsWith('2026-03-14T')).toBe(true);
      // The centroid of [O III] 5008 (continuum-subtracted flux within ±6 Å) of a star-forming
      // or AGN host lies within half a pixel (1 Å) of vacuumToAir(λ_rest·(1+z_true)).
      if (!['agn', 'star-forming'].includes(row[2]) || Number(row[4]) < 3) continue;
      const expected = vacuumToAir(restLine('[OIII]5008').waveVacuumAngstrom * (1 + Number(row[3])));
      const side = g.flux.filter((_, i) => Math.abs(g.wave[i] - expected) > 20 && Math.abs(g.wave[i] - expected) < 60).sort((a, b) => a - b);
      const continuum = side[side.length >> 1];
      let sum = 0;
      let weighted = 0;
      g.wave.forEach((w, i) => {
        if (Math.abs(w - expected) <= 6) {
          sum += g.flux[i] - continuum;
          weighted += (g.flux[i] - continuum) * w;
        }
      });
      expect(Math.abs(weighted / sum - expected), name).toBeLessThanOrEqual(1);
    }
  });
});

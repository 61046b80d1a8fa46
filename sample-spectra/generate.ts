/**
 * Makes the demo worklist: one invented night (2026-03-14 UT) on the fictional Kestrel Ridge
 * 2.4 m telescope, with the true redshift of every spectrum in truth.csv. Seeded, so the files
 * are the same on every run; `npm run demo:generate` rewrites them.
 */
import { mkdirSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { gzipSync } from 'node:zlib';
import { csvField } from '../core/catalogue/csv-field.js';
import { writeCsv, writeImageWithError, writeMultispec, writePixelTable, type ExposureRecord } from './demo/layouts.js';
import { airmass, isoUtc, localSiderealDeg, mjdFromUnixMs, SITE } from './demo/night.js';
import { NIGHT_PLAN, NIGHT_START_UTC_MS, OVERHEAD_S } from './demo/night-plan.js';
import { airGrid, nightSky, observe, telluricTransmission } from './demo/physics.js';
import { seededRandom } from './demo/random.js';
import { modelSpectrum, type Layout, type Target } from './demo/targets.js';

export const WORKLIST_FOLDER = 'kestrel-2026-03-14';
const SEED = 20_260_314;
const TRUTH_COLUMNS = ['file', 'object', 'class', 'z_true', 'sn_median', 'layout', 'notes'];

export interface DemoFile {
  name: string;
  bytes: Uint8Array;
}

function fileName(t: Target): string {
  const base = `KRT-26-${String(t.number).padStart(4, '0')}`;
  const names: Record<Layout, string> = {
    multispec: `${base}.fits`,
    'multispec-gz': `${base}.fits.gz`,
    'image-1d+error': `${base}_1d.fits`,
    table: `${base}_table.fits`,
    csv: `${base}.csv`,
    truncated: `${base}_truncated.fits`,
  };
  return names[t.layout];
}

/** Cosmic-ray hits: a few pixels far above the noise, flagged in the mask. */
function addCosmicRays(record: ExposureRecord, random: ReturnType<typeof seededRandom>, count: number): void {
  for (let k = 0; k < count; k++) {
    const i = 100 + Math.floor(random.uniform() * (record.flux.length - 200));
    record.flux[i] += 40 * record.sigma[i] * (1 + random.uniform());
    record.mask[i] = 1;
  }
}

function encode(t: Target, record: ExposureRecord): Uint8Array {
  switch (t.layout) {
    case 'multispec':
      return writeMultispec(record);
    case 'multispec-gz':
      // mtime 0 in the gzip header (zlib's default for gzipSync) keeps the bytes stable.
      return new Uint8Array(gzipSync(writeMultispec(record), { level: 9 }));
    case 'image-1d+error':
      return writeImageWithError(record);
    case 'table':
      return writePixelTable(record);
    case 'csv':
      return writeCsv(record);
    case 'truncated': {
      const whole = writeMultispec(record);
      return whole.slice(0, Math.round(whole.length * 0.55));
    }
  }
}

export function generateDemoWorklist(): { files: DemoFile[]; truthCsv: string } {
  const grid = airGrid();
  const files: DemoFile[] = [];
  const truth = [TRUTH_COLUMNS.join(',')];
  let startMs = NIGHT_START_UTC_MS;
  for (const t of NIGHT_PLAN) {
    const random = seededRandom(SEED + t.number);
    const midMjd = mjdFromUnixMs(startMs + (t.exptimeS * 1000) / 2);
    const raDeg = (((localSiderealDeg(midMjd, SITE.longitudeDeg) - t.hourAngleH * 15) % 360) + 360) % 360;
    const x = airmass(t.hourAngleH * 15, t.decDeg, SITE.latitudeDeg);
    const atmosphere = telluricTransmission(grid, x);
    const model = modelSpectrum(t, grid).map((f, i) => f * atmosphere[i]);
    const exposure = observe(model, nightSky(grid, 1 + 0.3 * random.uniform()), grid, t.targetSn, random);
    const record: ExposureRecord = {
      object: `KRT-26-${String(t.number).padStart(4, '0')}`,
      raDeg,
      decDeg: t.decDeg,
      dateObs: isoUtc(startMs),
      mjdObs: mjdFromUnixMs(startMs),
      exptimeS: t.exptimeS,
      airmass: x,
      grid,
      flux: exposure.flux,
      sigma: exposure.sigma,
      sky: exposure.sky,
      mask: new Uint8Array(grid.length),
    };
    if (t.layout === 'table') addCosmicRays(record, random, 2);
    const name = fileName(t);
    files.push({ name, bytes: encode(t, record) });
    const zTrue = t.layout === 'truncated' ? '' : t.z.toFixed(5);
    const sn = t.layout === 'truncated' ? '' : exposure.snMedian.toFixed(1);
    const notes = t.layout === 'truncated' ? `${t.notes} (made from a ${t.hostClass} host at z=${t.z.toFixed(5)})` : t.notes;
    truth.push([name, record.object, t.hostClass, zTrue, sn, t.layout, notes].map((field) => csvField(field)).join(','));
    startMs += (t.exptimeS + OVERHEAD_S) * 1000;
  }
  return { files, truthCsv: `${truth.join('\n')}\n` };
}

/** Writes the worklist folder and truth.csv beside it, replacing earlier demo spectra. */
function main(): void {
  const here = join(dirname(fileURLToPath(import.meta.url)), '..', 'sample-spectra');
  const folder = join(here, WORKLIST_FOLDER);
  mkdirSync(folder, { recursive: true });
  for (const old of readdirSync(folder)) if (old.startsWith('KRT-26-')) rmSync(join(folder, old));
  const { files, truthCsv } = generateDemoWorklist();
  for (const f of files) writeFileSync(join(folder, f.name), f.bytes);
  writeFileSync(join(here, 'truth.csv'), truthCsv);
  process.stdout.write(`wrote ${files.length} spectra to ${folder} and truth.csv\n`);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) main();

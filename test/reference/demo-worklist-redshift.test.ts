// The invented demo night: the engine must recover the seeded true z (sample-spectra/truth.csv,
// written by the generating script) within 3σ for every spectrum but the hopeless one, which
// must come back 'none', and the damaged file must be an error.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { measureRedshift } from '../../core/redshift/measure.js';
import { readSpectrumFile } from '../../core/node/read-spectrum-file.js';
import { DEMO_WORKLIST } from '../support/paths.js';

const truth = readFileSync(resolve(DEMO_WORKLIST, '../truth.csv'), 'utf8')
  .trim()
  .split('\n')
  .slice(1)
  .map((line) => {
    const [file, , cls, z] = line.split(',');
    return { file, cls, z: z === '' ? null : Number(z), hopeless: /hopeless/.test(line) };
  });

describe('demo worklist redshifts', () => {
  it('recovers the true z within 3σ, says none for the hopeless one', async () => {
    expect(truth.length).toBeGreaterThanOrEqual(12);
    const misses: string[] = [];
    for (const t of truth.filter((x) => x.z !== null)) {
      const m = measureRedshift(await readSpectrumFile(join(DEMO_WORKLIST, t.file)));
      if (t.hopeless) {
        expect(m.confidence).toBe('none');
        continue;
      }
      const pull = (m.best!.z - t.z!) / m.best!.zErr;
      if (!(Math.abs(pull) <= 3)) misses.push(`${t.file}: z ${m.best?.z} ± ${m.best?.zErr} vs ${t.z} (${pull.toFixed(1)}σ)`);
    }
    expect(misses).toEqual([]);
  }, 60_000);

  it('calls the passive hosts with clear absorption features secure', async () => {
    // KRT-26-0012 (S/N 14) and KRT-26-0020 (S/N 35): truth.csv says passive, all features in range.
    for (const file of ['KRT-26-0012.fits', 'KRT-26-0020.fits']) {
      const t = truth.find((x) => x.file === file)!;
      const m = measureRedshift(await readSpectrumFile(join(DEMO_WORKLIST, file)));
      expect(t.cls).toBe('passive');
      expect(Math.abs(m.best!.z - t.z!) / m.best!.zErr).toBeLessThanOrEqual(3);
      expect(m.confidence).toBe('secure');
    }
  });
});

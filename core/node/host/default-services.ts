/** The real modules behind the handlers (see services.ts). */
import { exportCatalogue } from '../export-catalogue.js';
import { MeasurePool } from '../measure-pool.js';
import { Worklist } from '../worklist.js';
import type { HostServices } from './services.js';

export function defaultServices(): HostServices {
  // Started on the first measurement, so opening settings alone spawns no threads.
  let pool: MeasurePool | null = null;
  return {
    openWorklist: (target) => Worklist.open(target),
    measureFile: async (path, options) => {
      pool ??= new MeasurePool();
      const r = await pool.measureFile(path, { ...options, includeSpectrum: true });
      return { hdu: r.hdu, error: r.error, measurement: r.measurement, spectrum: r.spectrum ?? null };
    },
    writeCatalogue: async (worklist, format, path, options) => (await exportCatalogue(worklist, format, path, options)).rows,
    close: async () => {
      await pool?.close();
      pool = null;
    },
  };
}

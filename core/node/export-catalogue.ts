/**
 * Exports a worklist's catalogue: reads each spectrum's metadata (a file that cannot be read
 * still gets its row, with the reason), joins the verdicts in force, serialises and writes the
 * file atomically. Used by `zvet export` and by the window's export.
 */
import { buildCatalogue, type CatalogueColumn, CATALOGUE_COLUMNS, type CatalogueSource } from '../catalogue/catalogue.js';
import { serialiseTable, type CatalogueFormat } from '../catalogue/export.js';
import { SpectrumReadError } from '../spectrum/spectrum.js';
import { writeFileAtomic } from './atomic-write.js';
import { readSpectrumFile } from './read-spectrum-file.js';
import type { Worklist } from './worklist.js';

export interface CatalogueExport {
  path: string;
  rows: number;
  vetted: number;
  pending: number;
  unreadable: number;
}

export interface ExportOptions {
  /** Export time written into the file, UTC ISO 8601 (default: now). */
  exportedUtc?: string;
  columns?: readonly CatalogueColumn[];
}

export const EXPORT_CAVEAT = 'z is the vetted redshift only where status is accepted or revised; pending rows carry no redshift';

async function sourceOf(worklist: Worklist, spectrum: string, absPath: string): Promise<CatalogueSource> {
  const verdict = worklist.journal.current().get(spectrum) ?? null;
  try {
    const s = await readSpectrumFile(absPath, verdict?.hdu != null ? { hdu: verdict.hdu } : undefined);
    return { spectrum, verdict, meta: s.meta, hdu: s.provenance.hdu, readProblem: null };
  } catch (err) {
    if (!(err instanceof SpectrumReadError)) throw err;
    return { spectrum, verdict, meta: null, hdu: null, readProblem: err.reason };
  }
}

export async function exportCatalogue(worklist: Worklist, format: CatalogueFormat, outPath: string, options: ExportOptions = {}): Promise<CatalogueExport> {
  const sources: CatalogueSource[] = [];
  for (const e of worklist.entries) sources.push(await sourceOf(worklist, e.spectrum, e.absPath));
  const meta = {
    worklist: worklist.name,
    exported: options.exportedUtc ?? new Date().toISOString(),
    software: 'zvet 0.1.0',
    caveat: EXPORT_CAVEAT,
  };
  const table = buildCatalogue(sources, meta, options.columns ?? CATALOGUE_COLUMNS);
  await writeFileAtomic(outPath, serialiseTable(table, format));
  const vetted = sources.filter((s) => s.verdict && s.verdict.status !== 'pending').length;
  return {
    path: outPath,
    rows: sources.length,
    vetted,
    pending: sources.length - vetted,
    unreadable: sources.filter((s) => s.readProblem !== null).length,
  };
}

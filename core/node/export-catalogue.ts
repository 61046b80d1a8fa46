/**
 * Exports a worklist's catalogue: reads each spectrum's metadata (a file that cannot be read
 * still gets its row, with the reason), joins the verdicts in force, serialises and writes the
 * file atomically. Used by `zvet export` and by the window's export.
 */
import { COSMOLOGY_PRESETS } from '../astro/cosmology.js';
import { buildCatalogue, type CatalogueColumn, CATALOGUE_COLUMNS, type CatalogueSource } from '../catalogue/catalogue.js';
import { DERIVED_CATALOGUE_COLUMNS, DERIVED_COMMENTS, deriveForCatalogue, derivedMeta, type DeriveOptions } from '../catalogue/derived-columns.js';
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
  /** Spectra whose file could not be read (their rows give the reason). */
  unreadableSpectra: string[];
  /** Spectra the journal has a verdict for that are no longer in the worklist (no row). */
  notInWorklist: string[];
}

export interface ExportOptions {
  /** Export time written into the file, UTC ISO 8601 (default: now). */
  exportedUtc?: string;
  columns?: readonly CatalogueColumn[];
  /** Cosmology for the distances and SFRs (default Planck 2018). */
  cosmology?: DeriveOptions['cosmology'];
  /** Site for files whose header gives none. */
  site?: DeriveOptions['site'];
}

/** The catalogue's columns: the verdict and file metadata, then what is derived from the vetted z. */
export const EXPORT_COLUMNS: readonly CatalogueColumn[] = [...CATALOGUE_COLUMNS, ...DERIVED_CATALOGUE_COLUMNS];

export const EXPORT_CAVEAT = 'z is the vetted redshift only where status is accepted or revised; pending rows carry no redshift';

async function sourceOf(worklist: Worklist, spectrum: string, absPath: string, derive: DeriveOptions): Promise<CatalogueSource> {
  const verdict = worklist.journal.current().get(spectrum) ?? null;
  try {
    // Read as when it was vetted: the verdict's z holds for the HDU and the medium it names.
    const s = await readSpectrumFile(absPath, { ...(verdict?.hdu != null ? { hdu: verdict.hdu } : {}), ...(verdict?.medium ? { medium: verdict.medium } : {}) });
    return { spectrum, verdict, meta: s.meta, hdu: s.provenance.hdu, medium: s.provenance.medium, readProblem: null, derived: deriveForCatalogue(verdict, s, derive) };
  } catch (err) {
    if (!(err instanceof SpectrumReadError)) throw err;
    return { spectrum, verdict, meta: null, hdu: null, readProblem: err.reason };
  }
}

export async function exportCatalogue(worklist: Worklist, format: CatalogueFormat, outPath: string, options: ExportOptions = {}): Promise<CatalogueExport> {
  const derive: DeriveOptions = { cosmology: options.cosmology ?? COSMOLOGY_PRESETS.planck18, site: options.site };
  const sources: CatalogueSource[] = [];
  for (const e of worklist.entries) sources.push(await sourceOf(worklist, e.spectrum, e.absPath, derive));
  const meta = {
    worklist: worklist.name,
    exported: options.exportedUtc ?? new Date().toISOString(),
    software: 'zvet 0.1.0',
    caveat: EXPORT_CAVEAT,
    ...derivedMeta(derive),
  };
  const table = { ...buildCatalogue(sources, meta, options.columns ?? EXPORT_COLUMNS), comments: [...DERIVED_COMMENTS] };
  await writeFileAtomic(outPath, serialiseTable(table, format));
  const vetted = sources.filter((s) => s.verdict && s.verdict.status !== 'pending').length;
  const unreadableSpectra = sources.filter((s) => s.readProblem !== null).map((s) => s.spectrum);
  const listed = new Set(sources.map((s) => s.spectrum));
  const notInWorklist = [...worklist.journal.current()].filter(([spectrum, v]) => !listed.has(spectrum) && v.status !== 'pending').map(([spectrum]) => spectrum);
  return {
    path: outPath,
    rows: sources.length,
    vetted,
    pending: sources.length - vetted,
    unreadable: unreadableSpectra.length,
    unreadableSpectra,
    notInWorklist,
  };
}

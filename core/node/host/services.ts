/**
 * The file and thread work the handlers need, in one place: opening a worklist with its
 * journal, measuring a file in the worker pool, writing the catalogue. The default wiring
 * (default-services.ts) uses the real modules; tests may swap a piece, for instance a journal
 * whose disk is full.
 */
import type { ExportFormat } from '../../api/host-api.js';
import type { MeasureOptions, Measurement } from '../../redshift/types.js';
import type { Spectrum, WavelengthMedium } from '../../spectrum/spectrum.js';
import type { ExportOptions } from '../export-catalogue.js';
import type { Worklist } from '../worklist.js';

export interface MeasuredFile {
  hdu: number | null;
  /** One-line reason when the file could not be read or measured. */
  error: string | null;
  measurement: Measurement | null;
  spectrum: Spectrum | null;
}

export interface HostServices {
  openWorklist(target: string | string[]): Promise<Worklist>;
  measureFile(path: string, options: MeasureOptions & { medium?: WavelengthMedium }): Promise<MeasuredFile>;
  /** Builds the catalogue from the verdicts in force and writes it atomically; returns the row count. */
  writeCatalogue(worklist: Worklist, format: ExportFormat, path: string, options: Pick<ExportOptions, 'cosmology' | 'site'>): Promise<number>;
  close(): Promise<void>;
}

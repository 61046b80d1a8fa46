/**
 * The file and thread work the handlers need, in one place: opening a worklist with its
 * journal, measuring a file in the worker pool, writing the catalogue. The default wiring uses the real modules; tests may swap one piece (for instance a
 * journal whose disk is full). A piece not yet in this build is null, and the calls that need it
 * answer with a HostError saying so.
 */
import type { ExportFormat } from '../../api/host-api.js';
import type { Verdict } from '../../catalogue/verdict.js';
import type { MeasureOptions, Measurement } from '../../redshift/types.js';
import type { Spectrum } from '../../spectrum/spectrum.js';

export interface JournalPort {
  /** The verdict in force per spectrum id. */
  current(): ReadonlyMap<string, Verdict>;
  /** Appends one verdict; resolves only once it is on disk (fsync'd). */
  append(verdict: Verdict): Promise<void>;
  /** Withdraws the last verdict in force; resolves with the verdict now in force for its spectrum. */
  undo(): Promise<Verdict | null>;
  readonly warnings: readonly string[];
}

export interface OpenedWorklist {
  root: string;
  name: string;
  journalPath: string;
  entries: { spectrum: string; absPath: string }[];
  journal: JournalPort;
}

export interface MeasuredFile {
  hdu: number | null;
  /** One-line reason when the file could not be read or measured. */
  error: string | null;
  measurement: Measurement | null;
  spectrum: Spectrum | null;
}

export interface HostServices {
  openWorklist: ((target: string | string[]) => Promise<OpenedWorklist>) | null;
  measureFile: ((path: string, options: MeasureOptions) => Promise<MeasuredFile>) | null;
  /** Builds the catalogue from the verdicts in force and writes it atomically; returns the row count. */
  writeCatalogue: ((worklist: OpenedWorklist, format: ExportFormat, path: string) => Promise<number>) | null;
  close(): Promise<void>;
}

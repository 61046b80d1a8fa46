/**
 * What the handlers need from the rest of zvet, in one place: opening a worklist with its
 * journal, measuring a file in the worker pool, the template model, frames, host lines and the
 * catalogue. The default wiring uses the real modules; tests may swap one piece (for instance a
 * journal whose disk is full). A piece not yet in this build is null, and the calls that need it
 * answer with a HostError saying so.
 */
import type { ExportFormat } from '../../api/host-api.js';
import type { FrameResult } from '../../astro/frames.js';
import type { Verdict } from '../../catalogue/verdict.js';
import type { HostAnalysis } from '../../hosts/analyse.js';
import type { MeasureOptions, Measurement } from '../../redshift/types.js';
import type { Site, Spectrum } from '../../spectrum/spectrum.js';

export interface JournalPort {
  /** The verdict in force per spectrum id. */
  current(): ReadonlyMap<string, Verdict>;
  /** Appends one verdict; resolves only once it is on disk (fsync'd). */
  append(verdict: Verdict): Promise<void>;
  /** Withdraws the last verdict; resolves with the spectrum id it was about, or null. */
  undo(): Promise<string | null>;
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

export interface FrameRequest {
  spectrum: Spectrum;
  z: number;
  zErr: number | null;
  site: Site | null;
  cosmology: { h0: number; omegaM: number; omegaL: number; name: string };
}

export interface HostServices {
  openWorklist: ((target: string | string[]) => Promise<OpenedWorklist>) | null;
  measureFile: ((path: string, options: MeasureOptions) => Promise<MeasuredFile>) | null;
  templateModelFlux: ((template: string, z: number, spectrum: Spectrum) => Float64Array) | null;
  correctFrames: ((req: FrameRequest) => FrameResult) | null;
  analyseHost: ((spectrum: Spectrum, z: number) => HostAnalysis) | null;
  /** Builds the catalogue from the verdicts in force and writes it atomically; returns the row count. */
  writeCatalogue: ((worklist: OpenedWorklist, format: ExportFormat, path: string) => Promise<number>) | null;
  close(): Promise<void>;
}

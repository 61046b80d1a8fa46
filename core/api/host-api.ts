/**
 * The one interface between the window (renderer/) and its host (Electron main process or the
 * loopback HTTP server of browser mode). Both transports carry exactly these calls, as JSON:
 * method name + one request object → one response object. Handlers live in one place
 * (core/node/host/handlers.ts); the transports hold no logic.
 *
 * Arrays of numbers travel as plain number[]; NaN and ±Infinity travel as null.
 *
 * How each transport carries a call (both behave alike for the window):
 * - Electron: `window.zvetHost.<method>(request)` resolves with the response, or rejects with a
 *   HostError value (a plain object { error, status }, not an Error instance).
 * - Browser mode: `POST /api/<method>` with the request as the JSON body and the header
 *   `Content-Type: application/json` (anything else is refused with 415). Status 200 carries the
 *   response as JSON; any other status carries a HostError as JSON. The page is let in by the
 *   HttpOnly cookie the server sets when index.html is opened with the right ?token=, so a
 *   same-origin fetch needs no extra header (`X-Zvet-Token` works too, for scripts).
 * - Statuses: 400 request of the wrong shape (the error names the field), 404 unknown method or
 *   an id that is not in the open worklist, 409 no worklist open, 413 body over 1 MiB,
 *   422 the file cannot be read or measured, 503 the disk refused a write (the verdict stays
 *   queued in memory and is retried on the next save), 500 anything unexpected.
 */
import type { Verdict } from '../catalogue/verdict.js';
import type { Measurement } from '../redshift/types.js';
import type { FrameResult } from '../astro/frames.js';
import type { HostAnalysis } from '../hosts/analyse.js';

/** Options the user can change before re-measuring one spectrum. */
export interface RemeasureOptions {
  zmin?: number;
  zmax?: number;
  /** Template names to use; all defaults when absent. */
  templates?: string[];
  maskTelluric?: boolean;
  maskSky?: boolean;
  /** Read the file's wavelengths as air or vacuum, whatever the file says; as the file says when absent. */
  medium?: 'air' | 'vacuum';
}

export interface SpectrumListItem {
  /** Path relative to the worklist root, '/'-separated; the id used by every other call. */
  id: string;
  /** The verdict in force, or null when none was saved yet (pending). */
  verdict: Verdict | null;
  /** The automatic best candidate once measured (a suggestion until vetted). */
  suggestion: { z: number; zErr: number; confidence: Measurement['confidence']; template: string } | null;
  /** One-line reason when the file cannot be read or measured. */
  error: string | null;
  /** Changes when the file is rewritten (modification time and size); null when it cannot be looked at. */
  fileVersion: string | null;
}

export interface WorklistState {
  root: string;
  name: string;
  journalPath: string;
  items: SpectrumListItem[];
  /** Problems met while reopening (e.g. a torn last journal line), to show the user. */
  warnings: string[];
}

export interface SpectrumArrays {
  waveAngstrom: (number | null)[];
  flux: (number | null)[];
  error: (number | null)[];
  mask: number[];
  sky: (number | null)[] | null;
}

export interface SpectrumMetaView {
  fileName: string;
  format: string;
  hdu: number | null;
  fluxUnit: string;
  object: string | null;
  raDeg: number | null;
  decDeg: number | null;
  dateObsUtc: string | null;
  mjdObs: number | null;
  exposureS: number | null;
  mediumInFile: 'air' | 'vacuum';
  mediumReason: string;
  mediumSource: 'file' | 'assumed' | 'user';
  /** The wavelength unit guessed from the values with a doubt (e.g. nm or Å), else null. */
  waveUnitDoubt: string | null;
  velocityFrame: string;
  velocityFrameReason: string;
  site: { name?: string; latitudeDeg?: number; longitudeDeg?: number; heightM?: number } | null;
}

export interface SpectrumView {
  id: string;
  /** Null when the file cannot be read; `error` then says why. */
  arrays: SpectrumArrays | null;
  meta: SpectrumMetaView | null;
  measurement: Measurement | null;
  /** Best template model on the spectrum's pixels (for the overlay), when measured. */
  templateModel: { template: string; z: number; flux: (number | null)[] } | null;
  verdict: Verdict | null;
  error: string | null;
  /** The options this view was read and measured with (the defaults are absent). */
  measuredWith: RemeasureOptions;
}

/**
 * What the window sends to save a decision: the verdict's own fields, with the spectrum named by
 * its worklist id; the host fills in the HDU and stamps time and user.
 */
export type VerdictInput = Omit<Verdict, 'spectrum' | 'hdu' | 'time' | 'user'> & { id: string };

export interface SiteSetting {
  name: string;
  latitudeDeg: number;
  longitudeDeg: number;
  heightM: number;
}

export interface Settings {
  recentWorklists: string[];
  sites: SiteSetting[];
  /** Name of a cosmology preset, or 'custom' with the values below. */
  cosmologyPreset: string;
  customCosmology: { h0: number; omegaM: number; omegaL: number } | null;
  user: string;
}

export type ExportFormat = 'csv' | 'ecsv' | 'fits';

/** Every call the window can make, with its request and response types. */
export interface HostApi {
  openWorklist(req: { path: string } | { files: string[] }): Promise<WorklistState>;
  listSpectra(req: Record<string, never>): Promise<WorklistState>;
  loadSpectrum(req: { id: string }): Promise<SpectrumView>;
  remeasure(req: { id: string; options: RemeasureOptions }): Promise<SpectrumView>;
  templateModel(req: { id: string; template: string; z: number }): Promise<{ flux: (number | null)[] }>;
  /** Frame-corrected z, velocities and distances at a trial z (live as z changes). */
  derived(req: { id: string; z: number; zErr: number | null }): Promise<FrameResult>;
  /** Host-galaxy lines, BPT class, Balmer decrement and SFR at a trial z. */
  hostAnalysis(req: { id: string; z: number }): Promise<HostAnalysis>;
  saveVerdict(req: VerdictInput): Promise<{ verdict: Verdict }>;
  undoLast(req: Record<string, never>): Promise<{ id: string | null; verdict: Verdict | null }>;
  exportCatalogue(req: { format: ExportFormat; path?: string }): Promise<{ path: string; rows: number }>;
  getSettings(req: Record<string, never>): Promise<Settings>;
  putSettings(req: Partial<Settings>): Promise<Settings>;
}

export type HostMethod = keyof HostApi;

export const HOST_METHODS: readonly HostMethod[] = [
  'openWorklist',
  'listSpectra',
  'loadSpectrum',
  'remeasure',
  'templateModel',
  'derived',
  'hostAnalysis',
  'saveVerdict',
  'undoLast',
  'exportCatalogue',
  'getSettings',
  'putSettings',
];

/** Error a host call returns instead of a result: one line for the user, plus an HTTP-like code. */
export interface HostError {
  error: string;
  status: number;
}

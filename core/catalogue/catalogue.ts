/**
 * The catalogue: one row per spectrum of the worklist (pending ones included), built from a
 * list of column definitions. Later steps add columns (frame-corrected z, distances, host
 * diagnostics) by appending definitions to CATALOGUE_COLUMNS or passing their own list.
 */
import type { FrameResult } from '../astro/frames.js';
import type { SpectrumMeta, WavelengthMedium } from '../spectrum/spectrum.js';
import type { HostSummary } from './host-fields.js';
import type { Cell, ColumnSpec, Table } from './table.js';
import type { Verdict } from './verdict.js';

/** Everything known about one spectrum when the catalogue is made. */
export interface CatalogueSource {
  /** Path relative to the worklist root, '/'-separated. */
  spectrum: string;
  /** The verdict in force, or null (pending). */
  verdict: Verdict | null;
  /** Metadata read from the file, or null when it could not be read. */
  meta: SpectrumMeta | null;
  /** HDU the reader used (null for text files or unreadable files). */
  hdu: number | null;
  /** Medium the file's wavelengths were read in (the verdict's, when the user set one), or null when the file could not be read. */
  medium?: WavelengthMedium | null;
  /** One-line reason the file could not be read, or null. */
  readProblem: string | null;
  /** What was derived from the verdict's z (derived-columns.ts); absent or null = nothing. */
  derived?: CatalogueDerived | null;
}

/** Frame-corrected z and distances, and host diagnostics, at a vetted z; null where not computed. */
export interface CatalogueDerived {
  frames: FrameResult | null;
  /** Why the frames could not be computed, or null. */
  framesProblem: string | null;
  host: HostSummary | null;
  /** Why the host lines could not be measured, or null. */
  hostProblem: string | null;
}

export interface CatalogueColumn extends ColumnSpec {
  value(source: CatalogueSource): Cell;
}

const orNull = <T>(x: T | undefined): T | null => (x === undefined ? null : x);

export const CATALOGUE_COLUMNS: readonly CatalogueColumn[] = [
  { name: 'spectrum', unit: null, type: 'string', description: 'spectrum file, relative to the worklist folder', value: (s) => s.spectrum },
  { name: 'hdu', unit: null, type: 'int64', description: 'HDU of the spectrum in the file (0 = primary; empty for text)', value: (s) => (s.verdict ? s.verdict.hdu : s.hdu) },
  { name: 'object', unit: null, type: 'string', description: 'object name from the file', value: (s) => orNull(s.meta?.object) },
  { name: 'ra_deg', unit: 'deg', type: 'float64', description: 'right ascension from the file', value: (s) => orNull(s.meta?.raDeg) },
  { name: 'dec_deg', unit: 'deg', type: 'float64', description: 'declination from the file', value: (s) => orNull(s.meta?.decDeg) },
  { name: 'date_obs', unit: null, type: 'string', description: 'start of the observation, UTC ISO 8601', value: (s) => orNull(s.meta?.dateObsUtc) },
  { name: 'mjd_obs', unit: 'd', type: 'float64', description: 'start of the observation, MJD (UTC)', value: (s) => orNull(s.meta?.mjdObs) },
  { name: 'exptime_s', unit: 's', type: 'float64', description: 'exposure time', value: (s) => orNull(s.meta?.exposureS) },
  { name: 'status', unit: null, type: 'string', description: 'verdict: accepted, revised, no-redshift or pending (automatic redshifts are suggestions until vetted)', value: (s) => s.verdict?.status ?? 'pending' },
  { name: 'z', unit: null, type: 'float64', description: 'redshift measured on the file wavelengths (vacuum), in the frame given by z_frame', value: (s) => s.verdict?.z ?? null },
  { name: 'z_err', unit: null, type: 'float64', description: '1-sigma uncertainty of z', value: (s) => s.verdict?.zErr ?? null },
  { name: 'z_frame', unit: null, type: 'string', description: 'frame of the file wavelengths: topocentric, heliocentric, barycentric or unknown', value: (s) => orNull(s.meta?.velocityFrame) },
  { name: 'medium_in_file', unit: null, type: 'string', description: 'medium the file wavelengths were read in: air (converted to vacuum) or vacuum', value: (s) => s.medium ?? null },
  { name: 'confidence', unit: null, type: 'string', description: 'confidence of the verdict: secure, likely or tentative', value: (s) => s.verdict?.confidence ?? null },
  { name: 'class', unit: null, type: 'string', description: 'object class: galaxy, agn, qso, star or unknown', value: (s) => s.verdict?.objectClass ?? null },
  { name: 'template', unit: null, type: 'string', description: 'template of the chosen candidate', value: (s) => s.verdict?.template ?? null },
  { name: 'note', unit: null, type: 'string', description: 'free-text note of the verdict', value: (s) => s.verdict?.note ?? null },
  { name: 'vetted_by', unit: null, type: 'string', description: 'who made the verdict', value: (s) => s.verdict?.user ?? null },
  { name: 'vetted_utc', unit: null, type: 'string', description: 'when the verdict was made, UTC ISO 8601', value: (s) => s.verdict?.time ?? null },
  { name: 'read_problem', unit: null, type: 'string', description: 'why the file could not be read (empty when it was read)', value: (s) => s.readProblem },
];

/** The catalogue table: one row per source, in the order given. */
export function buildCatalogue(sources: readonly CatalogueSource[], meta: Record<string, string>, columns: readonly CatalogueColumn[] = CATALOGUE_COLUMNS): Table {
  return {
    columns: columns.map(({ name, unit, type, description }) => ({ name, unit, type, description })),
    rows: sources.map((s) => columns.map((c) => c.value(s))),
    meta,
  };
}

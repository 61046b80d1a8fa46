/**
 * Columns appended to `zvet measure` rows: the best candidate's z in the barycentric (or
 * heliocentric) and CMB frames with the distances it implies, and, with --lines, the host
 * diagnostics the worker measured at that z. Rows without a best candidate get empty cells, and
 * a best candidate of the star template no distances.
 */
import type { CosmologyModel } from '../astro/cosmology.js';
import { correctFrames, type FrameResult } from '../astro/frames.js';
import type { MeasureColumn, MeasureRowInput } from '../redshift/measure-columns.js';
import type { Site, SpectrumMeta, WavelengthMedium } from '../spectrum/spectrum.js';
import { cosmologyParameters, DISTANCE_FIELDS, FRAME_FIELDS, type Field } from './frame-fields.js';
import { HOST_CLASS_FIELDS, HOST_DUST_SFR_FIELDS, HOST_FILE_FLUX_FIELDS, type HostSummary } from './host-fields.js';

/** What a measuring worker returns besides the measurement. */
export interface MeasureRowExtras {
  /** The spectrum's metadata (time, target, site, velocity frame): what the frames need. */
  meta?: SpectrumMeta | null;
  /** Whether the file's wavelengths were read as air or vacuum, and what decided it. */
  medium?: { inFile: WavelengthMedium; reason: string } | null;
  /** Host diagnostics at the best z, when asked for and computable. */
  lines?: HostSummary | null;
  /** Why `lines` is missing, when it was asked for. */
  linesNote?: string | null;
}

export type MeasureRow = MeasureRowInput & MeasureRowExtras;

function isStar(row: MeasureRow): boolean {
  return row.measurement?.best?.templateClass === 'star';
}

/** Frame correction of the best candidate's z, or a one-line reason there is none. */
function framesOfRow(row: MeasureRow, site: Site | undefined, cosmology: CosmologyModel): FrameResult | string {
  const best = row.measurement?.best;
  if (row.status !== 'ok' || !best) return 'no redshift to correct';
  if (!row.meta) return 'not corrected: the file metadata was not returned';
  try {
    // A star's redshift is its own motion, not a distance (as in the catalogue).
    return correctFrames({ zObs: best.z, zErr: best.zErr, meta: row.meta, site, cosmology: isStar(row) ? undefined : cosmology });
  } catch (err) {
    return `not corrected: ${(err as Error).message}`;
  }
}

/**
 * How the file's wavelengths were read: air ones are converted to vacuum before measuring, so an
 * assumed medium that is wrong shifts z by about 83 km/s (Hα: 6562.80 Å in air, 6564.61 Å in vacuum).
 */
export const MEASURE_MEDIUM_COLUMNS: readonly MeasureColumn[] = [
  { key: 'medium_in_file', value: (row: MeasureRow) => row.medium?.inFile ?? null },
  { key: 'medium_reason', value: (row: MeasureRow) => row.medium?.reason ?? null },
];

export function measureFrameColumns(options: { site?: Site; cosmology: CosmologyModel }): MeasureColumn[] {
  const memo = new WeakMap<MeasureRow, FrameResult | string>();
  const framesOf = (row: MeasureRow): FrameResult | string => {
    let f = memo.get(row);
    if (f === undefined) memo.set(row, (f = framesOfRow(row, options.site, options.cosmology)));
    return f;
  };
  const column = (field: Field<FrameResult>): MeasureColumn => ({
    key: field.name,
    value: (row: MeasureRow) => {
      const f = framesOf(row);
      if (typeof f !== 'string') return field.pick(f) as string | number | null;
      return field.name === 'frame_reason' && row.measurement?.best ? f : null;
    },
  });
  const model = cosmologyParameters(options.cosmology);
  return [
    ...FRAME_FIELDS.map(column),
    ...DISTANCE_FIELDS.map(column),
    { key: 'cosmology', value: (row: MeasureRow) => (typeof framesOf(row) === 'string' || isStar(row) ? null : model) },
  ];
}

const lineColumn = (field: Field<HostSummary>): MeasureColumn => ({
  key: field.name,
  value: (row: MeasureRow) => (row.lines ? (field.pick(row.lines) as string | number | null) : null),
});

export const MEASURE_LINE_COLUMNS: readonly MeasureColumn[] = [
  ...HOST_FILE_FLUX_FIELDS.map(lineColumn),
  ...HOST_CLASS_FIELDS.map(lineColumn),
  ...HOST_DUST_SFR_FIELDS.map(lineColumn),
  { key: 'sfr_caveat', value: (row: MeasureRow) => (row.lines?.sfrK98MsunYr != null ? row.lines.sfrCaveat : null) },
  { key: 'lines_note', value: (row: MeasureRow) => row.linesNote ?? null },
];

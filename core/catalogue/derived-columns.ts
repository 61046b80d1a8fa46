/**
 * What the catalogue derives from each verdict's z: the frame-corrected z and the distances
 * (core/astro/frames.ts) and, for a galaxy or AGN, the host diagnostics at that z
 * (core/hosts/analyse.ts), as appendable catalogue columns. Pending and no-redshift rows get
 * nothing derived, so their cells stay empty.
 */
import type { CosmologyModel } from '../astro/cosmology.js';
import { correctFrames, type FrameResult } from '../astro/frames.js';
import { analyseHost } from '../hosts/analyse.js';
import { APERTURE_CAVEAT } from '../hosts/sfr.js';
import type { Site, Spectrum } from '../spectrum/spectrum.js';
import type { CatalogueColumn, CatalogueDerived, CatalogueSource } from './catalogue.js';
import { cosmologyParameters, DISTANCE_FIELDS, FRAME_FIELDS, type Field } from './frame-fields.js';
import { HOST_CGS_FLUX_FIELDS, HOST_CLASS_FIELDS, HOST_DUST_SFR_FIELDS, summariseHost, type HostSummary } from './host-fields.js';
import type { Verdict } from './verdict.js';

export interface DeriveOptions {
  cosmology: CosmologyModel;
  /** Site for files whose header gives none. */
  site?: Site;
}

const HOST_CLASSES = new Set(['galaxy', 'agn']);

/** The verdict's z when it is a vetted redshift (accepted or revised), else null. */
function vettedZ(verdict: Verdict | null): number | null {
  if (!verdict || (verdict.status !== 'accepted' && verdict.status !== 'revised')) return null;
  return verdict.z !== null && Number.isFinite(verdict.z) && verdict.z > -1 ? verdict.z : null;
}

export function deriveForCatalogue(verdict: Verdict | null, spectrum: Spectrum, options: DeriveOptions): CatalogueDerived {
  const z = vettedZ(verdict);
  if (z === null) return { frames: null, framesProblem: null, host: null, hostProblem: null };
  let frames: FrameResult | null = null;
  let framesProblem: string | null = null;
  try {
    // A star's redshift is its own motion, not a distance.
    const cosmology = verdict!.objectClass === 'star' ? undefined : options.cosmology;
    frames = correctFrames({ zObs: z, zErr: verdict!.zErr ?? undefined, meta: spectrum.meta, site: options.site, cosmology });
  } catch (err) {
    framesProblem = `not corrected: ${(err as Error).message}`;
  }
  if (!HOST_CLASSES.has(verdict!.objectClass)) return { frames, framesProblem, host: null, hostProblem: null };
  try {
    return { frames, framesProblem, host: summariseHost(analyseHost(spectrum, z, { cosmology: options.cosmology, frames })), hostProblem: null };
  } catch (err) {
    return { frames, framesProblem, host: null, hostProblem: `host lines not measured: ${(err as Error).message}` };
  }
}

function frameColumn(field: Field<FrameResult>): CatalogueColumn {
  return {
    name: field.name, unit: field.unit, type: field.type, description: field.description,
    value: (s: CatalogueSource) => {
      const d = s.derived;
      if (d?.frames) return field.pick(d.frames);
      return field.name === 'frame_reason' ? (d?.framesProblem ?? null) : null;
    },
  };
}

function hostColumn(field: Field<HostSummary>): CatalogueColumn {
  return { name: field.name, unit: field.unit, type: field.type, description: field.description, value: (s: CatalogueSource) => (s.derived?.host ? field.pick(s.derived.host) : null) };
}

export const DERIVED_CATALOGUE_COLUMNS: readonly CatalogueColumn[] = [
  ...FRAME_FIELDS.map(frameColumn),
  ...DISTANCE_FIELDS.map(frameColumn),
  ...HOST_CLASS_FIELDS.map(hostColumn),
  ...HOST_CGS_FLUX_FIELDS.map(hostColumn),
  ...HOST_DUST_SFR_FIELDS.map(hostColumn),
  {
    name: 'host_problem', unit: null, type: 'string', description: 'why the host columns are empty for a vetted galaxy or AGN (empty otherwise)',
    value: (s: CatalogueSource) => s.derived?.hostProblem ?? null,
  },
];

/** Table metadata for the derived columns: the cosmology and its source. */
export function derivedMeta(options: DeriveOptions): Record<string, string> {
  return { cosmolog: cosmologyParameters(options.cosmology), cosmosrc: options.cosmology.source };
}

/** Caveats the derived columns need beside them in the file. */
export const DERIVED_COMMENTS: readonly string[] = [
  'Rows with status pending are not vetted: they hold no redshift and nothing derived from one (frame-corrected z, distances and host columns are empty); automatic redshifts are suggestions until a person vets them. No-redshift rows are empty there too.',
  'Frame-corrected z, distances (cosmology in COSMOLOG/cosmolog, distances at z_cmb, else the frame-corrected z) and host diagnostics are computed from the verdict z; no distances for class star; host columns only for class galaxy or agn.',
  `Host lines: narrow components at the verdict z, stellar Balmer absorption fitted, E(B-V) from the Balmer decrement (Calzetti et al. 2000), SFR from dust-corrected Halpha. ${APERTURE_CAVEAT} Where bpt_class is composite or agn an AGN contributes to Halpha, so the SFR is an upper limit.`,
];

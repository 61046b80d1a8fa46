/**
 * What every FITS layout reader shares: the verdict on one HDU (a spectrum it can read, or
 * why not) and the parts of a draft that come from the header alone.
 */
import type { FitsFile, FitsHdu } from '../../fits/parse.js';
import type { MediumDecision, SpectrumDraft } from '../draft.js';
import { stackKeywords, type Keywords } from '../keywords.js';
import { ASSUMED_AIR, mediumFromKeywords } from '../medium.js';
import { metadataOf } from '../metadata.js';
import type { HeaderCard } from '../spectrum.js';
import type { FrameDecision } from '../velocity-frame.js';

/** A draft without the HDU bookkeeping, which the dispatcher fills in. */
export type LayoutDraft = Omit<SpectrumDraft, 'hdu' | 'spectrumHdus'>;

export interface LayoutMatch {
  format: string;
  read(): LayoutDraft;
}

/** A layout's verdict on an HDU: it reads it, it does not apply (undefined), or why not. */
export type LayoutVerdict = LayoutMatch | string | undefined;

export interface HduContext {
  file: FitsFile;
  hdu: FitsHdu;
  /** The HDU's header, then the primary header (inherited keywords). */
  keywords: Keywords;
}

export function hduContext(file: FitsFile, hdu: FitsHdu): HduContext {
  const headers = hdu.index === 0 ? [hdu.header] : [hdu.header, file.hdus[0].header];
  return { file, hdu, keywords: stackKeywords(...headers) };
}

/** Survey conventions that apply when the header itself is silent. */
export interface SurveyDefaults {
  medium?: MediumDecision;
  frame?: FrameDecision;
}

/** The draft's first m pixels, where the wavelength solution covers only those (IRAF multispec's nw). */
export function firstPixels(d: LayoutDraft, m: number): LayoutDraft {
  if (d.flux.length <= m) return d;
  return { ...d, flux: d.flux.subarray(0, m), error: d.error?.subarray(0, m), mask: d.mask?.subarray(0, m), sky: d.sky?.subarray(0, m) };
}

export function headerParts(ctx: HduContext, defaults: SurveyDefaults = {}): Pick<LayoutDraft, 'medium' | 'meta' | 'header'> {
  // Every card is parsed for the header display first; the keyword look-ups then use those cards.
  const header = headerCards(ctx);
  return {
    medium: mediumFromKeywords(ctx.keywords) ?? defaults.medium ?? ASSUMED_AIR,
    meta: metadataOf(ctx.keywords, defaults.frame),
    header,
  };
}

/**
 * The primary header's cards, then the extension's own when an extension was read. The parsed
 * cards are handed over as they are (nothing uses the headers after reading), but for
 * commentary cards that carry `comment: undefined`, which leave the key out.
 */
function headerCards(ctx: HduContext): HeaderCard[] {
  const own = ctx.hdu.header.cards;
  const cards = ctx.hdu.index === 0 ? own : [...ctx.file.hdus[0].header.cards, ...own];
  return cards.map((c) => ('comment' in c && c.comment === undefined ? { key: c.key, value: c.value } : c));
}

/** Flux unit from BUNIT (the HDU's, then the primary's). */
export function bunit(k: Keywords): string | undefined {
  return k.string('BUNIT')?.trim() || undefined;
}

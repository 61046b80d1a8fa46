/** File endings zvet treats as spectra when it walks a folder. */
export const SPECTRUM_EXTENSIONS = ['.fits', '.fit', '.fts', '.fits.gz', '.fit.gz', '.fts.gz', '.csv', '.tsv', '.txt', '.dat', '.ascii'];

export function hasSpectrumExtension(name: string): boolean {
  const lower = name.toLowerCase();
  return SPECTRUM_EXTENSIONS.some((ext) => lower.endsWith(ext));
}

/** File endings zvet treats as spectra when it walks a folder: each also gzip-compressed (the readers inflate any gzip file). */
export const PLAIN_SPECTRUM_EXTENSIONS = ['.fits', '.fit', '.fts', '.csv', '.tsv', '.txt', '.dat', '.ascii'];
export const SPECTRUM_EXTENSIONS = PLAIN_SPECTRUM_EXTENSIONS.flatMap((ext) => [ext, `${ext}.gz`]);

export function hasSpectrumExtension(name: string): boolean {
  const lower = name.toLowerCase();
  return SPECTRUM_EXTENSIONS.some((ext) => lower.endsWith(ext));
}

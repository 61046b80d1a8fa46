import { readdir, stat } from 'node:fs/promises';
import { join } from 'node:path';

/** File endings zvet treats as spectra when it walks a folder. */
export const SPECTRUM_EXTENSIONS = ['.fits', '.fit', '.fts', '.fits.gz', '.fit.gz', '.fts.gz', '.csv', '.tsv', '.txt', '.dat', '.ascii'];

export function hasSpectrumExtension(name: string): boolean {
  const lower = name.toLowerCase();
  return SPECTRUM_EXTENSIONS.some((ext) => lower.endsWith(ext));
}

/**
 * Expands files and folders into spectrum files: a file is kept as given; a folder gives every
 * file with a spectrum extension below it, recursively, sorted by path. Hidden entries and
 * zvet's own outputs (journals, catalogues named *.catalogue.*) are passed over.
 */
export async function listSpectrumFiles(paths: string[]): Promise<string[]> {
  const out: string[] = [];
  for (const p of paths) {
    const info = await stat(p);
    if (info.isDirectory()) out.push(...(await walk(p)));
    else out.push(p);
  }
  return out;
}

async function walk(dir: string): Promise<string[]> {
  const entries = await readdir(dir, { withFileTypes: true });
  entries.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  const out: string[] = [];
  for (const e of entries) {
    if (e.name.startsWith('.') || e.name === 'node_modules') continue;
    const p = join(dir, e.name);
    if (e.isDirectory()) out.push(...(await walk(p)));
    else if (e.isFile() && hasSpectrumExtension(e.name) && !/\.catalogue\.|\.verdicts\./.test(e.name)) out.push(p);
  }
  return out;
}

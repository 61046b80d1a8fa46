import { readdir, realpath, stat } from 'node:fs/promises';
import { join } from 'node:path';
import { hasSpectrumExtension } from '../spectrum/file-extensions.js';

export interface ListOptions {
  /**
   * Follow symbolic links below the folders (each folder once); off, links are passed over. The
   * command line follows them; the window's worklist does not, so that a link cannot serve a
   * file from outside the worklist's folder.
   */
  followLinks: boolean;
  /** When links are not followed, those with a spectrum's name or to a folder are added here (to be reported). */
  leftOutLinks?: string[];
}

/**
 * Expands files and folders into spectrum files: a file is kept as given; a folder gives every
 * file with a spectrum extension below it, recursively, sorted by path. Hidden entries and
 * zvet's own outputs (journals, catalogues named *.catalogue.*) are passed over. A path that
 * does not exist and a folder that cannot be listed are kept as they are, so that reading them
 * fails with its reason in their place and nothing given is silently dropped.
 */
export async function listSpectrumFiles(paths: string[], options: ListOptions = { followLinks: false }): Promise<string[]> {
  const out: string[] = [];
  const walked = new Set<string>();
  for (const p of paths) {
    const info = await stat(p).catch(() => null);
    if (info?.isDirectory()) out.push(...(await walk(p, walked, options)));
    else out.push(p);
  }
  return out;
}

async function walk(dir: string, walked: Set<string>, options: ListOptions): Promise<string[]> {
  const real = await realpath(dir).catch(() => dir);
  if (walked.has(real)) return [];
  walked.add(real);
  const entries = await readdir(dir, { withFileTypes: true }).catch(() => null);
  if (!entries) return [dir];
  entries.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  const out: string[] = [];
  for (const e of entries) {
    if (e.name.startsWith('.') || e.name === 'node_modules') continue;
    const p = join(dir, e.name);
    if (e.isSymbolicLink() && !options.followLinks) {
      if (options.leftOutLinks && (hasSpectrumExtension(e.name) || (await stat(p).catch(() => null))?.isDirectory())) options.leftOutLinks.push(p);
      continue;
    }
    // A link is what it points to; a broken link to a spectrum name is kept, to fail in its place.
    const target = e.isSymbolicLink() ? await stat(p).catch(() => null) : e;
    if (target?.isDirectory()) out.push(...(await walk(p, walked, options)));
    else if ((target ? target.isFile() : e.isSymbolicLink()) && hasSpectrumExtension(e.name) && !/\.catalogue\.|\.verdicts\./.test(e.name)) out.push(p);
  }
  return out;
}

/**
 * Whether a file may be replaced by an output: not a folder, a device or a symbolic link (an
 * atomic write renames a new file over it), and not one of the files the command reads or the
 * journal of verdicts. Paths are compared after resolving symbolic links.
 */
import { lstat, realpath } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';

/** The path with its folder's symbolic links resolved (the file itself need not exist). */
export async function realTarget(path: string): Promise<string> {
  const folder = await realpath(dirname(resolve(path))).catch(() => dirname(resolve(path)));
  return join(folder, basename(path));
}

/** Why `path` may not be replaced, or null when it may. `kept` names what must survive, by kind. */
export async function replaceProblem(path: string, kept: { files: readonly string[]; what: string }[]): Promise<string | null> {
  const existing = await lstat(path).catch(() => null);
  if (existing?.isSymbolicLink()) return 'it is a symbolic link; name a plain file';
  if (existing && !existing.isFile()) return 'it is not a plain file';
  const target = await realTarget(path);
  for (const { files, what } of kept) {
    const real = await Promise.all(files.map((f) => realpath(f).catch(() => resolve(f))));
    if (real.includes(target)) return `it would overwrite ${what}`;
  }
  return null;
}

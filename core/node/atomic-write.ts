/**
 * Writes a whole file atomically: a temporary file in the same folder (so the rename stays on
 * one file system), fsync'd, renamed over the target, then the folder fsync'd so the new name
 * survives a crash (POSIX rename(2) atomicity). Readers see the old file or the new one, never
 * half of either.
 */
import { open, rename, rm } from 'node:fs/promises';
import { randomBytes } from 'node:crypto';
import { basename, dirname, join } from 'node:path';

/** fsync a folder so that a file just created or renamed in it survives a crash. */
export async function syncFolder(folder: string): Promise<void> {
  const handle = await open(folder, 'r');
  try {
    await handle.sync();
  } finally {
    await handle.close();
  }
}

export async function writeFileAtomic(path: string, data: Uint8Array | string): Promise<void> {
  const folder = dirname(path);
  // Hidden, so a folder walk never takes it for a spectrum while it exists.
  const temp = join(folder, `.${basename(path)}.${randomBytes(6).toString('hex')}.tmp`);
  try {
    const handle = await open(temp, 'wx');
    try {
      await handle.writeFile(data);
      await handle.sync();
    } finally {
      await handle.close();
    }
    await rename(temp, path);
  } catch (err) {
    await rm(temp, { force: true }).catch(() => undefined);
    // The error names the file the caller asked for, not the temporary one.
    const e = err as NodeJS.ErrnoException;
    if (e.path === temp) e.path = path;
    throw err;
  }
  await syncFolder(folder);
}

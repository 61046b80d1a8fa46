/**
 * Where a catalogue may be written: by default beside the journal in the worklist folder, else
 * the path the user typed. Either way it must end in the format's extension, its folder must
 * exist, it must not be a symlink, a folder, the journal or one of the spectra, and a path inside
 * the worklist must not lead out of it through a symlinked folder.
 */
import { realpath } from 'node:fs/promises';
import { basename, dirname, isAbsolute, join, resolve } from 'node:path';
import type { ExportFormat } from '../../api/host-api.js';
import { replaceProblem } from '../output-target.js';
import { HostFailure } from './host-failure.js';
import { isInside } from './static-files.js';

export interface ExportTarget {
  root: string;
  /** Worklist name, used for the default file name. */
  name: string;
  journalPath: string;
  /** Absolute paths of the worklist's spectra. */
  spectra: readonly string[];
}

export function defaultExportPath(target: ExportTarget, format: ExportFormat): string {
  return join(target.root, `${target.name}.catalogue.${format}`);
}

export async function resolveExportPath(target: ExportTarget, format: ExportFormat, requested?: string): Promise<string> {
  const path = requested === undefined ? defaultExportPath(target, format) : resolve(target.root, requested);
  const refuse = (why: string) => new HostFailure(400, `export to ${path}: ${why}`);
  if (requested !== undefined && !isAbsolute(requested) && !isInside(resolve(target.root), path)) {
    throw refuse('a relative path must stay inside the worklist folder');
  }
  if (!basename(path).toLowerCase().endsWith(`.${format}`)) throw refuse(`the file name must end in .${format}`);
  let realFolder: string;
  try {
    realFolder = await realpath(dirname(path));
  } catch {
    throw refuse('its folder does not exist');
  }
  const realRoot = await realpath(target.root);
  if (isInside(resolve(target.root), path) && !isInside(realRoot, realFolder)) {
    throw refuse('its folder leads out of the worklist through a symlink');
  }
  const problem = await replaceProblem(path, [{ files: [target.journalPath], what: 'the journal of verdicts' }, { files: target.spectra, what: 'a spectrum of the worklist' }]);
  if (problem) throw refuse(problem);
  return join(realFolder, basename(path));
}

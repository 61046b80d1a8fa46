/**
 * A worklist: the spectra being vetted (usually one night's folder) and their verdict journal,
 * `<root>/<name>.verdicts.jsonl`. Spectra are named by their path relative to the root with
 * '/' separators, so a journal stays valid when the folder is moved or opened on another OS.
 */
import { stat } from 'node:fs/promises';
import { basename, dirname, join, relative, resolve, sep } from 'node:path';
import { VerdictJournal } from './journal.js';
import { listSpectrumFiles } from './spectrum-files.js';

export interface WorklistEntry {
  /** Path relative to the worklist root, '/'-separated. */
  spectrum: string;
  absPath: string;
}

/** The deepest folder containing every given path. */
function commonFolder(folders: string[]): string {
  let common = folders[0].split(sep);
  for (const f of folders.slice(1)) {
    const parts = f.split(sep);
    let n = 0;
    while (n < common.length && n < parts.length && common[n] === parts[n]) n++;
    common = common.slice(0, n);
  }
  return common.join(sep) || sep;
}

export class Worklist {
  readonly root: string;
  readonly name: string;
  readonly journalPath: string;
  readonly entries: WorklistEntry[];
  readonly journal: VerdictJournal;
  /** Symbolic links with a spectrum's name in the folder, left out (relative to the root). */
  readonly leftOutLinks: string[];

  private constructor(root: string, entries: WorklistEntry[], journal: VerdictJournal, leftOutLinks: string[]) {
    this.root = root;
    this.name = basename(root);
    this.journalPath = journal.path;
    this.entries = entries;
    this.journal = journal;
    this.leftOutLinks = leftOutLinks;
  }

  /** One line on the links left out, or null when there are none. */
  linksWarning(): string | null {
    const n = this.leftOutLinks.length;
    if (n === 0) return null;
    return `${n === 1 ? 'a symbolic link is' : `${n} symbolic links are`} left out of the worklist (only files inside its folder are read): ${this.leftOutLinks.join(', ')}`;
  }

  /**
   * A folder: every spectrum file below it (listSpectrumFiles). A list of files (or folders):
   * those, with the root at their common folder.
   */
  static async open(folderOrFiles: string | string[]): Promise<Worklist> {
    const given = (Array.isArray(folderOrFiles) ? folderOrFiles : [folderOrFiles]).map((p) => resolve(p));
    if (!given.length) throw new Error('a worklist needs a folder or at least one file');
    const folders = await Promise.all(given.map(async (p) => ((await stat(p)).isDirectory() ? p : dirname(p))));
    const root = commonFolder(folders);
    const leftOut: string[] = [];
    const files = await listSpectrumFiles(given, { followLinks: false, leftOutLinks: leftOut });
    // Ids are paths below the root with forward slashes on every system.
    const idOf = (p: string) => relative(root, p).split(sep).join('/');
    const entries = [...new Set(files.map((f) => resolve(f)))].map((absPath) => ({ absPath, spectrum: idOf(absPath) }));
    const journal = await VerdictJournal.open(join(root, `${basename(root)}.verdicts.jsonl`));
    return new Worklist(root, entries, journal, leftOut.map(idOf));
  }
}

/**
 * The verdict journal on disk: `<worklist>/<name>.verdicts.jsonl`, appended one line per
 * decision and fsync'd before the promise resolves, never rewritten. Each record goes out in a
 * single write() to a file opened for appending, so a crash (power cut, SIGKILL) can at worst
 * leave the last line torn, which replay skips with a warning.
 *
 * Another program may append to the same journal (a second window on the worklist): before each
 * write, and when asked (refresh), a journal whose size is not what this one wrote reads the file
 * again, so that its verdicts are in force here too; an undo here never cancels one of them.
 */
import { open, readFile, stat } from 'node:fs/promises';
import { dirname } from 'node:path';
import { JournalState, replayJournal, serialiseUndoRecord, serialiseVerdictRecord } from '../catalogue/journal-format.js';
import type { Verdict } from '../catalogue/verdict.js';
import { syncFolder } from './atomic-write.js';
import { describeFailure } from './cli/run-action.js';

/** Said once when another program is found writing to the same journal. */
export const OTHER_WRITER_WARNING = 'another zvet (or another program) is saving verdicts to this journal too: they show here as well, and undo here takes back only verdicts made here';

/** Identity of a verdict in the journal (an undo names it so). */
const stampOf = (v: Verdict) => `${v.spectrum}\u0000${v.time}\u0000${v.user}`;

export class VerdictJournal {
  readonly path: string;
  readonly warnings: string[];
  private state: JournalState;
  /** True when the file's last byte is not a newline (torn line, or a failed write). */
  private endsMidLine: boolean;
  private exists: boolean;
  /** Bytes of the file as last read or written here; another size means another writer. */
  private size: number;
  /** Verdicts that another program wrote while this journal was open (stampOf). */
  private readonly othersVerdicts = new Set<string>();
  private queue: Promise<unknown> = Promise.resolve();

  private constructor(path: string, replay: { state: JournalState; warnings: string[]; endsMidLine: boolean }, size: number | null) {
    this.path = path;
    this.state = replay.state;
    this.warnings = replay.warnings;
    this.endsMidLine = replay.endsMidLine;
    this.exists = size !== null;
    this.size = size ?? 0;
  }

  /** Reads the journal if it exists (creating nothing until the first append). */
  static async open(path: string): Promise<VerdictJournal> {
    const read = await readJournal(path);
    return read ? new VerdictJournal(path, replayJournal(read.text, path), read.size) : new VerdictJournal(path, { state: new JournalState(), warnings: [], endsMidLine: false }, null);
  }

  /** Reads the file again if another program has written to it; resolves true when it had. */
  refresh(): Promise<boolean> {
    return this.enqueue(() => this.readOthers());
  }

  private async readOthers(): Promise<boolean> {
    const size = await stat(this.path).then((s) => s.size, () => null);
    if ((size ?? 0) === this.size) return false;
    const read = (await readJournal(this.path)) ?? { text: '', size: 0 };
    const replay = replayJournal(read.text, this.path);
    const inFile = new Set(replay.state.verdicts().map(stampOf));
    const known = new Set(this.state.verdicts().map(stampOf));
    const shrank = read.size < this.size;
    // Verdicts made here that the file no longer holds (it was replaced, cut short or deleted).
    const lost = shrank ? this.state.verdicts().filter((v) => !inFile.has(stampOf(v)) && !this.othersVerdicts.has(stampOf(v))) : [];
    for (const v of replay.state.verdicts()) if (!known.has(stampOf(v))) this.othersVerdicts.add(stampOf(v));
    this.state = replay.state;
    this.endsMidLine = replay.endsMidLine;
    this.size = read.size;
    this.exists = size !== null;
    if (shrank) {
      for (const v of lost) {
        await this.writeLine(serialiseVerdictRecord(v));
        this.state.applyVerdict(v);
      }
      const n = lost.length;
      this.warnings.push(`the journal was ${size === null ? 'deleted' : 'cut short or replaced'} by another program while open here; ${n === 0 ? 'no verdict made here was lost' : `the ${n} verdict${n === 1 ? '' : 's'} made here that it no longer held ${n === 1 ? 'was' : 'were'} written to it again`}`);
    } else if (!this.warnings.includes(OTHER_WRITER_WARNING)) this.warnings.push(OTHER_WRITER_WARNING);
    return true;
  }

  /** The verdicts in force, by spectrum (path relative to the worklist). */
  current(): ReadonlyMap<string, Verdict> {
    return this.state.current();
  }

  /** Appends a verdict; resolves once it is on disk. Memory changes only after that. */
  append(v: Verdict): Promise<void> {
    const line = serialiseVerdictRecord(v);
    return this.enqueue(async () => {
      await this.readOthers();
      await this.writeLine(line);
      this.state.applyVerdict(v);
    });
  }

  /**
   * Undoes the most recent verdict in force made here, not by another program (appending an
   * undo record that names it); returns it with the verdict now in force for its spectrum, or
   * null when there was nothing to undo.
   */
  undo(): Promise<{ undone: Verdict; now: Verdict | null } | null> {
    return this.enqueue(async () => {
      await this.readOthers();
      const last = this.state.lastInForce((v) => !this.othersVerdicts.has(stampOf(v)));
      if (!last) return null;
      await this.writeLine(serialiseUndoRecord(last, new Date().toISOString()));
      this.state.applyUndoOf(last.spectrum, last);
      return { undone: last, now: this.state.current().get(last.spectrum) ?? null };
    });
  }

  /** Runs writes one at a time, in call order; a failed one does not block the next. */
  private enqueue<T>(task: () => Promise<T>): Promise<T> {
    const run = this.queue.then(task, task);
    this.queue = run.catch(() => undefined);
    return run;
  }

  private async writeLine(line: string): Promise<void> {
    const text = this.endsMidLine ? `\n${line}` : line;
    try {
      const handle = await open(this.path, 'a');
      try {
        // Until the write is known to be complete, assume a partial line may be on disk.
        this.endsMidLine = true;
        await handle.write(text);
        await handle.sync();
        this.endsMidLine = false;
        this.size += Buffer.byteLength(text);
      } finally {
        await handle.close();
      }
      if (!this.exists) {
        await syncFolder(dirname(this.path));
        this.exists = true;
      }
    } catch (err) {
      // Part of the line may have reached the disk: those bytes are this journal's own, not another writer's.
      this.size = await stat(this.path).then((s) => s.size, () => this.size);
      const e = err as NodeJS.ErrnoException;
      if (typeof e.path !== 'string') e.path = this.path;
      throw new Error(`the verdict was not saved: ${describeFailure(e)}`);
    }
  }
}

/** The journal's text and size in bytes, or null when there is no journal yet. */
async function readJournal(path: string): Promise<{ text: string; size: number } | null> {
  try {
    const bytes = await readFile(path);
    return { text: bytes.toString('utf8'), size: bytes.length };
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw new Error(`cannot read the verdict journal: ${describeFailure(err)}`);
  }
}

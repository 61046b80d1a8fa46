/**
 * The verdict journal on disk: `<worklist>/<name>.verdicts.jsonl`, appended one line per
 * decision and fsync'd before the promise resolves, never rewritten. Each record goes out in a
 * single write() to a file opened for appending, so a crash (power cut, SIGKILL) can at worst
 * leave the last line torn, which replay skips with a warning.
 */
import { open, readFile } from 'node:fs/promises';
import { dirname } from 'node:path';
import { JournalState, replayJournal, serialiseUndoRecord, serialiseVerdictRecord } from '../catalogue/journal-format.js';
import type { Verdict } from '../catalogue/verdict.js';
import { syncFolder } from './atomic-write.js';
import { describeFailure } from './cli/run-action.js';

export class VerdictJournal {
  readonly path: string;
  readonly warnings: string[];
  private readonly state: JournalState;
  /** True when the file's last byte is not a newline (torn line, or a failed write). */
  private endsMidLine: boolean;
  private exists: boolean;
  private queue: Promise<unknown> = Promise.resolve();

  private constructor(path: string, state: JournalState, warnings: string[], endsMidLine: boolean, exists: boolean) {
    this.path = path;
    this.state = state;
    this.warnings = warnings;
    this.endsMidLine = endsMidLine;
    this.exists = exists;
  }

  /** Reads the journal if it exists (creating nothing until the first append). */
  static async open(path: string): Promise<VerdictJournal> {
    let text: string;
    try {
      text = await readFile(path, 'utf8');
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'ENOENT') throw new Error(`cannot read the verdict journal: ${describeFailure(err)}`);
      return new VerdictJournal(path, new JournalState(), [], false, false);
    }
    const replay = replayJournal(text, path);
    return new VerdictJournal(path, replay.state, replay.warnings, replay.endsMidLine, true);
  }

  /** The verdicts in force, by spectrum (path relative to the worklist). */
  current(): ReadonlyMap<string, Verdict> {
    return this.state.current();
  }

  /** Appends a verdict; resolves once it is on disk. Memory changes only after that. */
  append(v: Verdict): Promise<void> {
    const line = serialiseVerdictRecord(v);
    return this.enqueue(async () => {
      await this.writeLine(line);
      this.state.applyVerdict(v);
    });
  }

  /**
   * Undoes the most recent verdict in force (appending an undo record); returns the verdict
   * now in force for that spectrum, or null (also when there was nothing to undo).
   */
  undo(): Promise<Verdict | null> {
    return this.enqueue(async () => {
      const last = this.state.lastInForce();
      if (!last) return null;
      await this.writeLine(serialiseUndoRecord(last, new Date().toISOString()));
      this.state.applyUndo();
      return this.state.current().get(last.spectrum) ?? null;
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
      } finally {
        await handle.close();
      }
      if (!this.exists) {
        await syncFolder(dirname(this.path));
        this.exists = true;
      }
    } catch (err) {
      const e = err as NodeJS.ErrnoException;
      if (typeof e.path !== 'string') e.path = this.path;
      throw new Error(`the verdict was not saved: ${describeFailure(e)}`);
    }
  }
}

/**
 * The verdict journal's format: one JSON object per line (JSON Lines), appended, never
 * rewritten. Two kinds of record:
 *   {"v":1,"kind":"verdict","verdict":{…Verdict…}}
 *   {"v":1,"kind":"undo","spectrum":"<spectrum of the verdict undone>","undoes":{"time":…,"user":…},"time":"<UTC ISO>"}
 * Replaying the lines in order gives the verdicts in force: the last verdict per spectrum
 * wins; an undo cancels the verdict it names by its spectrum, time and user, so that two
 * programs writing one journal cannot undo each other's verdicts. An undo without `undoes`
 * (written before it existed) cancels the most recent verdict still in force (a stack). A line
 * that cannot be read is skipped with a warning naming its line number, and nothing else is
 * lost; a torn last line (power cut during a write) is expected and reported as such.
 */
import { CONFIDENCES, OBJECT_CLASSES, VERDICT_STATUSES, WAVELENGTH_MEDIA, type Verdict } from './verdict.js';

export const JOURNAL_FORMAT_VERSION = 1;

/** What tells one verdict on a spectrum from another: when it was made, and by whom. */
export interface VerdictStamp {
  time: string;
  user: string;
}

export type JournalRecord =
  | { kind: 'verdict'; verdict: Verdict }
  | { kind: 'undo'; spectrum: string; time: string; undoes?: VerdictStamp };

/** Why a value is not a Verdict, or null when it is one. */
export function verdictProblem(v: unknown): string | null {
  if (typeof v !== 'object' || v === null) return 'not an object';
  const o = v as Record<string, unknown>;
  const nullableNumber = (x: unknown) => x === null || (typeof x === 'number' && Number.isFinite(x));
  const oneOf = (list: readonly string[], x: unknown) => typeof x === 'string' && list.includes(x);
  if (typeof o.spectrum !== 'string' || o.spectrum === '') return 'spectrum must be a non-empty string';
  if (!(o.hdu === null || (typeof o.hdu === 'number' && Number.isInteger(o.hdu) && o.hdu >= 0))) return 'hdu must be a whole number or null';
  if (!oneOf(VERDICT_STATUSES, o.status)) return `status must be one of ${VERDICT_STATUSES.join(', ')}`;
  if (!nullableNumber(o.z)) return 'z must be a number or null';
  if (!nullableNumber(o.zErr)) return 'zErr must be a number or null';
  // A redshift is above −1 (λ_obs > 0) and an uncertainty is not negative.
  if (typeof o.z === 'number' && !(o.z > -1)) return `z must be above −1, not ${o.z}`;
  if (typeof o.zErr === 'number' && !(o.zErr >= 0)) return `zErr must not be negative, not ${o.zErr}`;
  if ((o.status === 'accepted' || o.status === 'revised') && o.z === null) return `status "${o.status}" needs a z`;
  if (o.status === 'no-redshift' && o.z !== null) return 'status "no-redshift" carries no z';
  if (!(o.confidence === null || oneOf(CONFIDENCES, o.confidence))) return `confidence must be one of ${CONFIDENCES.join(', ')} or null`;
  if (!oneOf(OBJECT_CLASSES, o.objectClass)) return `objectClass must be one of ${OBJECT_CLASSES.join(', ')}`;
  if (!(o.template === null || typeof o.template === 'string')) return 'template must be a string or null';
  for (const key of ['note', 'time', 'user'] as const) if (typeof o[key] !== 'string') return `${key} must be a string`;
  if (o.medium !== undefined && !oneOf(WAVELENGTH_MEDIA, o.medium)) return `medium must be one of ${WAVELENGTH_MEDIA.join(', ')} when given`;
  return null;
}

/** One journal line (with its newline) recording a verdict. */
export function serialiseVerdictRecord(verdict: Verdict): string {
  const problem = verdictProblem(verdict);
  if (problem) throw new Error(`not a valid verdict: ${problem}`);
  return `${JSON.stringify({ v: JOURNAL_FORMAT_VERSION, kind: 'verdict', verdict })}\n`;
}

/** One journal line (with its newline) undoing the verdict `undone`, named by its spectrum, time and user. */
export function serialiseUndoRecord(undone: Verdict, timeUtc: string): string {
  return `${JSON.stringify({ v: JOURNAL_FORMAT_VERSION, kind: 'undo', spectrum: undone.spectrum, undoes: { time: undone.time, user: undone.user }, time: timeUtc })}\n`;
}

/** Reads one line; returns the record or the reason it cannot be used. */
export function parseRecord(line: string): JournalRecord | { problem: string } {
  let o: Record<string, unknown>;
  try {
    o = JSON.parse(line);
  } catch {
    return { problem: 'not valid JSON' };
  }
  if (typeof o !== 'object' || o === null || Array.isArray(o)) return { problem: 'not a JSON object' };
  if (o.v !== JOURNAL_FORMAT_VERSION) {
    return { problem: typeof o.v === 'number' && o.v > JOURNAL_FORMAT_VERSION ? `format version ${o.v} is newer than this zvet reads (${JOURNAL_FORMAT_VERSION})` : 'no journal format version' };
  }
  if (o.kind === 'verdict') {
    const problem = verdictProblem(o.verdict);
    return problem ? { problem: `verdict: ${problem}` } : { kind: 'verdict', verdict: o.verdict as Verdict };
  }
  if (o.kind === 'undo') {
    if (typeof o.spectrum !== 'string' || typeof o.time !== 'string') return { problem: 'undo record without spectrum and time' };
    if (o.undoes === undefined) return { kind: 'undo', spectrum: o.spectrum, time: o.time };
    const u = o.undoes as Record<string, unknown> | null;
    if (typeof u !== 'object' || u === null || typeof u.time !== 'string' || typeof u.user !== 'string') return { problem: 'undo record whose "undoes" is not {time, user}' };
    return { kind: 'undo', spectrum: o.spectrum, time: o.time, undoes: { time: u.time, user: u.user } };
  }
  return { problem: `unknown record kind ${JSON.stringify(o.kind)}` };
}

/**
 * The verdicts in force, kept as the stack of verdicts not undone (oldest first) and, per
 * spectrum, the last of them.
 */
export class JournalState {
  private readonly stack: Verdict[] = [];
  private readonly bySpectrum = new Map<string, Verdict>();

  current(): ReadonlyMap<string, Verdict> {
    return this.bySpectrum;
  }

  /** The most recent verdict in force that `mayUndo` allows (every one by default), or null. */
  lastInForce(mayUndo: (v: Verdict) => boolean = () => true): Verdict | null {
    for (let i = this.stack.length - 1; i >= 0; i--) if (mayUndo(this.stack[i])) return this.stack[i];
    return null;
  }

  /** Every verdict not undone, oldest first. */
  verdicts(): readonly Verdict[] {
    return this.stack;
  }

  applyVerdict(v: Verdict): void {
    this.stack.push(v);
    this.bySpectrum.set(v.spectrum, v);
  }

  /** Cancels the most recent verdict in force; returns it, or null when there is none. */
  applyUndo(): Verdict | null {
    return this.stack.length ? this.cancel(this.stack.length - 1) : null;
  }

  /** Cancels the verdict on `spectrum` with this stamp; returns it, or null when it is not in force. */
  applyUndoOf(spectrum: string, stamp: VerdictStamp): Verdict | null {
    for (let i = this.stack.length - 1; i >= 0; i--) {
      const v = this.stack[i];
      if (v.spectrum === spectrum && v.time === stamp.time && v.user === stamp.user) return this.cancel(i);
    }
    return null;
  }

  private cancel(index: number): Verdict {
    const [undone] = this.stack.splice(index, 1);
    this.bySpectrum.delete(undone.spectrum);
    for (let i = this.stack.length - 1; i >= 0; i--) {
      if (this.stack[i].spectrum === undone.spectrum) {
        this.bySpectrum.set(undone.spectrum, this.stack[i]);
        break;
      }
    }
    return undone;
  }
}

export interface JournalReplay {
  state: JournalState;
  warnings: string[];
  /** The text does not end with a newline: the next record must start on a new line. */
  endsMidLine: boolean;
}

/** Replays a whole journal text; `fileName` names the journal in warnings. */
export function replayJournal(text: string, fileName: string): JournalReplay {
  const state = new JournalState();
  const warnings: string[] = [];
  const lines = text.split('\n');
  const endsMidLine = text.length > 0 && !text.endsWith('\n');
  // After the final newline split() leaves one empty string, which is not a line.
  if (!endsMidLine) lines.pop();
  lines.forEach((raw, i) => {
    const line = raw.trim();
    if (line === '') return;
    const number = i + 1;
    const record = parseRecord(line);
    if ('problem' in record) {
      const torn = endsMidLine && i === lines.length - 1;
      warnings.push(
        torn
          ? `${fileName}: line ${number} (the last) is incomplete, probably cut off by a crash or power loss; skipped (${record.problem}); all earlier verdicts are kept`
          : `${fileName}: line ${number} cannot be read and was skipped (${record.problem})`,
      );
      return;
    }
    if (record.kind === 'verdict') {
      state.applyVerdict(record.verdict);
      return;
    }
    if (record.undoes) {
      if (!state.applyUndoOf(record.spectrum, record.undoes)) warnings.push(`${fileName}: line ${number} undoes the verdict on ${record.spectrum} of ${record.undoes.time}, which is not in force; ignored`);
      return;
    }
    const undone = state.applyUndo();
    if (!undone) warnings.push(`${fileName}: line ${number} undoes a verdict but none is in force; ignored`);
    else if (undone.spectrum !== record.spectrum) {
      warnings.push(`${fileName}: line ${number} says it undoes the verdict on ${record.spectrum} but the latest verdict in force was on ${undone.spectrum}; undid that one`);
    }
  });
  return { state, warnings, endsMidLine };
}

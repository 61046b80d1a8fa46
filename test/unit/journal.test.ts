// The verdict journal: replay rules (last verdict wins, an undo cancels the verdict it names, torn
// and garbled lines skipped with warnings) and the file behaviour (fsync'd appends in order, nothing created
// before the first verdict, memory unchanged when the disk refuses a write).
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { replayJournal, serialiseUndoRecord, serialiseVerdictRecord } from '../../core/catalogue/journal-format.js';
import type { Verdict } from '../../core/catalogue/verdict.js';
import { OTHER_WRITER_WARNING, VerdictJournal } from '../../core/node/journal.js';

const dir = mkdtempSync(join(tmpdir(), 'zvet-journal-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
let serial = 0;
const freshPath = () => join(dir, `night-${++serial}.verdicts.jsonl`);

function verdict(spectrum: string, z: number | null, extra: Partial<Verdict> = {}): Verdict {
  return {
    spectrum,
    hdu: 0,
    status: z === null ? 'no-redshift' : 'accepted',
    z,
    zErr: z === null ? null : 1e-4,
    confidence: z === null ? null : 'secure',
    objectClass: 'galaxy',
    template: z === null ? null : 'star-forming',
    note: '',
    time: '2026-03-14T12:00:00.000Z',
    user: 'observer',
    ...extra,
  };
}

const zOf = (m: ReadonlyMap<string, Verdict>) => Object.fromEntries([...m].map(([k, v]) => [k, v.z]));

describe('journal format', () => {
  it('round-trips a verdict through one line', () => {
    const v = verdict('a.fits', 0.1234, { note: 'Hα in the A band, "quoted"\nsecond line' });
    const line = serialiseVerdictRecord(v);
    expect(line.endsWith('\n')).toBe(true);
    expect(line.slice(0, -1)).not.toContain('\n');
    const r = replayJournal(line, 'j');
    expect(r.warnings).toEqual([]);
    expect(r.state.current().get('a.fits')).toEqual(v);
  });

  it('round-trips the medium a user set for the wavelengths; a verdict without one has none', () => {
    const v = verdict('a.fits', 0.1234, { medium: 'vacuum' });
    expect(replayJournal(serialiseVerdictRecord(v), 'j').state.current().get('a.fits')).toEqual(v);
    expect(replayJournal(serialiseVerdictRecord(verdict('b.fits', 0.2)), 'j').state.current().get('b.fits')).not.toHaveProperty('medium');
  });

  it('refuses to write an invalid verdict', () => {
    expect(() => serialiseVerdictRecord({ ...verdict('a.fits', 0.1), medium: 'glass' as never })).toThrow(/medium must be one of air, vacuum/);
    expect(() => serialiseVerdictRecord({ ...verdict('a.fits', 0.1), confidence: 'sure' as never })).toThrow(/confidence/);
    expect(() => serialiseVerdictRecord({ ...verdict('a.fits', 0.1), z: NaN })).toThrow(/z must be/);
  });

  it('the last verdict per spectrum wins', () => {
    const text = [verdict('a.fits', 0.1), verdict('b.fits', 0.2), verdict('a.fits', 0.3)].map(serialiseVerdictRecord).join('');
    expect(zOf(replayJournal(text, 'j').state.current())).toEqual({ 'a.fits': 0.3, 'b.fits': 0.2 });
  });

  it('an undo cancels the most recent verdict in force, and undo past the first is ignored with a warning', () => {
    const a1 = verdict('a.fits', 0.1);
    const b = verdict('b.fits', 0.2);
    const a2 = verdict('a.fits', 0.3);
    const lines = [serialiseVerdictRecord(a1), serialiseVerdictRecord(b), serialiseVerdictRecord(a2), serialiseUndoRecord(a2, 't')];
    expect(zOf(replayJournal(lines.join(''), 'j').state.current())).toEqual({ 'a.fits': 0.1, 'b.fits': 0.2 });
    lines.push(serialiseUndoRecord(b, 't'), serialiseUndoRecord(a1, 't'));
    expect(zOf(replayJournal(lines.join(''), 'j').state.current())).toEqual({});
    lines.push(serialiseUndoRecord(a1, 't'));
    const r = replayJournal(lines.join(''), 'j');
    expect(zOf(r.state.current())).toEqual({});
    expect(r.warnings).toEqual(['j: line 7 undoes the verdict on a.fits of 2026-03-14T12:00:00.000Z, which is not in force; ignored']);
  });

  it('an undo cancels the verdict it names, so that two programs writing one journal never undo each other', () => {
    const mine = verdict('a.fits', 0.1, { user: 'observer' });
    const theirs = verdict('b.fits', 0.2, { user: 'colleague', time: '2026-03-14T12:00:01.000Z' });
    const text = [serialiseVerdictRecord(mine), serialiseVerdictRecord(theirs), serialiseUndoRecord(mine, 't')].join('');
    const r = replayJournal(text, 'j');
    expect(zOf(r.state.current())).toEqual({ 'b.fits': 0.2 });
    expect(r.warnings).toEqual([]);
  });

  it('replays an undo written without the verdict it undoes (older journals) as the undo of the latest verdict', () => {
    const legacyUndo = (spectrum: string) => `${JSON.stringify({ v: 1, kind: 'undo', spectrum, time: 't' })}\n`;
    const text = [serialiseVerdictRecord(verdict('a.fits', 0.1)), serialiseVerdictRecord(verdict('b.fits', 0.2)), legacyUndo('b.fits'), legacyUndo('a.fits'), legacyUndo('a.fits')].join('');
    const r = replayJournal(text, 'j');
    expect(zOf(r.state.current())).toEqual({});
    expect(r.warnings).toEqual(['j: line 5 undoes a verdict but none is in force; ignored']);
  });

  it('skips a torn last line with a warning and keeps everything before it', () => {
    const good = [verdict('a.fits', 0.1), verdict('b.fits', 0.2)].map(serialiseVerdictRecord).join('');
    const torn = serialiseVerdictRecord(verdict('c.fits', 0.3)).slice(0, 40);
    const r = replayJournal(good + torn, 'night.verdicts.jsonl');
    expect(zOf(r.state.current())).toEqual({ 'a.fits': 0.1, 'b.fits': 0.2 });
    expect(r.endsMidLine).toBe(true);
    expect(r.warnings).toHaveLength(1);
    expect(r.warnings[0]).toMatch(/^night\.verdicts\.jsonl: line 3 \(the last\) is incomplete/);
  });

  it('skips a garbled middle line naming its line number, losing nothing else', () => {
    const lines = [verdict('a.fits', 0.1), verdict('b.fits', 0.2), verdict('c.fits', 0.3)].map(serialiseVerdictRecord);
    lines[1] = '{"v":1,"kind":"verdict","verdict":{"spectrum":"b.fits"\u0000garbage\n';
    const r = replayJournal(`${lines.join('')}\n`, 'j');
    expect(zOf(r.state.current())).toEqual({ 'a.fits': 0.1, 'c.fits': 0.3 });
    expect(r.warnings).toEqual(['j: line 2 cannot be read and was skipped (not valid JSON)']);
  });

  it('skips a hand-edited line whose z or σz cannot be, naming line and reason', () => {
    const record = (v: object) => `${JSON.stringify({ v: 1, kind: 'verdict', verdict: v })}\n`;
    const text = [
      record(verdict('a.fits', -1.5)),
      record({ ...verdict('b.fits', 0.2), zErr: -1e-4 }),
      record({ ...verdict('c.fits', 0.3), z: null }),
      record({ ...verdict('d.fits', null), z: 0.4 }),
      serialiseVerdictRecord(verdict('e.fits', 0.5)),
    ].join('');
    const r = replayJournal(text, 'j');
    expect(zOf(r.state.current())).toEqual({ 'e.fits': 0.5 });
    expect(r.warnings.map((w) => w.replace(/^j: line (\d) .*\((.*)\)$/, '$1: $2'))).toEqual([
      '1: verdict: z must be above −1, not -1.5',
      '2: verdict: zErr must not be negative, not -0.0001',
      '3: verdict: status "accepted" needs a z',
      '4: verdict: status "no-redshift" carries no z',
    ]);
  });

  it('skips a line from a newer format version with a warning', () => {
    const r = replayJournal('{"v":2,"kind":"verdict","verdict":{}}\n', 'j');
    expect(r.warnings[0]).toMatch(/line 1 .*format version 2 is newer/);
  });
});

describe('VerdictJournal on disk', () => {
  it('creates nothing until the first append, then restores everything on reopen', async () => {
    const path = freshPath();
    const j = await VerdictJournal.open(path);
    expect(existsSync(path)).toBe(false);
    expect(j.current().size).toBe(0);
    await j.append(verdict('a.fits', 0.1));
    await j.append(verdict('b.fits', null));
    await j.append(verdict('a.fits', 0.15, { status: 'revised' }));
    expect(readFileSync(path, 'utf8').split('\n')).toHaveLength(4);
    const again = await VerdictJournal.open(path);
    expect(again.warnings).toEqual([]);
    expect(zOf(again.current())).toEqual({ 'a.fits': 0.15, 'b.fits': null });
    expect(again.current().get('a.fits')?.status).toBe('revised');
  });

  it('undo returns the verdict now in force for that spectrum, or null, and is journalled', async () => {
    const path = freshPath();
    const j = await VerdictJournal.open(path);
    expect(await j.undo()).toBeNull();
    expect(existsSync(path)).toBe(false);
    await j.append(verdict('a.fits', 0.1));
    await j.append(verdict('a.fits', 0.2, { time: '2026-03-14T12:00:01.000Z' }));
    expect(await j.undo()).toMatchObject({ undone: { z: 0.2 }, now: { z: 0.1 } });
    expect(await j.undo()).toMatchObject({ undone: { z: 0.1 }, now: null });
    expect(await j.undo()).toBeNull();
    expect(j.current().size).toBe(0);
    const again = await VerdictJournal.open(path);
    expect(again.warnings).toEqual([]);
    expect(again.current().size).toBe(0);
  });

  it('two journals open on one file (two windows on one worklist) see each other\'s verdicts and undo only their own', async () => {
    const path = freshPath();
    const here = await VerdictJournal.open(path);
    const there = await VerdictJournal.open(path);
    await here.append(verdict('a.fits', 0.1, { time: '2026-03-14T12:00:00.000Z' }));
    await there.append(verdict('b.fits', 0.2, { time: '2026-03-14T12:00:01.000Z', user: 'colleague' }));
    expect(await here.refresh()).toBe(true);
    expect(zOf(here.current())).toEqual({ 'a.fits': 0.1, 'b.fits': 0.2 });
    expect(here.warnings).toEqual([OTHER_WRITER_WARNING]);
    expect(await here.refresh()).toBe(false);
    // The latest verdict in force is the other window's; undo here takes back this window's own.
    expect(await here.undo()).toMatchObject({ undone: { spectrum: 'a.fits' }, now: null });
    expect(zOf(here.current())).toEqual({ 'b.fits': 0.2 });
    expect(await here.undo()).toBeNull();
    expect(zOf(here.current())).toEqual({ 'b.fits': 0.2 });
    // The other window learns of the undo before its next write, and the file replays to the same.
    await there.append(verdict('c.fits', 0.3, { time: '2026-03-14T12:00:02.000Z', user: 'colleague' }));
    expect(zOf(there.current())).toEqual({ 'b.fits': 0.2, 'c.fits': 0.3 });
    const reopened = await VerdictJournal.open(path);
    expect(reopened.warnings).toEqual([]);
    expect(zOf(reopened.current())).toEqual({ 'b.fits': 0.2, 'c.fits': 0.3 });
  });

  it('writes back the verdicts made here when another program cuts the journal short or deletes it', async () => {
    const path = freshPath();
    const j = await VerdictJournal.open(path);
    const [a, b, c] = ([['a.fits', 0.1], ['b.fits', 0.2], ['c.fits', 0.3]] as const).map(([s, z], i) => verdict(s, z, { time: `2026-03-14T12:00:0${i}.000Z` }));
    await j.append(a);
    await j.append(b);
    // A sync tool puts back an older copy that holds only the first line.
    writeFileSync(path, readFileSync(path, 'utf8').split('\n')[0] + '\n');
    expect(await j.refresh()).toBe(true);
    expect(zOf(j.current())).toEqual({ 'a.fits': 0.1, 'b.fits': 0.2 });
    expect(j.warnings.at(-1)).toBe('the journal was cut short or replaced by another program while open here; the 1 verdict made here that it no longer held was written to it again');
    expect(zOf((await VerdictJournal.open(path)).current())).toEqual({ 'a.fits': 0.1, 'b.fits': 0.2 });
    rmSync(path);
    await j.append(c);
    expect(j.warnings.at(-1)).toBe('the journal was deleted by another program while open here; the 2 verdicts made here that it no longer held were written to it again');
    const reopened = await VerdictJournal.open(path);
    expect(reopened.warnings).toEqual([]);
    expect(zOf(reopened.current())).toEqual({ 'a.fits': 0.1, 'b.fits': 0.2, 'c.fits': 0.3 });
  });

  it('serialises concurrent appends: every line whole, memory equal to the replayed file', async () => {
    const path = freshPath();
    const j = await VerdictJournal.open(path);
    const many = Array.from({ length: 60 }, (_, i) => verdict(`s${i % 7}.fits`, i / 100, { note: 'x'.repeat(i * 50) }));
    await Promise.all([...many.map((v) => j.append(v)), j.undo(), ...many.slice(0, 3).map((v) => j.append(v))]);
    const text = readFileSync(path, 'utf8');
    const replay = replayJournal(text, path);
    expect(replay.warnings).toEqual([]);
    expect(text.trim().split('\n')).toHaveLength(64);
    expect(zOf(replay.state.current())).toEqual(zOf(j.current()));
    // In call order: the undo removed many[59] (s3), then many[0..2] were appended again.
    expect(j.current().get('s2.fits')?.z).toBe(0.02);
    expect(j.current().get('s3.fits')?.z).toBe(0.52);
    expect(j.current().get('s5.fits')?.z).toBe(0.54);
  });

  it('after a torn last line, the next verdict starts on a new line and nothing is lost', async () => {
    const path = freshPath();
    writeFileSync(path, serialiseVerdictRecord(verdict('a.fits', 0.1)) + serialiseVerdictRecord(verdict('b.fits', 0.2)).slice(0, 30));
    const j = await VerdictJournal.open(path);
    expect(j.warnings[0]).toMatch(/line 2 \(the last\) is incomplete/);
    await j.append(verdict('c.fits', 0.3));
    const again = await VerdictJournal.open(path);
    expect(zOf(again.current())).toEqual({ 'a.fits': 0.1, 'c.fits': 0.3 });
    expect(again.warnings).toEqual([expect.stringMatching(/line 2 cannot be read/)]);
  });

  it('a full disk rejects with the file and the reason, and memory keeps only what is on disk', async () => {
    const path = freshPath();
    const j = await VerdictJournal.open(path);
    // /dev/full accepts the open and fails every write with ENOSPC (Linux).
    symlinkSync('/dev/full', path);
    await expect(j.append(verdict('a.fits', 0.1))).rejects.toThrow(`the verdict was not saved: ${path}: the disk is full`);
    expect(j.current().size).toBe(0);
    rmSync(path);
    await j.append(verdict('b.fits', 0.2));
    expect(zOf(j.current())).toEqual({ 'b.fits': 0.2 });
    expect(zOf((await VerdictJournal.open(path)).current())).toEqual({ 'b.fits': 0.2 });
  });

  it('a folder where no file may be created rejects the append and keeps memory consistent', async () => {
    // sysfs refuses new files even to root (EACCES, or EROFS where it is mounted read-only).
    const path = '/sys/zvet-test.verdicts.jsonl';
    const j = await VerdictJournal.open(path);
    await expect(j.append(verdict('a.fits', 0.1))).rejects.toThrow(/^the verdict was not saved: \/sys\/zvet-test\.verdicts\.jsonl: (permission denied|the file system is read-only)$/);
    expect(j.current().size).toBe(0);
    await expect(j.undo()).resolves.toBeNull();
  });
});

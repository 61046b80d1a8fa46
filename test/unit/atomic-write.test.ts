// Atomic whole-file writes: the target holds the old or the new content, never a mix, and no
// temporary file is left behind, whether the write succeeds or fails.
import { afterAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { writeFileAtomic } from '../../core/node/atomic-write.js';

const dir = mkdtempSync(join(tmpdir(), 'zvet-atomic-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('writeFileAtomic', () => {
  it('creates and then replaces a file, leaving only the target', async () => {
    const path = join(dir, 'catalogue.csv');
    await writeFileAtomic(path, 'first\n');
    expect(readFileSync(path, 'utf8')).toBe('first\n');
    await writeFileAtomic(path, new Uint8Array([65, 66, 10]));
    expect(readFileSync(path, 'utf8')).toBe('AB\n');
    expect(readdirSync(dir)).toEqual(['catalogue.csv']);
  });

  it('keeps what is at the target and leaves no temporary file when the rename fails', async () => {
    // Renaming a file over a non-empty folder fails (EISDIR/ENOTEMPTY).
    const target = join(dir, 'occupied');
    mkdirSync(target);
    writeFileSync(join(target, 'x'), 'x');
    await expect(writeFileAtomic(target, 'new\n')).rejects.toMatchObject({ code: expect.stringMatching(/EISDIR|ENOTEMPTY|EEXIST/) });
    expect(readdirSync(dir).filter((n) => n.endsWith('.tmp'))).toEqual([]);
    expect(readFileSync(join(target, 'x'), 'utf8')).toBe('x');
  });

  it('fails with the path asked for named (not its temporary file) in a folder where no file may be created', async () => {
    // sysfs refuses new files even to root.
    await expect(writeFileAtomic('/sys/zvet-test.csv', 'x')).rejects.toMatchObject({ path: '/sys/zvet-test.csv' });
  });
});

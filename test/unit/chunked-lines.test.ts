// The measure table's writer: every line arrives, in order, in few writes, and still streams.
import { EventEmitter } from 'node:events';
import { Writable } from 'node:stream';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ChunkedLines } from '../../core/node/cli/chunked-lines.js';

/** A stream that records its writes; `full` makes write() ask the caller to wait for 'drain'. */
class RecordingStream extends EventEmitter {
  writes: string[] = [];
  full = false;
  write(chunk: string): boolean {
    this.writes.push(chunk);
    return !this.full;
  }
}

const asStream = (s: RecordingStream) => s as unknown as NodeJS.WritableStream;

afterEach(() => {
  vi.useRealTimers();
});

describe('ChunkedLines', () => {
  it('delivers every line in order, in far fewer writes than lines', async () => {
    const s = new RecordingStream();
    const w = new ChunkedLines(asStream(s));
    const lines = Array.from({ length: 20000 }, (_, i) => `row ${i},${'x'.repeat(i % 50)}`);
    for (const l of lines) await w.write(l);
    await w.end();
    expect(s.writes.join('')).toBe(lines.map((l) => `${l}\n`).join(''));
    expect(s.writes.length).toBeLessThan(lines.length / 100);
  });

  it('writes held lines out after a short while without waiting for more', async () => {
    vi.useFakeTimers();
    const s = new RecordingStream();
    const w = new ChunkedLines(asStream(s));
    await w.write('first');
    expect(s.writes).toEqual([]);
    await vi.advanceTimersByTimeAsync(1000);
    expect(s.writes).toEqual(['first\n']);
  });

  it('waits for drain when the stream is full, and rejects once the stream has failed', async () => {
    const s = new RecordingStream();
    s.full = true;
    const w = new ChunkedLines(asStream(s));
    const big = 'y'.repeat(70 * 1024);
    let resolved = false;
    const pending = w.write(big).then(() => (resolved = true));
    await new Promise((r) => setImmediate(r));
    expect(s.writes).toEqual([`${big}\n`]);
    expect(resolved).toBe(false);
    s.emit('drain');
    await pending;
    expect(resolved).toBe(true);
    s.emit('error', new Error('EPIPE: the reader went away'));
    await expect(w.write('more')).rejects.toThrow(/EPIPE/);
  });

  it('ends with the stream\'s error, without hanging, when lines were held while a write was failing', async () => {
    // A full disk: each write is taken, then fails a moment later, and the stream is destroyed.
    const full = new Writable({
      highWaterMark: 1 << 20,
      write(_chunk, _enc, done) {
        setImmediate(() => done(Object.assign(new Error('ENOSPC: no space left on device, write'), { code: 'ENOSPC' })));
      },
    });
    const w = new ChunkedLines(full);
    await w.write('z'.repeat(70 * 1024));
    // held before the failure is known
    await w.write('a row written while the disk was filling');
    await new Promise((r) => setImmediate(r));
    await new Promise((r) => setImmediate(r));
    expect(full.destroyed).toBe(true);
    const outcome = await Promise.race([
      w.end().then(() => 'ended', (err: Error) => err.message),
      new Promise<string>((r) => setTimeout(() => r('still waiting after 2 s'), 2000)),
    ]);
    expect(outcome).toMatch(/ENOSPC/);
  });
});

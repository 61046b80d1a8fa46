// While the host measures a worklist in the background, the window asks for the list again:
// soon at first, so a night's suggestions appear within a second or two, then less often, so a
// long batch is not re-listed many times a second, and on every 2.5 s so that verdicts another
// window saves to the same journal appear. Runs the controller on fake timers against a stub
// host; no wall-clock time is measured.
import { afterEach, beforeEach, expect, it, vi } from 'vitest';
import type { HostApi, SpectrumListItem, WorklistState } from '../../core/api/host-api.js';
import type { Verdict } from '../../core/catalogue/verdict.js';
import { Controller, type View } from '../../renderer/app/controller.js';

const ids = ['a.fits', 'b.fits', 'c.fits'];

const othersVerdict: Verdict = { spectrum: 'b.fits', hdu: null, status: 'accepted', z: 0.1, zErr: 1e-4, confidence: 'secure', objectClass: 'galaxy', template: 'passive', note: '', time: '2026-03-14T03:00:00.000Z', user: 'colleague' };

function listing(measured: boolean, othersSaved = false, versionOfB = '1'): WorklistState {
  const items: SpectrumListItem[] = ids.map((id) => ({ id, verdict: othersSaved && id === 'b.fits' ? othersVerdict : null, error: null, suggestion: measured ? { z: 0.1, zErr: 1e-4, confidence: 'secure', template: 'passive' } : null, fileVersion: id === 'b.fits' ? versionOfB : '1' }));
  return { root: '/night', name: 'night', journalPath: '/night/night.verdicts.jsonl', items, warnings: [] };
}

/** A host whose background measuring ends after `listsUntilMeasured` list calls (and another window saves a verdict on b.fits after `listsUntilOthersSave`); records when each came. */
function stubHost(listsUntilMeasured: number, listsUntilOthersSave = Infinity) {
  const listedAt: number[] = [];
  const unused = () => Promise.reject(new Error('not used in this test'));
  const api = new Proxy({}, {
    get: (_t, name: string) => {
      if (name === 'listSpectra') return () => {
        listedAt.push(Date.now());
        return Promise.resolve(listing(listedAt.length > listsUntilMeasured, listedAt.length > listsUntilOthersSave));
      };
      if (name === 'loadSpectrum') return ({ id }: { id: string }) => Promise.resolve({ id, arrays: null, meta: null, measurement: null, templateModel: null, verdict: null, error: `${id}: not read in this test`, measuredWith: {} });
      return unused;
    },
  }) as HostApi;
  return { api, listedAt };
}

const view: View = { panels: () => undefined, spectrum: async () => undefined, correlation: async () => null, fullRange: () => null, focusTypedZ: () => undefined, focusNote: () => undefined };

beforeEach(() => {
  vi.useFakeTimers();
  // The controller waits for a painted frame after drawing; there is no page here.
  vi.stubGlobal('requestAnimationFrame', (done: () => void) => setTimeout(done, 16));
});
afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
});

it('asks for the list again after 0.4 s, then each time 1.5 times later, then every 2.5 s', async () => {
  const { api, listedAt } = stubHost(8);
  void new Controller(api, view).start();
  await vi.advanceTimersByTimeAsync(30_000);
  // listedAt[0] is the opening list; the first spectrum is shown (a frame or so) before polling starts.
  const first = listedAt[1] - listedAt[0];
  expect(first).toBeGreaterThanOrEqual(400);
  expect(first).toBeLessThan(450);
  const gaps = listedAt.slice(2).map((t, i) => t - listedAt[i + 1]);
  expect(gaps.slice(0, 7)).toEqual([600, 900, 1350, 2025, 2500, 2500, 2500]);
  // Once every suggestion is in, the list is still asked for every 2.5 s.
  expect(gaps.length).toBeGreaterThan(10);
  expect(new Set(gaps.slice(4))).toEqual(new Set([2500]));
});

it("shows a verdict another window saved, on the list and on the spectrum in view", async () => {
  const { api } = stubHost(2, 4);
  const controller = new Controller(api, view);
  void controller.start();
  await vi.advanceTimersByTimeAsync(1000);
  expect(controller.s.worklist!.items.find((it) => it.id === 'b.fits')!.verdict).toBeNull();
  void controller.show('b.fits');
  await vi.advanceTimersByTimeAsync(10_000);
  expect(controller.s.worklist!.items.find((it) => it.id === 'b.fits')!.verdict).toEqual(othersVerdict);
  expect(controller.s.view!.verdict).toEqual(othersVerdict);
});

it('starts again at 0.4 s when another worklist is opened', async () => {
  const { api, listedAt } = stubHost(100);
  const controller = new Controller(api, view);
  void controller.start();
  await vi.advanceTimersByTimeAsync(10_000);
  const gapBefore = listedAt[listedAt.length - 1] - listedAt[listedAt.length - 2];
  expect(gapBefore).toBe(2500);
  // Reopened just after a poll, so that none of the old schedule falls in the next 2 s.
  await vi.advanceTimersByTimeAsync(listedAt[listedAt.length - 1] + 2500 + 10 - Date.now());
  const before = listedAt.length;
  void controller.start();
  await vi.advanceTimersByTimeAsync(2000);
  const after = listedAt.slice(before).map((t) => t - listedAt[before]);
  expect(after[1]).toBeGreaterThanOrEqual(400);
  expect(after[1]).toBeLessThan(450);
  expect(after[2] - after[1]).toBe(600);
});

it('keeps a verdict saved here while an older list was on its way', async () => {
  let controller: Controller | null = null;
  let lists = 0;
  const api = new Proxy({}, {
    get: (_t, name: string) => {
      if (name === 'listSpectra') return () => {
        // The third list is slow to come back, and a verdict is saved meanwhile.
        const slow = ++lists === 3;
        if (slow) controller!.decide({ kind: 'no-redshift' });
        return new Promise((done) => setTimeout(() => done(listing(true)), slow ? 300 : 0));
      };
      if (name === 'loadSpectrum') return ({ id }: { id: string }) => Promise.resolve({ id, arrays: null, meta: null, measurement: null, templateModel: null, verdict: null, error: `${id}: not read in this test`, measuredWith: {} });
      if (name === 'saveVerdict') return (input: { id: string }) => Promise.resolve({ verdict: { ...othersVerdict, spectrum: input.id, status: 'no-redshift', z: null, zErr: null, confidence: null, template: null, user: 'observer' } });
      return () => Promise.reject(new Error('not used in this test'));
    },
  }) as HostApi;
  controller = new Controller(api, view);
  void controller.start();
  await vi.advanceTimersByTimeAsync(2000);
  expect(lists).toBeGreaterThanOrEqual(3);
  const shown = controller.s.currentId!;
  expect(controller.s.worklist!.items.find((it) => it.id === shown)!.verdict?.status).toBe('no-redshift');
  expect(controller.s.view!.verdict?.status).toBe('no-redshift');
});

it('reads and measures again a spectrum in view whose file was rewritten on disk, and says so', async () => {
  let lists = 0;
  const loads: string[] = [];
  const api = new Proxy({}, {
    get: (_t, name: string) => {
      // From the fourth list on, b.fits has been re-reduced.
      if (name === 'listSpectra') return () => Promise.resolve(listing(true, false, ++lists >= 4 ? '2' : '1'));
      if (name === 'loadSpectrum') return ({ id }: { id: string }) => (loads.push(id), Promise.resolve({ id, arrays: null, meta: null, measurement: null, templateModel: null, verdict: null, error: `${id}: not read in this test`, measuredWith: {} }));
      return () => Promise.reject(new Error('not used in this test'));
    },
  }) as HostApi;
  const controller = new Controller(api, view);
  void controller.start();
  await vi.advanceTimersByTimeAsync(300);
  void controller.show('b.fits');
  await vi.advanceTimersByTimeAsync(200);
  const before = loads.filter((id) => id === 'b.fits').length;
  await vi.advanceTimersByTimeAsync(5000);
  expect(lists).toBeGreaterThanOrEqual(4);
  expect(loads.filter((id) => id === 'b.fits').length).toBe(before + 1);
  expect(controller.s.message).toBe('b.fits changed on disk: it is shown and measured again as it is now');
});

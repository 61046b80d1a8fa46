// IPC between the window and the main process: the preload exposes exactly the host API, every
// call goes through the same shape check as HTTP, and calls from anything but the app's own
// page, to unknown channels or with wrong types are refused before a handler runs.
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { HOST_METHODS, type HostApi } from '../../core/api/host-api';
import { channelFor, methodOfChannel } from '../../electron/ipc-channels';
import { routeIpcCall, type IpcReply } from '../../electron/ipc-route';
import { buildPreloadApi } from '../../electron/preload-api';
import { APP_START_URL } from '../../electron/window-options';
import { ROOT } from '../support/paths';

/** A host whose every method records its call and answers with its own name. */
function recordingHost() {
  const calls: [string, unknown][] = [];
  const api = Object.fromEntries(HOST_METHODS.map((m) => [m, async (req: unknown) => (calls.push([m, req]), { answeredBy: m })])) as unknown as HostApi;
  return { api, calls };
}

describe('IPC routing in the main process', () => {
  it('routes a well-formed call from the app page to its handler', async () => {
    const { api, calls } = recordingHost();
    const reply = await routeIpcCall(api, 'loadSpectrum', APP_START_URL, { id: 'KRT-26-0011.fits' });
    expect(reply).toEqual({ ok: true, result: { answeredBy: 'loadSpectrum' } });
    expect(calls).toEqual([['loadSpectrum', { id: 'KRT-26-0011.fits' }]]);
  });

  it.each([undefined, '', 'https://example.org/', 'file:///app/dist/renderer/index.html', 'zvet://other/index.html', 'devtools://devtools/bundled/inspector.html'])(
    'refuses a call from %s',
    async (sender) => {
      const { api, calls } = recordingHost();
      const reply = await routeIpcCall(api, 'getSettings', sender, {});
      expect(reply).toMatchObject({ ok: false, error: { status: 403 } });
      expect(calls).toEqual([]);
    },
  );

  it.each(['deleteEverything', '__proto__', 'constructor', 'toString'])('refuses the unknown method %s', async (method) => {
    const { api, calls } = recordingHost();
    const reply = await routeIpcCall(api, method, APP_START_URL, {});
    expect(reply).toMatchObject({ ok: false, error: { status: 404 } });
    expect(calls).toEqual([]);
  });

  it.each([
    ['loadSpectrum', { id: 42 }, /id: expected a string/],
    ['loadSpectrum', '/etc/passwd', /expected an object/],
    ['saveVerdict', { id: 'a', status: 'accepted' }, /z: missing/],
    ['exportCatalogue', { format: 'csv', path: 7 }, /path: expected a string/],
    ['putSettings', { sites: 'all' }, /sites: expected an array/],
  ])('refuses %s with %j before any handler runs', async (method, body, reason) => {
    const { api, calls } = recordingHost();
    const reply = (await routeIpcCall(api, method, APP_START_URL, body)) as Extract<IpcReply, { ok: false }>;
    expect(reply.ok).toBe(false);
    expect(reply.error.status).toBe(400);
    expect(reply.error.error).toMatch(reason);
    expect(calls).toEqual([]);
  });

  it('turns a handler crash into a one-line 500, never a thrown error', async () => {
    const { api } = recordingHost();
    (api as unknown as Record<string, unknown>).listSpectra = async () => {
      throw new Error('boom\n    at somewhere');
    };
    expect(await routeIpcCall(api, 'listSpectra', APP_START_URL, {})).toEqual({ ok: false, error: { error: 'listSpectra failed: boom', status: 500 } });
  });
});

describe('preload API', () => {
  it('has exactly the host methods, frozen, each on its own channel', async () => {
    const sent: [string, unknown][] = [];
    const api = buildPreloadApi(async (channel, request) => (sent.push([channel, request]), { ok: true, result: channel }));
    expect(Object.keys(api).sort()).toEqual([...HOST_METHODS].sort());
    expect(Object.isFrozen(api)).toBe(true);
    for (const m of HOST_METHODS) {
      expect(await (api[m] as (r: unknown) => Promise<unknown>)({})).toBe(channelFor(m));
      expect(methodOfChannel(channelFor(m))).toBe(m);
    }
    expect(sent.map(([c]) => c)).toEqual(HOST_METHODS.map(channelFor));
  });

  it('rejects with the HostError value, the same shape the HTTP transport sends', async () => {
    const api = buildPreloadApi(async () => ({ ok: false, error: { error: 'KRT-26-0099.fits: not a spectrum of the open worklist', status: 404 } }));
    await expect(api.loadSpectrum({ id: 'KRT-26-0099.fits' })).rejects.toEqual({ error: 'KRT-26-0099.fits: not a spectrum of the open worklist', status: 404 });
  });

  it('the preload exposes only window.zvetHost, and main routes one channel per host method', () => {
    const preload = readFileSync(resolve(ROOT, 'electron/preload.ts'), 'utf8');
    expect(preload.match(/exposeInMainWorld\(/g)).toHaveLength(1);
    expect(preload).toMatch(/exposeInMainWorld\(\s*'zvetHost'/);
    const main = readFileSync(resolve(ROOT, 'electron/main.ts'), 'utf8');
    expect(main).toMatch(/for \(const method of HOST_METHODS\)[\s\S]*ipcMain\.handle\(channelFor\(method\)[\s\S]*routeIpcCall\(handlers, method, event\.senderFrame\?\.url, request\)/);
  });
});

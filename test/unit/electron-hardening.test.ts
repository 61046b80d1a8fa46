// Electron hardening, tested on the pure pieces (no Electron binary here). The settings follow
// Electron's own security checklist (electronjs.org/docs/latest/tutorial/security): context
// isolation, sandbox, no Node integration, web security on, navigation and new windows refused,
// a CSP, and IPC senders validated.
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it, vi } from 'vitest';
import { hardenWebContents, type HardenableContents, type PreventableEvent } from '../../electron/harden';
import { APP_START_URL, buildWindowOptions, isAllowedRequest, isAppUrl } from '../../electron/window-options';
import { CONTENT_SECURITY_POLICY, SECURITY_HEADERS } from '../../core/node/host/security-headers';
import { ROOT } from '../support/paths';

describe('window options', () => {
  const options = buildWindowOptions({ preloadPath: '/app/dist/electron/preload.cjs' });
  const web = options.webPreferences!;

  it('isolates and sandboxes the page, with no Node and web security on', () => {
    expect(web.contextIsolation).toBe(true);
    expect(web.sandbox).toBe(true);
    expect(web.nodeIntegration).toBe(false);
    expect(web.nodeIntegrationInWorker).toBe(false);
    expect(web.nodeIntegrationInSubFrames).toBe(false);
    expect(web.webSecurity).toBe(true);
    expect(web.allowRunningInsecureContent).toBe(false);
    expect(web.webviewTag).toBe(false);
    expect(web.preload).toBe('/app/dist/electron/preload.cjs');
  });

  it('loads the app from its own scheme, never file:// or the network', () => {
    expect(isAppUrl(APP_START_URL)).toBe(true);
    for (const url of ['https://example.org/', 'http://127.0.0.1:8080/', 'file:///etc/passwd', 'zvet://evil/index.html', 'javascript:alert(1)', 'not a url']) {
      expect(isAppUrl(url), url).toBe(false);
      expect(isAllowedRequest(url), url).toBe(false);
    }
    expect(isAllowedRequest('zvet://app/plotly.min.js')).toBe(true);
    expect(isAllowedRequest('data:image/png;base64,AAAA')).toBe(true);
  });

  it('serves the window with the same strict CSP as browser mode', () => {
    expect(SECURITY_HEADERS['Content-Security-Policy']).toBe(CONTENT_SECURITY_POLICY);
    for (const d of ["default-src 'self'", "script-src 'self'", "object-src 'none'", "frame-ancestors 'none'", "base-uri 'none'", "connect-src 'self'"]) {
      expect(CONTENT_SECURITY_POLICY).toContain(d);
    }
    expect(CONTENT_SECURITY_POLICY).not.toMatch(/script-src[^;]*('unsafe-inline'|'unsafe-eval'|\*)/);
    const main = readFileSync(resolve(ROOT, 'electron/main.ts'), 'utf8');
    expect(main).toMatch(/SECURITY_HEADERS/);
  });
});

describe('web contents hardening', () => {
  function fakeContents() {
    const listeners = new Map<string, (e: PreventableEvent, ...rest: unknown[]) => void>();
    let openHandler: ((d: { url: string }) => { action: string }) | null = null;
    const contents: HardenableContents = {
      on: (event, listener) => listeners.set(event, listener),
      setWindowOpenHandler: (h) => (openHandler = h),
    };
    return { contents, listeners, open: (url: string) => openHandler!({ url }) };
  }

  it.each(['will-navigate', 'will-redirect', 'will-attach-webview'])('prevents %s', (event) => {
    const fake = fakeContents();
    hardenWebContents(fake.contents);
    const preventDefault = vi.fn();
    fake.listeners.get(event)!({ preventDefault }, 'https://example.org/');
    expect(preventDefault).toHaveBeenCalledOnce();
  });

  it('denies every new window', () => {
    const fake = fakeContents();
    hardenWebContents(fake.contents);
    for (const url of ['https://example.org/', APP_START_URL, 'about:blank']) expect(fake.open(url)).toEqual({ action: 'deny' });
  });

  it('is applied to every web contents the app creates', () => {
    const main = readFileSync(resolve(ROOT, 'electron/main.ts'), 'utf8');
    expect(main).toMatch(/app\.on\('web-contents-created',\s*\(_event, contents\) => hardenWebContents\(contents\)\)/);
  });
});

/**
 * The desktop window's options, built in one pure function so the hardening can be tested
 * without the Electron binary: the page gets no Node, runs sandboxed and isolated from the
 * preload, keeps web security, and may load nothing but the app's own files.
 */
import type { BrowserWindowConstructorOptions } from 'electron';

/** The custom scheme the window's files are served from (never file:// or the network). */
export const APP_SCHEME = 'zvet';
export const APP_ORIGIN = `${APP_SCHEME}://app`;
export const APP_START_URL = `${APP_ORIGIN}/index.html`;

export interface WindowOptionsInput {
  preloadPath: string;
  iconPath?: string;
}

export function buildWindowOptions(input: WindowOptionsInput): BrowserWindowConstructorOptions {
  return {
    width: 1440,
    height: 900,
    minWidth: 960,
    minHeight: 600,
    title: 'zvet',
    // Dim-room friendly: no white flash before the page paints.
    backgroundColor: '#11151c',
    show: false,
    ...(input.iconPath ? { icon: input.iconPath } : {}),
    webPreferences: {
      preload: input.preloadPath,
      contextIsolation: true,
      sandbox: true,
      nodeIntegration: false,
      nodeIntegrationInWorker: false,
      nodeIntegrationInSubFrames: false,
      webSecurity: true,
      allowRunningInsecureContent: false,
      webviewTag: false,
      experimentalFeatures: false,
      navigateOnDragDrop: false,
      spellcheck: false,
      devTools: true,
    },
  };
}

/** True only for the app's own pages; everything else (web, file://, other schemes) is refused. */
export function isAppUrl(url: string): boolean {
  try {
    const u = new URL(url);
    return u.protocol === `${APP_SCHEME}:` && u.host === 'app';
  } catch {
    return false;
  }
}

/** Requests the window may make: its own files, plus the in-memory URLs plotly uses for images. */
export function isAllowedRequest(url: string): boolean {
  return isAppUrl(url) || url.startsWith('data:') || url.startsWith('blob:zvet://app/') || url.startsWith('devtools://');
}

/**
 * Locks down every web contents the app creates: no navigation away from the loaded page, no new
 * windows, no <webview>. Written against the few members it uses so tests can drive it without
 * the Electron binary.
 */
export interface PreventableEvent {
  preventDefault(): void;
}

export interface HardenableContents {
  on(event: 'will-navigate' | 'will-redirect' | 'will-attach-webview', listener: (event: PreventableEvent, ...rest: unknown[]) => void): unknown;
  setWindowOpenHandler(handler: (details: { url: string }) => { action: 'deny' }): void;
}

export function hardenWebContents(contents: HardenableContents): void {
  const refuse = (event: PreventableEvent) => event.preventDefault();
  contents.on('will-navigate', refuse);
  contents.on('will-redirect', refuse);
  contents.on('will-attach-webview', refuse);
  contents.setWindowOpenHandler(() => ({ action: 'deny' }));
}

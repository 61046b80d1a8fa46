// Opens the window in Debian's Chromium (playwright-core, fresh profile) and records every
// request the page makes, so a test can fail on any that leaves the loopback host.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { CHROMIUM_ARGS, requireChromium } from '../support/tools';

export interface WindowSession {
  page: Page;
  context: BrowserContext;
  /** Every URL the page asked for, in order. */
  requests: string[];
  /** Console errors and uncaught page errors. */
  errors: string[];
  close(): Promise<void>;
}

export async function openWindow(url: string, viewport = { width: 1600, height: 1000 }): Promise<WindowSession> {
  const profile = mkdtempSync(join(tmpdir(), 'zvet-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: requireChromium(),
    args: CHROMIUM_ARGS,
    headless: true,
    viewport,
    deviceScaleFactor: 1,
  });
  const page = context.pages()[0] ?? (await context.newPage());
  const requests: string[] = [];
  const errors: string[] = [];
  context.on('request', (r) => requests.push(r.url()));
  page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto(url);
  return {
    page, context, requests, errors,
    close: async () => {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Waits until the spectrum with this id is drawn (the window stamps the plot when it is). */
export async function waitDrawn(page: Page, id: string): Promise<void> {
  await page.waitForFunction((want) => document.getElementById('spectrum-plot')?.dataset.spectrum === want, id, { timeout: 30_000 });
}

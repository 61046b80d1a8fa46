// Browser mode started without a folder: the window offers to open one, and then shows it.
import { cpSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { DEMO_WORKLIST, ROOT } from '../support/paths';
import { startServe, type ServeProcess } from '../unit/server-harness';
import { openWindow, waitDrawn, type WindowSession } from './browser';

let tmp: string;
let server: ServeProcess;
let win: WindowSession;

beforeAll(async () => {
  tmp = mkdtempSync(join(tmpdir(), 'zvet-e2e-open-'));
  cpSync(DEMO_WORKLIST, join(tmp, 'night'), { recursive: true });
  server = await startServe(null, join(tmp, 'config'));
  win = await openWindow(server.url);
}, 60_000);

afterAll(async () => {
  await win?.close();
  await server?.stop();
  if (tmp) rmSync(tmp, { recursive: true, force: true });
});

it('opens a worklist typed into the window', async () => {
  const { page } = win;
  await page.waitForSelector('#open-path');
  await page.fill('#open-path', join(tmp, 'night', 'no-such-folder'));
  await page.press('#open-path', 'Enter');
  await expect.poll(() => page.locator('.save-state').textContent()).toContain('no such file or folder');
  await page.fill('#open-path', join(tmp, 'night'));
  await page.press('#open-path', 'Enter');
  await waitDrawn(page, 'KRT-26-0011.fits');
  expect(await page.locator('#worklist-items li[data-id]').count()).toBe(13);
  mkdirSync(join(ROOT, 'test-artifacts'), { recursive: true });
  await page.screenshot({ path: join(ROOT, 'test-artifacts', 'opened-from-window.png') });
});

it('says so when a folder holds no spectrum files, and offers no decision', async () => {
  const empty = join(tmp, 'empty-night');
  mkdirSync(empty);
  const emptyServer = await startServe(empty, join(tmp, 'config-empty'));
  const emptyWin = await openWindow(emptyServer.url);
  try {
    const { page } = emptyWin;
    await expect.poll(() => page.locator('#empty-list').textContent()).toContain(`no spectrum files in ${empty}`);
    expect(await page.locator('#btn-no-z').isDisabled()).toBe(true);
    expect(emptyWin.errors).toEqual([]);
  } finally {
    await emptyWin.close();
    await emptyServer.stop();
  }
});

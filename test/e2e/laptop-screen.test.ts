// The window on a laptop screen (1366 × 768, common practice for the smallest screen we design
// for, no source): nothing covers anything else, and the plots follow their boxes when the side
// column widens or the window is resized.
import { cpSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { DEMO_WORKLIST, ROOT } from '../support/paths';
import { startServe, type ServeProcess } from '../unit/server-harness';
import { openWindow, waitDrawn, type WindowSession } from './browser';

let tmp: string;
let server: ServeProcess;
let win: WindowSession;

beforeAll(async () => {
  tmp = mkdtempSync(join(tmpdir(), 'zvet-e2e-laptop-'));
  cpSync(DEMO_WORKLIST, join(tmp, 'night'), { recursive: true });
  server = await startServe(join(tmp, 'night'), join(tmp, 'config'));
  win = await openWindow(server.url, { width: 1366, height: 768 });
  await waitDrawn(win.page, 'KRT-26-0011.fits');
}, 60_000);

afterAll(async () => {
  await win?.close();
  await server?.stop();
  if (tmp) rmSync(tmp, { recursive: true, force: true });
});

interface Box { top: number; bottom: number; left: number; right: number; width: number }

/** Where the parts of the centre column are drawn, in CSS pixels. */
function centreBoxes(page: Page) {
  return page.evaluate(() => {
    const box = (sel: string): Box => {
      const r = document.querySelector(sel)!.getBoundingClientRect();
      return { top: r.top, bottom: r.bottom, left: r.left, right: r.right, width: r.width };
    };
    const candidates = document.getElementById('candidates')!;
    return {
      plotBox: box('#spectrum-plot'),
      svg: box('#spectrum-plot .main-svg'),
      xTitle: box('#spectrum-plot .xtitle'),
      legend: box('#spectrum-plot .legend'),
      controls: box('#plot-controls'),
      correlation: box('#correlation-plot .main-svg'),
      candidatesOverflowPx: candidates.scrollWidth - candidates.clientWidth,
    };
  });
}

/** Pairs of line labels on the spectrum whose drawn text overlaps (by more than a pixel). */
function overlappingLabels(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const labels = [...document.querySelectorAll('#spectrum-plot .scatterlayer .textpoint text')].map((t) => ({ text: t.textContent ?? '', r: t.getBoundingClientRect() }));
    const pairs: string[] = [];
    for (let i = 0; i < labels.length; i++) {
      for (let j = i + 1; j < labels.length; j++) {
        const a = labels[i].r, b = labels[j].r;
        if (a.left < b.right - 1 && b.left < a.right - 1 && a.top < b.bottom - 1 && b.top < a.bottom - 1) pairs.push(`${labels[i].text} / ${labels[j].text}`);
      }
    }
    return pairs;
  });
}

/** The plots are fitted on the next animation frames after their boxes change. */
async function expectLaidOut(page: Page): Promise<void> {
  await expect.poll(async () => {
    const b = await centreBoxes(page);
    return Math.abs(b.svg.width - b.plotBox.width) <= 1 && b.svg.bottom <= b.controls.top + 1;
  }, { timeout: 10_000 }).toBe(true);
  const b = await centreBoxes(page);
  expect(b.legend.top, 'the legend sits below the axis title').toBeGreaterThanOrEqual(b.xTitle.bottom - 1);
  expect(b.legend.bottom, 'and inside the figure').toBeLessThanOrEqual(b.svg.bottom + 1);
  expect(b.candidatesOverflowPx, 'the candidates table fits its panel').toBeLessThanOrEqual(0);
  // Narrower, its peaks and z axis cannot be read (at 1280 × 720 with the host panel it was 104 px).
  expect(b.correlation.width, 'the correlation plot keeps a readable width').toBeGreaterThanOrEqual(180);
  // Label rows have a fixed height in px: a short plot gets fewer rows, not rows that overlap.
  await expect.poll(() => overlappingLabels(page), { timeout: 5_000 }).toEqual([]);
}

it('lays the spectrum, its controls and the candidates out without overlap', async () => {
  await expectLaidOut(win.page);
  // Where the spectrum runs through a label, a halo of the ground colour keeps it readable.
  const halo = await win.page.evaluate(() => {
    const t = document.querySelector('#spectrum-plot .scatterlayer .textpoint text')!;
    const st = getComputedStyle(t);
    return { paintOrder: st.paintOrder, stroke: st.stroke, ground: getComputedStyle(document.body).backgroundColor };
  });
  expect(halo.paintOrder.startsWith('stroke')).toBe(true);
  expect(halo.stroke).toBe(halo.ground);
  mkdirSync(join(ROOT, 'test-artifacts'), { recursive: true });
  await win.page.screenshot({ path: join(ROOT, 'test-artifacts', 'laptop-main.png') });
});

it('fits the plots again when the host panel widens the side column', async () => {
  const before = await centreBoxes(win.page);
  await win.page.keyboard.press('h');
  await expect.poll(async () => (await centreBoxes(win.page)).plotBox.width).toBeLessThan(before.plotBox.width - 50);
  await expectLaidOut(win.page);
  await win.page.screenshot({ path: join(ROOT, 'test-artifacts', 'laptop-host.png') });
});

it('fits the plots again when the window is resized', async () => {
  await win.page.setViewportSize({ width: 1600, height: 1000 });
  await expect.poll(async () => (await centreBoxes(win.page)).plotBox.width).toBeGreaterThan(700);
  await expectLaidOut(win.page);
});

it('keeps the correlation readable on a 1280 × 720 screen (1920 × 1080 at 150 %) with the host panel open', async () => {
  await win.page.setViewportSize({ width: 1280, height: 720 });
  if (!(await win.page.locator('.layout.wide-side').count())) await win.page.keyboard.press('h');
  await expect.poll(() => win.page.locator('.layout.wide-side').count()).toBe(1);
  await expectLaidOut(win.page);
  await win.page.screenshot({ path: join(ROOT, 'test-artifacts', 'small-screen-host.png') });
  await win.page.setViewportSize({ width: 1366, height: 768 });
});

it('keeps the spectrum plot in place while the first spectrum loads', async () => {
  // Every animation frame from the first drawing on, where the plot's box starts: the line of
  // file facts above it arriving after the first drawing once pushed it down by a line and the
  // legend over the plot controls, until the next refit.
  await win.page.addInitScript(() => {
    const tops: number[] = [];
    (window as unknown as { plotTops: number[] }).plotTops = tops;
    const record = () => {
      const plot = document.getElementById('spectrum-plot');
      if (plot?.querySelector('.main-svg')) tops.push(plot.getBoundingClientRect().top);
      requestAnimationFrame(record);
    };
    requestAnimationFrame(record);
  });
  await win.page.reload();
  await win.page.waitForFunction(() => !!document.getElementById('spectrum-plot')?.dataset.spectrum, undefined, { timeout: 30_000 });
  await expectLaidOut(win.page);
  const tops = await win.page.evaluate(() => (window as unknown as { plotTops: number[] }).plotTops);
  expect(tops.length).toBeGreaterThan(0);
  expect(Math.max(...tops) - Math.min(...tops), 'the plot box moved while the spectrum loaded (px)').toBeLessThanOrEqual(1);
});

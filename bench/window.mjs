// Window benchmark (prints figures, asserts nothing): time from the "next" key to the spectrum
// and its line markers drawn (performance marks zvet:next → zvet:drawn, measured in the page),
// and cold start of browser mode to the first plot. Runs the real `zvet serve` and Debian's
// Chromium on temporary copies of the demo worklist and of the open survey spectra.
//   npm run bench:window
import { execFileSync } from 'node:child_process';
import { cpSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
execFileSync(process.execPath, [join(root, 'scripts/build.mjs')], { cwd: root, stdio: 'inherit' });
// The browser and server helpers of the end-to-end tests, bundled so this plain script can use them.
const harness = join(root, 'dist/bench/window-harness.mjs');
await build({
  stdin: { contents: "export * from './test/e2e/browser.ts'; export * from './test/unit/server-harness.ts';", resolveDir: root, loader: 'ts' },
  bundle: true, platform: 'node', format: 'esm', target: 'node20', packages: 'external', outfile: harness, logLevel: 'warning',
  banner: { js: "import { fileURLToPath as __f } from 'node:url'; import { dirname as __d } from 'node:path'; const __dirname = __d(__f(import.meta.url));" },
});
const { openWindow, startServe } = await import(harness);

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor((xs.length - 1) / 2)];
const p95 = (xs) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.ceil(0.95 * xs.length) - 1)];
const fmt = (ms) => `${ms.toFixed(1)} ms`;

async function hostCall(server, method, body) {
  const res = await fetch(`http://127.0.0.1:${server.port}/api/${method}`, { method: 'POST', headers: { 'Content-Type': 'application/json', 'X-Zvet-Token': server.token }, body: JSON.stringify(body) });
  return res.json();
}

async function waitMeasured(server) {
  for (;;) {
    const state = await hostCall(server, 'listSpectra', {});
    if (state.items.every((it) => it.suggestion || it.error)) return state.items.length;
    await new Promise((r) => setTimeout(r, 300));
  }
}

/** Milliseconds from navigation to the first plot, and to the steps before it. */
async function firstPlot(page) {
  await page.waitForFunction(() => performance.getEntriesByName('zvet:first-plot').length > 0, null, { timeout: 60_000 });
  return page.evaluate(() => {
    const at = (name) => performance.getEntriesByName(name)[0]?.startTime ?? NaN;
    const nav = performance.getEntriesByType('navigation')[0];
    return { plot: at('zvet:first-plot'), html: nav.responseEnd, worklist: at('zvet:worklist'), plotly: at('zvet:plotly-ready') };
  });
}
const steps = (t) => `page ${fmt(t.html)}, worklist listed ${fmt(t.worklist)}, plotly ready ${fmt(t.plotly)}`;

async function benchWorklist(label, source, only) {
  const tmp = mkdtempSync(join(tmpdir(), 'zvet-bench-'));
  const folder = join(tmp, 'worklist');
  cpSync(source, folder, { recursive: true, filter: (p) => !only || p === source || only(p) });
  const files = readdirSync(folder).length;

  // Cold start: from spawning `zvet serve` to the first spectrum drawn in a fresh browser.
  const t0 = performance.now();
  const cold = await startServe(folder, join(tmp, 'config'));
  const coldWin = await openWindow(cold.url);
  const coldPageMs = await firstPlot(coldWin.page);
  const coldWallMs = performance.now() - t0;
  await coldWin.close();

  // Warm host (every spectrum measured once), fresh browser: page load to first plot, then next.
  const n = await waitMeasured(cold);
  const win = await openWindow(cold.url);
  const warmPageMs = await firstPlot(win.page);
  const page = win.page;
  const latencies = [];
  const fetches = [];
  const step = async (key) => {
    const before = await page.evaluate(() => performance.getEntriesByName('zvet:next-to-drawn').length);
    await page.keyboard.press(key);
    await page.waitForFunction((k) => performance.getEntriesByName('zvet:next-to-drawn').length > k, before, { timeout: 30_000 });
    const [drawn, loaded] = await page.evaluate(() => ['zvet:next-to-drawn', 'zvet:next-to-loaded'].map((n) => performance.getEntriesByName(n).at(-1).duration));
    latencies.push(drawn);
    fetches.push(loaded);
    await page.waitForTimeout(250); // a person's pace: time for the prefetch of the next spectrum
  };
  for (let round = 0; latencies.length < 24; round++) {
    for (let i = 0; i < n - 1 && latencies.length < 24; i++) await step('n');
    for (let i = 0; i < n - 1 && latencies.length < 24; i++) await step('p');
  }
  await page.reload();
  const reloadMs = await firstPlot(page);
  const pixels = await page.evaluate(() => document.getElementById('spectrum-plot').data?.[2]?.x?.length ?? 0);
  await win.close();
  await cold.stop();
  rmSync(tmp, { recursive: true, force: true });
  console.log(`\n${label}: ${files} files, ${n} spectra in the list (last one drawn: ${pixels} pixels)`);
  console.log(`  next → spectrum and markers drawn, ${latencies.length} moves: median ${fmt(median(latencies))}, p95 ${fmt(p95(latencies))}, max ${fmt(Math.max(...latencies))}`);
  console.log(`    of which waiting for the spectrum from the host or the prefetch: median ${fmt(median(fetches))}, p95 ${fmt(p95(fetches))}`);
  console.log(`  cold start, zvet serve spawned → first plot: ${fmt(coldWallMs)} (navigation → first plot ${fmt(coldPageMs.plot)}; ${steps(coldPageMs)})`);
  console.log(`  warm host, navigation → first plot: ${fmt(warmPageMs.plot)} (${steps(warmPageMs)})`);
  console.log(`  reload in the same browser profile → first plot: ${fmt(reloadMs.plot)} (${steps(reloadMs)})`);
}

console.log(`load average at start: ${(await import('node:os')).loadavg().map((l) => l.toFixed(1)).join(' ')} on ${(await import('node:os')).cpus().length} cores`);
await benchWorklist('demo worklist (sample-spectra/kestrel-2026-03-14)', join(root, 'sample-spectra/kestrel-2026-03-14'));
await benchWorklist('open survey spectra (SDSS, ../shared/spectra-open/sdss)', join(root, '../shared/spectra-open/sdss'), (p) => /spec-.*\.fits$/.test(p));

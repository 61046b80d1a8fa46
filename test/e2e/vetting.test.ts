// End to end: the real `zvet serve` on a copy of the demo worklist, driven in Debian's Chromium.
// Four spectra are vetted by keyboard (accept the best; another candidate; a line identified by
// clicking; no redshift), the page is reloaded and all four must come back from the journal,
// and the catalogue is exported in all three formats and read back with astropy (ECSV, FITS) and
// checked by fitsverify (FITS). No request may leave 127.0.0.1. Screenshots go to test-artifacts/.
import { execFileSync } from 'node:child_process';
import { cpSync, mkdirSync, mkdtempSync, readFileSync, renameSync, rmdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_WORKLIST, ROOT } from '../support/paths';
import { astropyJson, fitsverify } from '../support/tools';
import { startServe, type ServeProcess } from '../unit/server-harness';
import { openWindow, waitDrawn, type WindowSession } from './browser';

const ARTIFACTS = join(ROOT, 'test-artifacts');
const O3_REST = 5008.24; // [O III] vacuum, DESIGN.md check value
/** True z of the demo AGN host, from the demo's own record (sample-spectra/truth.csv). */
const AGN_TRUE_Z = Number(
  readFileSync(join(ROOT, 'sample-spectra/truth.csv'), 'utf8').split('\n').find((l) => l.startsWith('KRT-26-0014.fits,'))!.split(',')[3],
);

let tmp: string;
let server: ServeProcess;
let win: WindowSession;
let page: Page;

async function shot(name: string): Promise<void> {
  await page.waitForTimeout(150);
  await page.screenshot({ path: join(ARTIFACTS, `${name}.png`) });
}

async function press(key: string): Promise<void> {
  await page.keyboard.press(key);
}

/** Moves with the "next" key until the spectrum is in view (and its panels drawn). */
async function nextUntil(id: string): Promise<void> {
  const shownId = () => page.locator('#spectrum-plot').getAttribute('data-spectrum');
  for (let i = 0; i < 20 && (await shownId()) !== id; i++) {
    const before = await shownId();
    await press('n');
    await page.waitForFunction((b) => document.getElementById('spectrum-plot')?.dataset.spectrum !== b, before);
  }
  await waitDrawn(page, id);
  await page.waitForFunction((want) => document.querySelector('#worklist-items [aria-current="true"]')?.getAttribute('data-id') === want, id);
}

/** Waits until the host has confirmed the journal write for the spectrum in view. */
async function savedAs(status: string): Promise<{ z: number | null }> {
  await page.waitForFunction((s) => {
    const box = document.getElementById('verdict-now');
    return !!box && box.textContent!.startsWith(s) && !box.textContent!.includes('saving') && !document.querySelector('.save-state .saving');
  }, status, { timeout: 20_000 });
  const z = await page.locator('#verdict-now').getAttribute('data-z');
  return { z: z === 'null' || z === null ? null : Number(z) };
}

async function candidateZ(index: number): Promise<number> {
  const cell = page.locator('#candidates tbody tr').nth(index).locator('td').nth(1);
  return Number(((await cell.textContent()) ?? '').split('±')[0]);
}

beforeAll(async () => {
  execFileSync(process.execPath, [join(ROOT, 'scripts/build.mjs')], { cwd: ROOT, stdio: 'inherit' });
  mkdirSync(ARTIFACTS, { recursive: true });
  tmp = mkdtempSync(join(tmpdir(), 'zvet-e2e-'));
  cpSync(DEMO_WORKLIST, join(tmp, 'night'), { recursive: true });
  server = await startServe(join(tmp, 'night'), join(tmp, 'config'));
  win = await openWindow(server.url);
  page = win.page;
}, 120_000);

afterAll(async () => {
  await win?.close();
  await server?.stop();
  if (tmp) rmSync(tmp, { recursive: true, force: true });
});

describe('vetting in the window', () => {
  /** What the journal holds for each vetted spectrum (z exactly as saved). */
  const vetted: Record<string, { status: string; z: number | null }> = {};

  it('opens on the first pending spectrum with its plot, markers, candidates and the caution', async () => {
    await waitDrawn(page, 'KRT-26-0011.fits');
    await expect.poll(() => page.locator('#candidates tbody tr').count()).toBeGreaterThan(1);
    expect(await page.locator('.caution').textContent()).toContain('suggestions until you vet them');
    expect(await page.locator('#progress').textContent()).toContain('0 of 13 vetted');
    // Line marker labels carry a glyph: ▲ emission (top), ▼ absorption (bottom).
    const labels = await page.locator('#spectrum-plot .textpoint').allTextContents();
    expect(labels.some((t) => t.startsWith('▲'))).toBe(true);
    expect(labels.some((t) => t.startsWith('▼'))).toBe(true);
    await page.waitForSelector('#tab-body dl');
    await shot('main-view');
  });

  it('follows a change of cosmology preset in the derived panel', async () => {
    const luminosity = () => page.locator('#tab-body dt:text-is("luminosity") + dd').textContent();
    await expect.poll(luminosity).toMatch(/Mpc$/);
    const before = Number.parseFloat((await luminosity()) ?? '');
    await page.selectOption('#cosmology', 'round70');
    await expect.poll(() => page.locator('#tab-body h2').nth(1).textContent()).toContain('round70');
    expect(await page.locator('#cosmology-about').textContent()).toMatch(/^H0 = 70 km\/s\/Mpc, Ωm = 0.3, ΩΛ = 0.7\. /);
    // H0 = 70 instead of 67.66 km/s/Mpc: distances shrink by about 67.66/70 at low z.
    const after = Number.parseFloat((await luminosity()) ?? '');
    expect(after / before).toBeGreaterThan(0.94);
    expect(after / before).toBeLessThan(0.99);
    await page.selectOption('#cosmology', 'planck18');
    await expect.poll(() => page.locator('#tab-body h2').nth(1).textContent()).toContain('planck18');
  });

  it('zooms, pans and smooths by key, with the rest-frame axis following at λ/(1+z)', async () => {
    const axes = () => page.evaluate(() => {
      const gd = document.getElementById('spectrum-plot') as HTMLElement & { _fullLayout: any; data: any[] };
      return { x: gd._fullLayout.xaxis.range as number[], x2: gd._fullLayout.xaxis2.range as number[], z: Number(gd.dataset.z), flux: gd.data[1].name as string };
    });
    const full = await axes();
    await press('=');
    await press('ArrowRight');
    await expect.poll(async () => (await axes()).x[1] - (await axes()).x[0]).toBeLessThan(0.7 * (full.x[1] - full.x[0]));
    const zoomed = await axes();
    expect(zoomed.x[0]).toBeGreaterThan(full.x[0]);
    for (const i of [0, 1]) expect(zoomed.x2[i]).toBeCloseTo(zoomed.x[i] / (1 + zoomed.z), 6);
    await press(']');
    await expect.poll(async () => (await axes()).flux).toBe('flux (boxcar 3 px)');
    await press('k');
    await expect.poll(async () => (await axes()).flux).toBe('flux (gaussian 3 px)');
    await press('[');
    await press('k');
    await press('0');
    await expect.poll(async () => (await axes()).x).toEqual(full.x);
    expect((await axes()).flux).toBe('flux');
    // By mouse: a box drag over the middle fifth zooms in, and the rest axis follows again.
    const box = (await page.locator('#spectrum-plot .nsewdrag').first().boundingBox())!;
    await page.mouse.move(box.x + 0.4 * box.width, box.y + 0.5 * box.height);
    await page.mouse.down();
    await page.mouse.move(box.x + 0.5 * box.width, box.y + 0.52 * box.height, { steps: 5 });
    await page.mouse.move(box.x + 0.6 * box.width, box.y + 0.55 * box.height, { steps: 5 });
    await page.mouse.up();
    await expect.poll(async () => (await axes()).x[1] - (await axes()).x[0]).toBeLessThan(0.3 * (full.x[1] - full.x[0]));
    const dragged = await axes();
    for (const i of [0, 1]) expect(dragged.x2[i]).toBeCloseTo(dragged.x[i] / (1 + dragged.z), 6);
    await press('0');
    await expect.poll(async () => (await axes()).x).toEqual(full.x);
  });

  it('accepts the best candidate with one key, saving the z it shows', async () => {
    const best = await candidateZ(0);
    const shown = Number(((await page.locator('#trial-z').textContent()) ?? '').split('±')[0]);
    expect(shown).toBe(best);
    await press('s');
    await press('a');
    const { z } = await savedAs('accepted');
    // Saved at full precision; shown to at least 5 decimals.
    expect(Math.abs(z! - shown)).toBeLessThanOrEqual(5e-6);
    vetted['KRT-26-0011.fits'] = { status: 'accepted', z };
  });

  it('measures a spectrum again within a narrower z range', async () => {
    await press('Shift+M');
    await page.waitForSelector('#remeasure-card');
    await page.fill('#remeasure-zmin', '0');
    await page.fill('#remeasure-zmax', '0.3');
    await shot('remeasure');
    await page.press('#remeasure-zmax', 'Enter');
    await page.waitForSelector('#remeasure-card', { state: 'detached' });
    await expect.poll(async () => {
      const zs = await Promise.all([0, 1, 2].map((i) => candidateZ(i).catch(() => NaN)));
      return zs.filter((z) => Number.isFinite(z)).every((z) => z <= 0.3 + 1e-9) && Number.isFinite(zs[0]);
    }, { timeout: 30_000 }).toBe(true);
    // The verdict already saved stays what it was.
    expect(await page.locator('#verdict-now').textContent()).toContain('accepted');
  });

  it('opens the form again on the options in force, and reads the wavelengths in the medium chosen there', async () => {
    expect(await page.locator('#medium-fact').textContent()).toBe('air wavelengths in the file, shown in vacuum');
    const before = await candidateZ(0);
    const measureAgain = async (medium: string) => {
      await press('Shift+M');
      await page.waitForSelector('#remeasure-card');
      expect([await page.inputValue('#remeasure-zmin'), await page.inputValue('#remeasure-zmax')]).toEqual(['0', '0.3']);
      await page.selectOption('#remeasure-medium', medium);
      await page.click('#remeasure-go');
      await page.waitForSelector('#remeasure-card', { state: 'detached' });
    };
    await measureAgain('vacuum');
    await expect.poll(() => page.locator('#medium-fact').textContent(), { timeout: 30_000 }).toBe('vacuum wavelengths, as you set');
    // The verdict saved above holds for the file's own reading: the window says so.
    await expect.poll(() => page.locator('#decision-message').textContent()).toBe('KRT-26-0011.fits measured again; its verdict was saved with the wavelengths read as the file says: save it again to keep it on this reading');
    // Not converted from air, the wavelengths are shorter by the air/vacuum ratio (Hα: 6562.80 Å
    // air, 6564.61 Å vacuum; IAU standard, Morton 1991), and so is 1 + z.
    expect((1 + before) / (1 + (await candidateZ(0)))).toBeCloseTo(6564.61 / 6562.8, 4);
    await press('Shift+M');
    expect(await page.inputValue('#remeasure-medium')).toBe('vacuum');
    await press('Escape');
    await measureAgain('');
    await expect.poll(() => page.locator('#medium-fact').textContent(), { timeout: 30_000 }).toBe('air wavelengths in the file, shown in vacuum');
    expect(await candidateZ(0)).toBe(before);
  });

  it('takes another candidate: its number, then Enter', async () => {
    await nextUntil('KRT-26-0012.fits');
    const second = await candidateZ(1);
    await press('2');
    await press('t');
    await press('Enter');
    const { z } = await savedAs('revised');
    expect(z).toBeCloseTo(second, 4);
    vetted['KRT-26-0012.fits'] = { status: 'revised', z };
  });

  it('says beside the field when a typed z is not a redshift, and empties it on the next spectrum', async () => {
    await press('z');
    await page.keyboard.type('0x10');
    await press('Enter');
    await expect.poll(() => page.locator('#typed-z-problem').textContent()).toContain('not a redshift');
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('typed-z');
    // The refused text is selected: what is typed next replaces it.
    await page.keyboard.type('0.2');
    await press('Enter');
    await expect.poll(() => page.locator('#spectrum-plot').getAttribute('data-z')).toBe('0.2');
    expect(await page.locator('#typed-z-problem').isHidden()).toBe(true);
    // A typed z is a trial, not a verdict.
    expect(await page.locator('#verdict-now').textContent()).toContain('revised');
    await nextUntil('KRT-26-0013.fits');
    expect(await page.locator('#typed-z').inputValue()).toBe('');
  });

  it('identifies [O III] 5008 by clicking the feature, picks the rest line by its number, nudges and saves', async () => {
    await nextUntil('KRT-26-0014.fits');
    await press('i');
    const observed = O3_REST * (1 + AGN_TRUE_Z);
    const at = await page.evaluate((w) => {
      const gd = document.getElementById('spectrum-plot') as HTMLElement & { _fullLayout: any };
      const xa = gd._fullLayout.xaxis;
      const ya = gd._fullLayout.yaxis;
      const box = gd.getBoundingClientRect();
      return { x: box.left + xa._offset + xa.l2p(w), y: box.top + ya._offset + ya._length * 0.5 };
    }, observed);
    await page.mouse.move(at.x, at.y);
    await page.mouse.click(at.x, at.y);
    await page.waitForSelector('#line-pick');
    await shot('line-pick');
    const rows = await page.locator('#line-pick li').allTextContents();
    const idx = rows.findIndex((t) => t.includes('[O III] 5008.24'));
    expect(idx, `the pick list offers [O III] 5008: ${rows.join(' | ')}`).toBeGreaterThanOrEqual(0);
    await press(String(idx + 1));
    await page.waitForSelector('#line-pick', { state: 'detached' });
    const picked = Number(await page.locator('#spectrum-plot').getAttribute('data-z'));
    // The click (good to a screen pixel, a few Å) is snapped to the line's centre: [O III] at
    // S/N ≈ 100 is then within 0.0003 in z (≈ 80 km/s) of the true redshift.
    expect(Math.abs(picked - AGN_TRUE_Z)).toBeLessThan(0.0003);
    await press('.');
    await press('>');
    const nudged = Number(await page.locator('#spectrum-plot').getAttribute('data-z'));
    // (1+z′) = (1+z)(1+v/c) with +10 then +100 km/s.
    expect(nudged).toBeCloseTo((1 + picked) * (1 + 10 / 299792.458) * (1 + 100 / 299792.458) - 1, 9);
    expect(await page.locator('#trial-z').textContent()).toContain(nudged.toFixed(5));
    await press('Shift+A');
    await press('l');
    await press('Enter');
    const { z } = await savedAs('revised');
    expect(z).toBe(nudged);
    vetted['KRT-26-0014.fits'] = { status: 'revised', z };
  });

  it('shows the host panel for the AGN at the vetted z', async () => {
    await press('h');
    await page.waitForSelector('#host-lines', { timeout: 30_000 });
    await page.waitForSelector('#bpt-plot .main-svg');
    expect(await page.locator('#aperture-caveat').textContent()).toContain('aperture');
    await shot('host-panel');
    await page.locator('#host-lines').scrollIntoViewIfNeeded();
    await shot('host-panel-lines');
    await press('d');
  });

  it('marks a hopeless spectrum "no redshift"', async () => {
    await nextUntil('KRT-26-0021.fits');
    // "None credible": no confidence is outlined as the suggestion, and one key cannot save the guess.
    expect(await page.locator('#decision button.suggested:has-text("secure"), #decision button.suggested:has-text("likely"), #decision button.suggested:has-text("tentative")').count()).toBe(0);
    await press('a');
    await expect.poll(() => page.locator('#decision-message').textContent()).toContain('found nothing credible: choose a confidence first');
    expect(await page.locator('#verdict-now').textContent()).toContain('pending');
    await press('x');
    expect((await savedAs('no-redshift')).z).toBeNull();
    // Nothing is left drawn or derived from a z, and no confidence is shown as chosen.
    expect(await page.locator('#trial-z').textContent()).toBe('—');
    await expect.poll(() => page.locator('#spectrum-plot .textpoint').count()).toBe(0);
    expect(await page.locator('#tab-body').textContent()).toContain('nothing to derive');
    expect(await page.locator('#decision button[aria-pressed="true"]:has-text("secure"), #decision button[aria-pressed="true"]:has-text("likely"), #decision button[aria-pressed="true"]:has-text("tentative")').count()).toBe(0);
    vetted['KRT-26-0021.fits'] = { status: 'no-redshift', z: null };
    expect(await page.locator('#progress').textContent()).toContain('4 of 13 vetted');
  });

  it('undoes the last verdict and takes it again', async () => {
    await press('u');
    await page.waitForFunction(() => document.getElementById('verdict-now')?.textContent?.startsWith('pending'));
    expect(await page.locator('#progress').textContent()).toContain('3 of 13 vetted');
    await press('x');
    await savedAs('no-redshift');
  });

  it('shows a failed journal write loudly, keeps it queued, and saves it on retry', async () => {
    const journal = join(tmp, 'night', 'night.verdicts.jsonl');
    renameSync(journal, `${journal}.aside`);
    mkdirSync(journal); // appending to a folder fails: EISDIR
    await press('Shift+G');
    await page.waitForSelector('#save-failure:not([hidden])');
    const banner = (await page.locator('#save-failure').textContent()) ?? '';
    expect(banner).toContain('NOT SAVED');
    expect(banner).toContain('KRT-26-0021.fits');
    expect(await page.locator('#verdict-now').textContent()).toContain('NOT SAVED');
    // Closing or reloading the tab now would lose it: the page asks first (and no longer once it is saved).
    const leavingIsStopped = () => page.evaluate(() => { const e = new Event('beforeunload', { cancelable: true }); window.dispatchEvent(e); return e.defaultPrevented; });
    expect(await leavingIsStopped()).toBe(true);
    await shot('save-failed');
    rmdirSync(journal);
    renameSync(`${journal}.aside`, journal);
    await press('Shift+R');
    await page.waitForSelector('#save-failure', { state: 'hidden' });
    await savedAs('no-redshift');
    expect(await page.locator('.save-state .saved').textContent()).toContain('KRT-26-0021.fits');
    expect(await leavingIsStopped()).toBe(false);
    // Journal records (core/catalogue/journal-format.ts): the last one for this spectrum is the regraded verdict.
    const records = readFileSync(journal, 'utf8').trim().split('\n').map((l) => JSON.parse(l));
    const last = records.filter((r) => (r.kind === 'verdict' ? r.verdict.spectrum : r.spectrum) === 'KRT-26-0021.fits').at(-1);
    expect(last.kind).toBe('verdict');
    expect(last.verdict).toMatchObject({ status: 'no-redshift', objectClass: 'galaxy' });
  });

  it('shows why an unreadable file cannot be read, in place', async () => {
    await nextUntil('KRT-26-0023_truncated.fits');
    await page.waitForSelector('#spectrum-problem:not([hidden])');
    expect(await page.locator('#problem-text').textContent()).toMatch(/truncated|ends|bytes/i);
    expect(await page.locator('#tab-body').textContent()).toContain('the file could not be read');
    await shot('unreadable-file');
  });

  it('lists every key in the help overlay', async () => {
    await press('?');
    await page.waitForSelector('#help-card');
    expect(await page.locator('#help-card kbd').count()).toBeGreaterThan(40);
    await shot('help-overlay');
    await press('Escape');
    await page.waitForSelector('#help-card', { state: 'detached' });
  });

  it('filters the worklist', async () => {
    await press('f');
    await expect.poll(() => page.locator('#filters [aria-pressed="true"]').textContent()).toContain('secure');
    expect(await page.locator('#worklist-items li[data-id]').count()).toBe(1);
    // The unreadable file stays in view, and the list says why it is not in it.
    expect(await page.locator('#hidden-current').textContent()).toBe('KRT-26-0023_truncated.fits, in view, is not secure: n and p move among the secure ones');
    await shot('worklist-filtered');
    for (let i = 0; i < 4; i++) await press('f');
    await expect.poll(() => page.locator('#filters [aria-pressed="true"]').textContent()).toContain('all');
  });

  it('restores all four verdicts after a reload', async () => {
    await page.reload();
    await page.waitForSelector('#worklist-items li[data-id]');
    await expect.poll(() => page.locator('#progress').textContent()).toContain('4 of 13 vetted');
    for (const [id, v] of Object.entries(vetted)) {
      const row = page.locator(`#worklist-items li[data-id="${id}"]`);
      expect(await row.locator('.status').getAttribute('aria-label')).toBe(v.status === 'no-redshift' ? 'no redshift' : v.status);
      const zText = (await row.locator('.z').textContent()) ?? '';
      if (v.z === null) expect(zText).toBe('no z');
      else expect(Number(zText)).toBeCloseTo(v.z, 4);
    }
  });

  it('names the values of a custom model set in the settings, and computes with them', async () => {
    const putSettings = (body: unknown) => page.evaluate(async (b) => {
      const token = new URLSearchParams(location.search).get('token')!;
      const r = await fetch('/api/putSettings', { method: 'POST', headers: { 'Content-Type': 'application/json', 'X-Zvet-Token': token }, body: JSON.stringify(b) });
      return r.status;
    }, body);
    const luminosity = async () => Number.parseFloat((await page.locator('#tab-body dt:text-is("luminosity") + dd').textContent()) ?? '');
    await page.waitForSelector('#cosmology-about');
    const planck = await luminosity();
    expect(await putSettings({ cosmologyPreset: 'custom', customCosmology: { h0: 80, omegaM: 0.3, omegaL: 0.7 } })).toBe(200);
    await page.reload();
    await expect.poll(() => page.locator('#cosmology-about').textContent()).toMatch(/^H0 = 80 km\/s\/Mpc, Ωm = 0.3, ΩΛ = 0.7\. values set in the settings/);
    // At low z, D_L scales as 1/H0: 67.66/80 of the Planck value.
    await expect.poll(async () => (await luminosity()) / planck).toBeLessThan(0.87);
    expect((await luminosity()) / planck).toBeGreaterThan(0.82);
    expect(await putSettings({ cosmologyPreset: 'planck18' })).toBe(200);
    await page.reload();
    await expect.poll(() => page.locator('#tab-body h2').nth(1).textContent()).toContain('planck18');
  });

  it('exports CSV, ECSV and FITS that other software reads back', async () => {
    const paths: Record<string, string> = {};
    for (const f of ['csv', 'ecsv', 'fits']) {
      await page.click(`#export-${f}`);
      await page.waitForFunction((F) => document.getElementById('export-result')?.textContent?.startsWith(`${F}: `), f.toUpperCase(), { timeout: 30_000 });
      const text = (await page.locator('#export-result').textContent()) ?? '';
      const m = / rows written to (.+)$/.exec(text);
      expect(m, text).not.toBeNull();
      paths[f] = m![1];
    }
    await shot('exported');
    // CSV: header row, one row per spectrum.
    const [head, ...lines] = readFileSync(paths.csv, 'utf8').trim().split(/\r?\n/);
    const cols = head.split(',');
    const rowOf = (id: string) => lines.find((l) => l.startsWith(`${id},`) || l.startsWith(`"${id}",`))!.split(',');
    for (const [id, v] of Object.entries(vetted)) {
      expect(rowOf(id)[cols.indexOf('status')]).toBe(v.status);
      if (v.z !== null) expect(Number(rowOf(id)[cols.indexOf('z')])).toBeCloseTo(v.z, 9);
    }
    // ECSV and FITS through astropy's Table.read (Debian python3-astropy).
    const readBack = (file: string, format: string) => astropyJson<{ rows: Record<string, string | number | null>[]; units: Record<string, string | null> }>(`
import sys, json, math
from astropy.table import Table
t = Table.read(sys.argv[1], format=sys.argv[2])
def cell(v):
    try:
        if hasattr(v, 'mask') and v.mask: return None
    except Exception: pass
    v = v.item() if hasattr(v, 'item') else v
    if isinstance(v, bytes): v = v.decode()
    if isinstance(v, float) and math.isnan(v): return None
    return v
print(json.dumps({'rows': [{c: cell(r[c]) for c in ('spectrum', 'status', 'z')} for r in t],
                  'units': {c: (str(t[c].unit) if t[c].unit is not None else None) for c in t.colnames}}))
`, [file, format]);
    for (const [file, format] of [[paths.ecsv, 'ascii.ecsv'], [paths.fits, 'fits']]) {
      const t = readBack(file, format);
      expect(t.units.ra_deg).toBe('deg');
      for (const [id, v] of Object.entries(vetted)) {
        const r = t.rows.find((x) => String(x.spectrum).trim() === id)!;
        expect(String(r.status).trim()).toBe(v.status);
        if (v.z === null) expect(r.z).toBeNull();
        else expect(Number(r.z)).toBeCloseTo(v.z, 9);
      }
    }
    const fv = fitsverify(paths.fits);
    expect(fv.status, fv.report).toBe(0);
    // Shift+E writes all three to the same files and says how many rows are not vetted.
    await press('Shift+E');
    await page.waitForFunction(() => /rows written to .*catalogue\.csv, .*\.ecsv, .*\.fits/.test(document.getElementById('export-result')?.textContent ?? ''), undefined, { timeout: 30_000 });
    expect(await page.locator('#export-unvetted').textContent()).toBe('9 of 13 not vetted yet: their rows say pending, with no z');
  });

  it('keeps a note typed on a spectrum not vetted yet, through moving on and a reload', async () => {
    const id = 'KRT-26-0016.fits';
    expect(vetted[id]).toBeUndefined();
    await nextUntil(id);
    const note = 'check the blend at 6700 Å in the morning';
    await press('m');
    await page.keyboard.type(note);
    // Leaving the field keeps the note (Escape here; Enter and a click elsewhere too).
    await press('Escape');
    // Back at once, the note is there even if its save is still on its way.
    await press('n');
    await expect.poll(() => page.locator('#spectrum-plot').getAttribute('data-spectrum')).not.toBe(id);
    await press('p');
    await expect.poll(() => page.locator('#spectrum-plot').getAttribute('data-spectrum')).toBe(id);
    await expect.poll(() => page.inputValue('#note')).toBe(note);
    await expect.poll(() => page.locator('.save-state').textContent(), { timeout: 20_000 }).toContain(`saved ${id}`);
    // The list marks the note, its text in the row's tooltip.
    const row = page.locator(`#worklist-items li[data-id="${id}"]`);
    await expect.poll(() => row.locator('.sub').textContent()).toContain('not vetted · note');
    expect(await row.getAttribute('title')).toBe(`${id}: pending; note: ${note}`);
    await page.reload();
    await page.waitForSelector('#worklist-items li[data-id]');
    await nextUntil(id);
    await expect.poll(() => page.inputValue('#note')).toBe(note);
    // Still not vetted: a note alone is no verdict.
    expect(await page.locator('#verdict-now').textContent()).toContain('pending');
    expect(await page.locator('#progress').textContent()).toContain('4 of 13 vetted');
  });

  it('made no request outside 127.0.0.1 and threw no page error', () => {
    const origin = `http://127.0.0.1:${server.port}/`;
    const outside = win.requests.filter((u) => !u.startsWith(origin) && !u.startsWith('data:') && !u.startsWith('blob:'));
    expect(outside).toEqual([]);
    expect(win.requests.length).toBeGreaterThan(10);
    // The one failed request allowed is the journal write made to fail above (the host answers 503).
    expect(win.errors.filter((e) => !e.includes('status of 503 (Service Unavailable)'))).toEqual([]);
  });
});

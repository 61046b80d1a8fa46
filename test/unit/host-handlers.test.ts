// The host handlers on a temporary copy of the demo worklist, with the real worklist, journal,
// worker pool and exporters. Truth values come from the demo generator's truth.csv (invented
// data, seeded). The exporters' own formats are checked by their tests; here only where they go.
import { cpSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { COSMOLOGY_PRESETS, distances } from '../../core/astro/cosmology';
import { defaultServices } from '../../core/node/host/default-services';
import { createHostHandlers, type HostHandlers } from '../../core/node/host/handlers';
import { HostFailure } from '../../core/node/host/host-failure';
import type { HostServices } from '../../core/node/host/services';
import { SettingsStore } from '../../core/node/host/settings-store';
import { OTHER_WRITER_WARNING } from '../../core/node/journal';
import { DEMO_WORKLIST, ROOT } from '../support/paths';

const NOW = new Date('2026-03-14T09:30:00.000Z');
const truth = new Map(
  readFileSync(resolve(ROOT, 'sample-spectra/truth.csv'), 'utf8')
    .trim()
    .split('\n')
    .slice(1)
    .map((line) => {
      const [file, , , z] = line.split(',');
      return [file, Number(z)] as const;
    }),
);

let tmp: string;
let folder: string;
const open: HostHandlers[] = [];

function handlers(services: HostServices = defaultServices()): HostHandlers {
  const h = createHostHandlers({ settings: new SettingsStore(join(tmp, 'config')), services, now: () => NOW });
  open.push(h);
  return h;
}

async function failure(p: Promise<unknown>): Promise<HostFailure> {
  const err = await p.then(
    () => null,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(HostFailure);
  return err as HostFailure;
}

const accept = (id: string, z: number) => ({ id, status: 'accepted' as const, z, zErr: 1e-4, confidence: 'secure' as const, objectClass: 'galaxy' as const, template: 'star-forming', note: '' });

beforeEach(() => {
  tmp = mkdtempSync(join(tmpdir(), 'zvet-host-'));
  folder = join(tmp, 'kestrel-2026-03-14');
  cpSync(DEMO_WORKLIST, folder, { recursive: true });
});

afterEach(async () => {
  await Promise.all(open.splice(0).map((h) => h.close()));
  rmSync(tmp, { recursive: true, force: true });
});

describe('host handlers: worklist', () => {
  it('opens the demo night and lists every spectrum, pending, by its path in the folder', async () => {
    const state = await handlers().openWorklist({ path: folder });
    expect(state.name).toBe('kestrel-2026-03-14');
    expect(state.journalPath).toBe(join(folder, 'kestrel-2026-03-14.verdicts.jsonl'));
    expect(state.items.map((i) => i.id)).toEqual([...truth.keys()].sort());
    expect(state.items.every((i) => i.verdict === null)).toBe(true);
  });

  it('refuses a call before a worklist is open, and an id that is not in it', async () => {
    const h = handlers();
    expect((await failure(h.listSpectra({}))).status).toBe(409);
    await h.openWorklist({ path: folder });
    const f = await failure(h.loadSpectrum({ id: '../kestrel-2026-03-14/KRT-26-0011.fits' }));
    expect(f.status).toBe(404);
    expect(f.message).toMatch(/not a spectrum of the open worklist/);
  });

  it('refuses relative and missing paths', async () => {
    const h = handlers();
    expect((await failure(h.openWorklist({ path: 'kestrel-2026-03-14' }))).status).toBe(400);
    expect((await failure(h.openWorklist({ path: join(tmp, 'nope') }))).status).toBe(404);
    expect((await failure(h.openWorklist({ path: join(folder, 'KRT-26-0011.fits') }))).status).toBe(400);
  });

  it('remembers the worklist in the recent list of the settings', async () => {
    const h = handlers();
    await h.openWorklist({ path: folder });
    expect((await h.getSettings({})).recentWorklists[0]).toBe(folder);
  });
});

describe('host handlers: spectra and measurements', () => {
  it('loads a spectrum with JSON-safe arrays, metadata, candidates and correlations; the best z is near the truth', async () => {
    const h = handlers();
    await h.openWorklist({ path: folder });
    const view = await h.loadSpectrum({ id: 'KRT-26-0011.fits' });
    expect(view.error).toBeNull();
    const n = view.arrays!.waveAngstrom.length;
    expect(n).toBeGreaterThan(1000);
    for (const a of [view.arrays!.flux, view.arrays!.error, view.arrays!.mask]) expect(a).toHaveLength(n);
    expect(view.meta!.object).toBe('KRT-26-0011');
    expect(view.meta!.mediumInFile).toBe('air');
    expect(view.measurement!.correlations!.length).toBeGreaterThan(0);
    // Generator truth (truth.csv); 300 km/s is far wider than any real error at S/N 18.
    const zTrue = truth.get('KRT-26-0011.fits')!;
    expect(Math.abs(view.measurement!.best!.z - zTrue) / (1 + zTrue)).toBeLessThan(300 / 299_792.458);
    expect(JSON.parse(JSON.stringify(view)).arrays.flux).toHaveLength(n);
  });

  it('says when the wavelength unit was guessed with a doubt (the window shows it above the plot)', async () => {
    const h = handlers();
    await h.openWorklist({ path: folder });
    expect((await h.loadSpectrum({ id: 'KRT-26-0011.fits' })).meta!.waveUnitDoubt).toBeNull();
    const nm = join(tmp, 'nm-night');
    mkdirSync(nm);
    writeFileSync(join(nm, 'unlabelled.txt'), Array.from({ length: 400 }, (_, i) => `${(380 + 1.3 * i).toFixed(2)} ${10 + (i % 7)}`).join('\n'));
    await h.openWorklist({ path: nm });
    expect((await h.loadSpectrum({ id: 'unlabelled.txt' })).meta!.waveUnitDoubt).toMatch(/taken as nm; if they are Å/);
  });

  it('draws the best template over the spectrum, and any template at any trial z', async () => {
    const h = handlers();
    await h.openWorklist({ path: folder });
    const view = await h.loadSpectrum({ id: 'KRT-26-0013.fits' });
    const n = view.arrays!.flux.length;
    expect(view.templateModel).toMatchObject({ template: view.measurement!.best!.template, z: view.measurement!.best!.z });
    expect(view.templateModel!.flux).toHaveLength(n);
    const trial = await h.templateModel({ id: 'KRT-26-0013.fits', template: 'passive', z: 0.3 });
    expect(trial.flux).toHaveLength(n);
    expect(trial.flux.some((v) => v !== null)).toBe(true);
    const unknown = await failure(h.templateModel({ id: 'KRT-26-0013.fits', template: 'no-such-template', z: 0.3 }));
    expect(unknown.status).toBe(400);
  });

  it('shows an unreadable file with its reason in place, not as a failed call', async () => {
    const h = handlers();
    await h.openWorklist({ path: folder });
    const view = await h.loadSpectrum({ id: 'KRT-26-0023_truncated.fits' });
    expect(view.arrays).toBeNull();
    expect(view.error).toMatch(/truncated/);
    const item = (await h.listSpectra({})).items.find((i) => i.id === 'KRT-26-0023_truncated.fits')!;
    expect(item.error).toMatch(/truncated/);
  });

  it('measures once per spectrum and option set, and remeasures with a new z range', async () => {
    const real = defaultServices();
    const calls: string[] = [];
    const h = handlers({ ...real, measureFile: (path, options) => (calls.push(`${path} ${JSON.stringify(options)}`), real.measureFile(path, options)), close: () => real.close() });
    await h.openWorklist({ path: folder });
    await h.loadSpectrum({ id: 'KRT-26-0013.fits' });
    await h.loadSpectrum({ id: 'KRT-26-0013.fits' });
    expect(calls.filter((c) => c.includes('KRT-26-0013.fits'))).toHaveLength(1);
    const narrow = await h.remeasure({ id: 'KRT-26-0013.fits', options: { zmin: 0, zmax: 0.1 } });
    expect(narrow.measurement!.candidates.every((c) => c.z <= 0.1 + 1e-9)).toBe(true);
    // The new options stick for the next load of that spectrum.
    expect((await h.loadSpectrum({ id: 'KRT-26-0013.fits' })).measurement!.best!.z).toBe(narrow.measurement!.best!.z);
    expect(calls.filter((c) => c.includes('KRT-26-0013.fits'))).toHaveLength(2);
    // Reopening the same folder (a reload of the window) measures nothing again.
    await h.openWorklist({ path: folder });
    await h.loadSpectrum({ id: 'KRT-26-0013.fits' });
    expect(calls.filter((c) => c.includes('KRT-26-0013.fits'))).toHaveLength(2);
  });

  it('reads and measures a file again once it is rewritten on disk (re-reduced), and its list entry says the file changed', async () => {
    const h = handlers();
    await h.openWorklist({ path: folder });
    const id = 'KRT-26-0013.fits';
    const first = await h.loadSpectrum({ id });
    const versionBefore = (await h.listSpectra({})).items.find((i) => i.id === id)!.fileVersion;
    expect(versionBefore).not.toBeNull();
    // Another night's spectrum written over it stands in for a new reduction.
    writeFileSync(join(folder, id), readFileSync(join(folder, 'KRT-26-0012.fits')));
    const again = await h.loadSpectrum({ id });
    expect(again.measurement!.best!.z).not.toBe(first.measurement!.best!.z);
    expect(again.measurement!.best!.z).toBeCloseTo(truth.get('KRT-26-0012.fits')!, 2);
    expect((await h.listSpectra({})).items.find((i) => i.id === id)!.fileVersion).not.toBe(versionBefore);
  });

  it('fills the list with suggestions in the background', async () => {
    const h = handlers();
    await h.openWorklist({ path: folder });
    await expect.poll(async () => (await h.listSpectra({})).items.filter((i) => i.suggestion || i.error).length, { timeout: 60_000, interval: 200 }).toBe(truth.size);
  });

  it('derives frames and distances with the cosmology of the settings', async () => {
    const h = handlers();
    await h.openWorklist({ path: folder });
    const planck = await h.derived({ id: 'KRT-26-0011.fits', z: 0.05, zErr: 1e-4 });
    expect(planck.correction).toBe('barycentric');
    await h.putSettings({ cosmologyPreset: 'round70' });
    const round = await h.derived({ id: 'KRT-26-0011.fits', z: 0.05, zErr: 1e-4 });
    expect(round.zCmb).toBe(planck.zCmb);
    expect(round.distances!.luminosityMpc).toBeCloseTo(distances(round.zCmb!, COSMOLOGY_PRESETS.round70).luminosityMpc, 9);
    expect(round.distances!.luminosityMpc).not.toBeCloseTo(planck.distances!.luminosityMpc, 0);
  });

  it('analyses the host lines at a trial z', async () => {
    const h = handlers();
    await h.openWorklist({ path: folder });
    const zTrue = truth.get('KRT-26-0011.fits')!;
    const host = await h.hostAnalysis({ id: 'KRT-26-0011.fits', z: zTrue });
    expect(host.z).toBe(zTrue);
    expect(host.lines.some((l) => l.name === 'Halpha' && !l.limit)).toBe(true);
    // The SFR takes the derived panel's luminosity distance (at z_cmb), so the two panels agree.
    const derived = await h.derived({ id: 'KRT-26-0011.fits', z: zTrue, zErr: null });
    expect(host.sfr.luminosity_distance_from).toBe('cmb');
    expect(host.sfr.luminosity_distance_mpc).toBe(derived.distances!.luminosityMpc);
  });
});

describe('host handlers: verdicts', () => {
  it('stamps time and user, appends one journal line, and a reopened worklist has it back', async () => {
    const h = handlers();
    await h.putSettings({ user: 'night-observer' });
    await h.openWorklist({ path: folder });
    const { verdict } = await h.saveVerdict(accept('KRT-26-0011.fits', 0.04823));
    expect(verdict).toMatchObject({ spectrum: 'KRT-26-0011.fits', time: NOW.toISOString(), user: 'night-observer', hdu: null });
    const lines = readFileSync(join(folder, 'kestrel-2026-03-14.verdicts.jsonl'), 'utf8').trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(JSON.parse(lines[0]).verdict.z).toBe(0.04823);

    const again = handlers();
    const state = await again.openWorklist({ path: folder });
    expect(state.items.find((i) => i.id === 'KRT-26-0011.fits')!.verdict).toEqual(verdict);
  });

  it('keeps the medium the user set for the wavelengths: the verdict records it and a reopened worklist reads the file so again', async () => {
    const id = 'KRT-26-0011.fits';
    const h = handlers();
    await h.openWorklist({ path: folder });
    const asFile = await h.loadSpectrum({ id });
    expect(asFile.meta!.mediumInFile).toBe('air');
    expect(asFile.measuredWith).toEqual({});
    const vacuum = await h.remeasure({ id, options: { medium: 'vacuum' } });
    expect(vacuum.meta).toMatchObject({ mediumInFile: 'vacuum', mediumReason: 'set by the user, whatever the file says', mediumSource: 'user' });
    expect(vacuum.measuredWith).toEqual({ medium: 'vacuum' });
    // Read as vacuum, the air wavelengths are not converted: 1 + z drops by about the air/vacuum
    // ratio at Hα, 6564.61/6562.80 (IAU standard, Morton 1991).
    expect((1 + asFile.measurement!.best!.z) / (1 + vacuum.measurement!.best!.z)).toBeCloseTo(6564.61 / 6562.8, 4);
    const { verdict } = await h.saveVerdict(accept(id, vacuum.measurement!.best!.z));
    expect(verdict.medium).toBe('vacuum');
    // The catalogue reads the file as it was vetted (its host lines are measured on that reading).
    const csv = readFileSync((await h.exportCatalogue({ format: 'csv', path: join(tmp, 'media.csv') })).path, 'utf8').split('\n').filter((l) => !l.startsWith('#'));
    const column = csv[0].split(',').indexOf('medium_in_file');
    const mediumOfRow = (spectrum: string) => csv.find((l) => l.startsWith(`${spectrum},`))!.split(',')[column];
    expect([mediumOfRow(id), mediumOfRow('KRT-26-0012.fits')]).toEqual(['vacuum', 'air']);

    const again = handlers();
    await again.openWorklist({ path: folder });
    const reopened = await again.loadSpectrum({ id });
    expect(reopened.measuredWith).toEqual({ medium: 'vacuum' });
    expect(reopened.meta!.mediumInFile).toBe('vacuum');
    expect(reopened.measurement!.best!.z).toBe(vacuum.measurement!.best!.z);
    // Back to what the file says: the next verdict carries no medium.
    await again.remeasure({ id, options: {} });
    expect((await again.saveVerdict(accept(id, asFile.measurement!.best!.z))).verdict).not.toHaveProperty('medium');
  });

  it('lists the verdicts another window saves to the same journal, says so, and undoes only its own', async () => {
    const here = handlers();
    const there = handlers();
    await here.openWorklist({ path: folder });
    await there.openWorklist({ path: folder });
    await here.saveVerdict(accept('KRT-26-0011.fits', 0.04823));
    const { verdict: theirs } = await there.saveVerdict(accept('KRT-26-0012.fits', 0.13752));
    const listed = await here.listSpectra({});
    expect(listed.items.find((i) => i.id === 'KRT-26-0012.fits')!.verdict).toEqual(theirs);
    expect(listed.warnings).toContain(OTHER_WRITER_WARNING);
    expect(await here.undoLast({})).toEqual({ id: 'KRT-26-0011.fits', verdict: null });
    expect(await here.undoLast({})).toEqual({ id: null, verdict: null });
    const after = await there.listSpectra({});
    expect(after.items.filter((i) => i.verdict).map((i) => i.id)).toEqual(['KRT-26-0012.fits']);
  });

  it('still lists the worklist, with the reason, when the journal cannot be read again', async () => {
    const h = handlers();
    await h.openWorklist({ path: folder });
    await h.saveVerdict(accept('KRT-26-0011.fits', 0.04823));
    const journal = join(folder, 'kestrel-2026-03-14.verdicts.jsonl');
    rmSync(journal);
    mkdirSync(journal);
    const listed = await h.listSpectra({});
    expect(listed.items).toHaveLength(truth.size);
    expect(listed.warnings.some((w) => w.startsWith('cannot read the verdict journal:'))).toBe(true);
  });

  it('undoes the last verdict and says which spectrum it was', async () => {
    const h = handlers();
    await h.openWorklist({ path: folder });
    await h.saveVerdict(accept('KRT-26-0011.fits', 0.04823));
    const second = (await h.saveVerdict(accept('KRT-26-0012.fits', 0.1375))).verdict;
    await h.saveVerdict({ ...accept('KRT-26-0012.fits', 0.2), status: 'revised' });
    expect(await h.undoLast({})).toEqual({ id: 'KRT-26-0012.fits', verdict: second });
    expect(await h.undoLast({})).toEqual({ id: 'KRT-26-0012.fits', verdict: null });
    const state = await handlers().openWorklist({ path: folder });
    expect(state.items.filter((i) => i.verdict).map((i) => i.id)).toEqual(['KRT-26-0011.fits']);
  });

  it.each([
    ['ENOSPC', /disk is full/],
    ['EROFS', /read-only/],
    ['EACCES', /permission denied/],
  ])('keeps a verdict the disk refuses (%s) in memory, says so naming the journal, and writes it with the next save', async (code, reason) => {
    const real = defaultServices();
    let refuse = true;
    const h = handlers({
      ...real,
      close: () => real.close(),
      openWorklist: async (target) => {
        const w = await real.openWorklist(target);
        const append = w.journal.append.bind(w.journal);
        w.journal.append = (v) => (refuse ? Promise.reject(Object.assign(new Error(code), { code })) : append(v));
        return w;
      },
    });
    await h.openWorklist({ path: folder });
    const journal = join(folder, 'kestrel-2026-03-14.verdicts.jsonl');
    const f = await failure(h.saveVerdict(accept('KRT-26-0011.fits', 0.04823)));
    expect(f.status).toBe(503);
    expect(f.message).toContain(journal);
    expect(f.message).toMatch(reason);
    expect(f.message).toMatch(/1 verdict is kept in memory/);
    // Still refused: both wait, in order.
    await failure(h.saveVerdict(accept('KRT-26-0012.fits', 0.1375)));
    const waiting = await h.listSpectra({});
    expect(waiting.items.filter((i) => i.verdict).map((i) => i.id)).toEqual(['KRT-26-0011.fits', 'KRT-26-0012.fits']);
    expect(waiting.warnings.join(' ')).toMatch(/2 verdicts are kept in memory/);

    refuse = false;
    await h.saveVerdict(accept('KRT-26-0013.fits', 0.2154));
    const lines = readFileSync(journal, 'utf8').trim().split('\n').map((l) => JSON.parse(l).verdict.spectrum);
    expect(lines).toEqual(['KRT-26-0011.fits', 'KRT-26-0012.fits', 'KRT-26-0013.fits']);
    expect((await h.listSpectra({})).warnings).toEqual([]);
  });

  it('undo takes back a verdict still waiting for the disk without touching the journal', async () => {
    const real = defaultServices();
    const h = handlers({
      ...real,
      close: () => real.close(),
      openWorklist: async (target) => {
        const w = await real.openWorklist(target);
        w.journal.append = () => Promise.reject(Object.assign(new Error('ENOSPC'), { code: 'ENOSPC' }));
        return w;
      },
    });
    await h.openWorklist({ path: folder });
    await failure(h.saveVerdict(accept('KRT-26-0011.fits', 0.04823)));
    expect(await h.undoLast({})).toEqual({ id: 'KRT-26-0011.fits', verdict: null });
    expect((await h.listSpectra({})).warnings).toEqual([]);
  });
});

describe('host handlers: export', () => {
  it('writes the catalogue beside the journal by default, with one row per spectrum', async () => {
    const h = handlers();
    await h.openWorklist({ path: folder });
    await h.saveVerdict(accept('KRT-26-0011.fits', 0.04823));
    const out = await h.exportCatalogue({ format: 'csv' });
    expect(out.path).toBe(join(folder, 'kestrel-2026-03-14.catalogue.csv'));
    expect(out.rows).toBe(truth.size);
    expect(readFileSync(out.path, 'utf8')).toContain('KRT-26-0011.fits');
  });

  it('computes the derived columns with the cosmology chosen in the settings', async () => {
    const h = handlers();
    await h.putSettings({ cosmologyPreset: 'round70' });
    await h.openWorklist({ path: folder });
    const out = await h.exportCatalogue({ format: 'ecsv', path: join(tmp, 'round70.ecsv') });
    expect(readFileSync(out.path, 'utf8')).toContain('"cosmolog": "round70: H0 = 70 km/s/Mpc');
    await h.putSettings({ cosmologyPreset: 'planck18' });
  });

  it('writes where the user typed, and refuses to overwrite a spectrum or the journal', async () => {
    const h = handlers();
    await h.openWorklist({ path: folder });
    const typed = join(tmp, 'night.ecsv');
    expect((await h.exportCatalogue({ format: 'ecsv', path: typed })).path).toBe(typed);
    expect(readFileSync(typed, 'utf8')).toMatch(/^# %ECSV/);
    expect((await failure(h.exportCatalogue({ format: 'fits', path: join(folder, 'KRT-26-0011.fits') }))).status).toBe(400);
    expect((await failure(h.exportCatalogue({ format: 'csv', path: join(tmp, 'nowhere', 'x.csv') }))).message).toMatch(/folder does not exist/);
  });
});

/**
 * Every host call's logic, in one place, shared by both transports (loopback HTTP and Electron
 * IPC). Requests arrive already shape-checked (request-shapes.ts); here ids are checked against
 * the open worklist, so no path from the page is ever opened directly, and only files inside
 * the worklist folder (after resolving symlinks) are read.
 */
import { realpath, stat } from 'node:fs/promises';
import { isAbsolute } from 'node:path';
import type {
  ExportFormat,
  HostApi,
  RemeasureOptions,
  Settings,
  SpectrumView,
  VerdictInput,
  WorklistState,
} from '../../api/host-api.js';
import { COSMOLOGY_PRESETS, type CosmologyModel } from '../../astro/cosmology.js';
import { correctFrames, framesOrNull, type FrameInput, type FrameResult } from '../../astro/frames.js';
import type { Verdict } from '../../catalogue/verdict.js';
import { analyseHost, type HostAnalysis } from '../../hosts/analyse.js';
import { templateModelFlux } from '../../redshift/template-model.js';
import { TemplateChoiceError } from '../../redshift/template-set.js';
import type { Site, Spectrum } from '../../spectrum/spectrum.js';
import { describeFailure } from '../cli/run-action.js';
import { resolveExportPath } from './export-path.js';
import { HostFailure } from './host-failure.js';
import { MeasurementCache, optionsKey } from './measurement-cache.js';
import type { Worklist } from '../worklist.js';
import type { HostServices, MeasuredFile } from './services.js';
import { defaultServices } from './default-services.js';
import { SettingsStore } from './settings-store.js';
import { spectrumArrays, spectrumMetaView, toJsonNumbers } from './spectrum-view.js';
import { isInside } from './static-files.js';

export interface HostHandlers extends HostApi {
  /** Stops background measuring and the worker pool. */
  close(): Promise<void>;
}

export interface HostHandlerOptions {
  settings?: SettingsStore;
  services?: HostServices;
  /** The clock that stamps verdicts (tests pin it). */
  now?: () => Date;
}

interface Entry {
  absPath: string;
  /** Why the file is not read (it leads out of the worklist), or null. */
  refusal: string | null;
}

/** One open worklist: its files, its journal, the verdicts waiting for the disk, its measurements. */
interface Session {
  worklist: Worklist;
  entries: Map<string, Entry>;
  /** Verdicts the disk refused so far, oldest first; written before any newer one. */
  queued: Verdict[];
  lastWriteError: string | null;
  cache: MeasurementCache;
  optionsFor: Map<string, RemeasureOptions>;
  hduFor: Map<string, number | null>;
  closed: boolean;
}

/** One line naming the journal and why the disk refused the write. */
function writeFailure(err: unknown, journalPath: string): string {
  const e = err as NodeJS.ErrnoException;
  if (e && typeof e.code === 'string' && typeof e.path !== 'string') e.path = journalPath;
  const text = describeFailure(e);
  return text.includes(journalPath) ? text : `${journalPath}: ${text}`;
}

/** The best candidate's template model for the overlay; null when the spectrum cannot be modelled. */
function modelOrNull(template: string, z: number, spectrum: Spectrum, options: RemeasureOptions): SpectrumView['templateModel'] {
  try {
    return { template, z, flux: toJsonNumbers(templateModelFlux(template, z, spectrum, options)) };
  } catch {
    return null;
  }
}

class Handlers implements HostHandlers {
  private session: Session | null = null;
  /** Serialises journal writes so verdicts reach the disk in the order they were made. */
  private writing: Promise<unknown> = Promise.resolve();
  /** Measurements under way; closing waits for them rather than killing a busy worker. */
  private readonly measuring = new Set<Promise<MeasuredFile>>();

  constructor(
    private readonly settings: SettingsStore,
    private readonly services: HostServices,
    private readonly now: () => Date,
  ) {}

  // ---- worklist ----------------------------------------------------------------------------

  async openWorklist(req: { path: string } | { files: string[] }): Promise<WorklistState> {
    const targets = 'path' in req ? [req.path] : req.files;
    for (const t of targets) {
      if (!isAbsolute(t)) throw new HostFailure(400, `${t}: give an absolute path`);
      const info = await stat(t).catch(() => null);
      if (!info) throw new HostFailure(404, `${t}: no such file or folder`);
      if ('path' in req && !info.isDirectory()) throw new HostFailure(400, `${t}: not a folder (give the worklist folder, or a list of files)`);
      if ('files' in req && !info.isFile()) throw new HostFailure(400, `${t}: not a file`);
    }
    if (this.session && this.session.queued.length > 0) await this.flushQueue(this.session);

    let worklist: Worklist;
    try {
      worklist = await this.services.openWorklist('path' in req ? req.path : req.files);
    } catch (err) {
      throw new HostFailure(422, describeFailure(err));
    }
    const realRoot = await realpath(worklist.root);
    const entries = new Map<string, Entry>();
    for (const e of worklist.entries) {
      const real = await realpath(e.absPath).catch(() => null);
      const refusal = real === null ? 'the file has gone' : isInside(realRoot, real) ? null : 'it links to a file outside the worklist folder, so it is not read';
      entries.set(e.spectrum, { absPath: real ?? e.absPath, refusal });
    }
    const previous = this.session;
    if (previous) previous.closed = true;
    // Reopening the same folder (a reload of the window) keeps what was already measured.
    const same = previous?.worklist.root === worklist.root ? previous : null;
    const session: Session = {
      worklist,
      entries,
      queued: [],
      lastWriteError: null,
      cache: same?.cache ?? new MeasurementCache(),
      optionsFor: same?.optionsFor ?? mediaSetIn(worklist.journal.current()),
      hduFor: same?.hduFor ?? new Map(),
      closed: false,
    };
    this.session = session;
    const warnings: string[] = [];
    await this.settings.rememberWorklist(worklist.root).catch((err: unknown) => warnings.push(`settings not saved: ${describeFailure(err)}`));
    void this.measureInBackground(session);
    return this.state(session, await fileVersions(session), warnings);
  }

  async listSpectra(): Promise<WorklistState> {
    const s = this.requireSession();
    // Verdicts another window saved to the same journal are in force here too; a journal that
    // cannot be read again (or written back) leaves the list as it was, with the reason.
    const problem = await s.worklist.journal.refresh().then(() => null, (err: unknown) => describeFailure(err));
    return this.state(s, await fileVersions(s), problem ? [problem] : []);
  }

  private state(s: Session, versions: ReadonlyMap<string, string | null>, extra: string[] = []): WorklistState {
    const verdicts = this.verdictsInForce(s);
    const items = [...s.entries].map(([id, entry]) => ({
      id,
      verdict: verdicts.get(id) ?? null,
      suggestion: s.cache.suggestions.get(id) ?? null,
      error: entry.refusal ?? s.cache.errors.get(id) ?? null,
      fileVersion: versions.get(id) ?? null,
    }));
    const links = s.worklist.linksWarning();
    const warnings = [...this.settings.warnings, ...s.worklist.journal.warnings, ...(links ? [links] : []), ...extra];
    if (s.queued.length > 0) warnings.push(this.queueWarning(s));
    return { root: s.worklist.root, name: s.worklist.name, journalPath: s.worklist.journalPath, items, warnings };
  }

  private verdictsInForce(s: Session): Map<string, Verdict> {
    const out = new Map(s.worklist.journal.current());
    for (const v of s.queued) out.set(v.spectrum, v);
    return out;
  }

  private requireSession(): Session {
    if (!this.session) throw new HostFailure(409, 'no worklist is open: open a folder first');
    return this.session;
  }

  private entryOf(s: Session, id: string): Entry {
    const entry = s.entries.get(id);
    if (!entry) throw new HostFailure(404, `${id}: not a spectrum of the open worklist`);
    return entry;
  }

  // ---- measuring ---------------------------------------------------------------------------

  private async measured(s: Session, id: string, options: RemeasureOptions): Promise<MeasuredFile> {
    const entry = this.entryOf(s, id);
    if (entry.refusal) return { hdu: null, error: `${id}: ${entry.refusal}`, measurement: null, spectrum: null };
    // A file rewritten since it was measured (re-reduced at the telescope) is measured again.
    const version = await fileVersion(entry.absPath);
    const result = await s.cache.get(`${optionsKey(id, options)}\u0000${version}`, () => {
      const job = this.services.measureFile(entry.absPath, { ...options, withCorrelation: true });
      this.measuring.add(job);
      job.finally(() => this.measuring.delete(job)).catch(() => undefined);
      return job;
    });
    if (!s.closed) {
      s.cache.note(id, result);
      if (result.hdu !== null || !s.hduFor.has(id)) s.hduFor.set(id, result.hdu);
    }
    return result;
  }

  /** Measures every spectrum once, one at a time, so the list fills in with suggestions. */
  private async measureInBackground(s: Session): Promise<void> {
    for (const [id, entry] of s.entries) {
      if (s.closed) return;
      if (entry.refusal || s.cache.suggestions.has(id)) continue;
      await this.measured(s, id, s.optionsFor.get(id) ?? {}).catch(() => undefined);
    }
  }

  private async spectrumOf(s: Session, id: string): Promise<Spectrum> {
    const result = await this.measured(s, id, s.optionsFor.get(id) ?? {});
    if (!result.spectrum) throw new HostFailure(422, result.error ?? `${id}: the file could not be read`);
    return result.spectrum;
  }

  private async view(s: Session, id: string, options: RemeasureOptions): Promise<SpectrumView> {
    const result = await this.measured(s, id, options);
    const verdict = this.verdictsInForce(s).get(id) ?? null;
    if (!result.spectrum) return { id, arrays: null, meta: null, measurement: null, templateModel: null, verdict, error: result.error ?? `${id}: the file could not be read`, measuredWith: options };
    const best = result.measurement?.best ?? null;
    const model = best ? modelOrNull(best.template, best.z, result.spectrum, options) : null;
    return {
      id,
      arrays: spectrumArrays(result.spectrum),
      meta: spectrumMetaView(result.spectrum),
      measurement: result.measurement,
      templateModel: model,
      verdict,
      error: result.error,
      measuredWith: options,
    };
  }

  async loadSpectrum(req: { id: string }): Promise<SpectrumView> {
    const s = this.requireSession();
    return this.view(s, req.id, s.optionsFor.get(req.id) ?? {});
  }

  async remeasure(req: { id: string; options: RemeasureOptions }): Promise<SpectrumView> {
    const s = this.requireSession();
    this.entryOf(s, req.id);
    s.optionsFor.set(req.id, req.options);
    return this.view(s, req.id, req.options);
  }

  async templateModel(req: { id: string; template: string; z: number }): Promise<{ flux: (number | null)[] }> {
    const s = this.requireSession();
    const spectrum = await this.spectrumOf(s, req.id);
    try {
      return { flux: toJsonNumbers(templateModelFlux(req.template, req.z, spectrum, s.optionsFor.get(req.id) ?? {})) };
    } catch (err) {
      throw new HostFailure(err instanceof TemplateChoiceError || err instanceof RangeError ? 400 : 422, `${req.id}: ${(err as Error).message}`);
    }
  }

  async derived(req: { id: string; z: number; zErr: number | null }): Promise<FrameResult> {
    const s = this.requireSession();
    const spectrum = await this.spectrumOf(s, req.id);
    return correctFrames({ zObs: req.z, zErr: req.zErr ?? undefined, ...(await this.frameContext(spectrum)) });
  }

  async hostAnalysis(req: { id: string; z: number }): Promise<HostAnalysis> {
    const s = this.requireSession();
    const spectrum = await this.spectrumOf(s, req.id);
    const context = await this.frameContext(spectrum);
    return analyseHost(spectrum, req.z, { cosmology: context.cosmology, frames: framesOrNull({ zObs: req.z, ...context }) });
  }

  /** What a frame correction needs besides z: the file's metadata, the site and the settings' cosmology. */
  private async frameContext(spectrum: Spectrum): Promise<Omit<FrameInput, 'zObs'> & { cosmology: CosmologyModel }> {
    const settings = await this.settings.get();
    return { meta: spectrum.meta, site: siteFor(spectrum, settings), cosmology: cosmologyOf(settings) };
  }

  // ---- verdicts ----------------------------------------------------------------------------

  async saveVerdict(req: VerdictInput): Promise<{ verdict: Verdict }> {
    const s = this.requireSession();
    this.entryOf(s, req.id);
    const settings = await this.settings.get();
    const verdict: Verdict = {
      spectrum: req.id,
      hdu: s.hduFor.get(req.id) ?? null,
      status: req.status,
      z: req.z,
      zErr: req.zErr,
      confidence: req.confidence,
      objectClass: req.objectClass,
      template: req.template,
      note: req.note,
      ...mediumOf(s.optionsFor.get(req.id)),
      time: this.now().toISOString(),
      user: settings.user,
    };
    s.queued.push(verdict);
    await this.flushQueue(s);
    return { verdict };
  }

  /** Writes every queued verdict in order; on a refusal keeps the rest queued and says why. */
  private flushQueue(s: Session): Promise<void> {
    const run = this.writing.then(async () => {
      while (s.queued.length > 0) {
        try {
          await s.worklist.journal.append(s.queued[0]);
        } catch (err) {
          s.lastWriteError = writeFailure(err, s.worklist.journalPath);
          throw new HostFailure(503, this.queueWarning(s));
        }
        s.queued.shift();
      }
      s.lastWriteError = null;
    });
    this.writing = run.catch(() => undefined);
    return run;
  }

  private queueWarning(s: Session): string {
    const n = s.queued.length;
    return `${s.lastWriteError ?? `${s.worklist.journalPath}: not saved`}; ${n} verdict${n === 1 ? ' is' : 's are'} kept in memory and written with the next save`;
  }

  async undoLast(): Promise<{ id: string | null; verdict: Verdict | null }> {
    const s = this.requireSession();
    if (s.queued.length > 0) {
      const id = s.queued.pop()!.spectrum;
      return { id, verdict: this.verdictsInForce(s).get(id) ?? null };
    }
    await this.writing;
    try {
      const undo = await s.worklist.journal.undo();
      return undo ? { id: undo.undone.spectrum, verdict: undo.now } : { id: null, verdict: null };
    } catch (err) {
      throw new HostFailure(503, `undo not saved: ${describeFailure(err)}`);
    }
  }

  // ---- export and settings -----------------------------------------------------------------

  async exportCatalogue(req: { format: ExportFormat; path?: string }): Promise<{ path: string; rows: number }> {
    const s = this.requireSession();
    const w = s.worklist;
    const path = await resolveExportPath({ root: w.root, name: w.name, journalPath: w.journalPath, spectra: [...s.entries.values()].map((e) => e.absPath) }, req.format, req.path);
    if (s.queued.length > 0) await this.flushQueue(s);
    try {
      // The same cosmology and fallback site as the window's derived panel.
      const settings = await this.settings.get();
      return { path, rows: await this.services.writeCatalogue(w, req.format, path, { cosmology: cosmologyOf(settings), site: settings.sites[0] }) };
    } catch (err) {
      throw new HostFailure(503, `export not written: ${describeFailure(err)}`);
    }
  }

  getSettings(): Promise<Settings> {
    return this.settings.get();
  }

  async putSettings(req: Partial<Settings>): Promise<Settings> {
    try {
      return await this.settings.put(req);
    } catch (err) {
      if (err instanceof HostFailure) throw err;
      throw new HostFailure(503, `settings not saved: ${describeFailure(err)}`);
    }
  }

  async close(): Promise<void> {
    if (this.session) this.session.closed = true;
    await Promise.allSettled([...this.measuring]);
    await this.writing;
    await this.services.close();
  }
}

/**
 * The site to fall back on when the header has no usable coordinates (frames.ts prefers the
 * header's own, then a known observatory of the header's site name): a saved site of that name,
 * or, for a header naming no site, the first saved site. frames.ts states in its reason which was used.
 */
function siteFor(spectrum: Spectrum, settings: Settings): Site | undefined {
  const named = spectrum.meta.site?.name;
  if (named) {
    const key = named.trim().toLowerCase();
    return settings.sites.find((x) => x.name.trim().toLowerCase() === key);
  }
  return settings.sites[0];
}

function cosmologyOf(settings: Settings): CosmologyModel {
  if (settings.cosmologyPreset === 'custom' && settings.customCosmology) {
    return { name: 'custom', ...settings.customCosmology, source: 'values set by the user in the settings' };
  }
  return COSMOLOGY_PRESETS[settings.cosmologyPreset] ?? COSMOLOGY_PRESETS.planck18;
}

export function createHostHandlers(options: HostHandlerOptions = {}): HostHandlers {
  return new Handlers(options.settings ?? new SettingsStore(), options.services ?? defaultServices(), options.now ?? (() => new Date()));
}

/** The verdict's medium field: present only when the user set the medium of the file's wavelengths. */
function mediumOf(options: RemeasureOptions | undefined): Pick<Verdict, 'medium'> {
  return options?.medium ? { medium: options.medium } : {};
}

/** Each spectrum's reading set by its verdict in force (the medium the user chose), so that a reopened worklist shows what was vetted. */
function mediaSetIn(verdicts: ReadonlyMap<string, Verdict>): Map<string, RemeasureOptions> {
  const out = new Map<string, RemeasureOptions>();
  for (const [id, v] of verdicts) if (v.medium) out.set(id, { medium: v.medium });
  return out;
}

/** Modification time and size of a file, which change when it is rewritten; null when it cannot be looked at. */
function fileVersion(path: string): Promise<string | null> {
  return stat(path).then((st) => `${st.mtimeMs}:${st.size}`, () => null);
}

async function fileVersions(s: Session): Promise<Map<string, string | null>> {
  const ids = [...s.entries.keys()];
  const versions = await Promise.all(ids.map((id) => fileVersion(s.entries.get(id)!.absPath)));
  return new Map(ids.map((id, i) => [id, versions[i]]));
}

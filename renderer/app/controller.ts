/**
 * The window's behaviour: what each key, button and click does to the state, which host calls
 * it makes, and what is redrawn. Panels only draw; this is the one place that decides.
 */
import type { ExportFormat, HostApi, RemeasureOptions, SpectrumView, VerdictInput, WorklistState } from '../../core/api/host-api.js';
import type { Confidence, ObjectClass, Verdict } from '../../core/catalogue/verdict.js';
import type { FrameResult } from '../../core/astro/frames.js';
import type { HostAnalysis } from '../../core/hosts/analyse.js';
import { initialState, type AppState } from './state.js';
import { SpectrumCache } from './spectrum-cache.js';
import { LatestOnly } from './debounce.js';
import { SaveQueue } from '../state/save-queue.js';
import { candidates, candidateTrial, lineTrial, noRedshiftTrial, nudgedTrial, openingGrade, openingTrial, parseTypedZ, typedTrial, verdictFor, type Decision } from '../state/decision.js';
import { neighbour, nextFilter, nextPending, progress, type WorklistFilter } from '../state/worklist-view.js';
import { featureCentre } from '../science/feature-centre.js';
import { likelyLines } from '../science/line-pick.js';
import { stepSmoothing, type SmoothingKernel } from '../plot/smoothing.js';
import type { ActionId } from '../ui/keymap.js';

export interface View {
  /** Redraws everything but the plots. */
  panels(state: AppState): void;
  spectrum(state: AppState): Promise<void>;
  correlation(state: AppState): Promise<string | null>;
  fullRange(state: AppState): [number, number] | null;
  focusTypedZ(): void;
  focusNote(): void;
}

/** The latest answer of a live call, for the spectrum and z in `key`. */
export interface LiveSlot<T> {
  key: string;
  result: T | null;
  error: string | null;
}

/**
 * The list is asked for new suggestions first after FIRST_POLL_MS, then each time half as long
 * again, up to LONGEST_POLL_MS: a night of a few hundred spectra fills in within a second or
 * two, and a long batch is not re-listed many times a second (our choice, no source).
 */
const FIRST_POLL_MS = 400;
const LONGEST_POLL_MS = 2500;

export class Controller {
  readonly s: AppState = initialState();
  derived: LiveSlot<FrameResult> | null = null;
  host: LiveSlot<HostAnalysis> | null = null;
  private readonly cache: SpectrumCache;
  private readonly queue: SaveQueue;
  private readonly derivedCall: LatestOnly<{ id: string; z: number; zErr: number | null }, FrameResult>;
  private readonly hostCall: LatestOnly<{ id: string; z: number }, HostAnalysis>;
  private readonly overlayCall: LatestOnly<{ id: string; template: string; z: number }, { flux: (number | null)[] }>;
  private pollTimer: ReturnType<typeof setTimeout> | null = null;
  private pollDelayMs = FIRST_POLL_MS;
  /** Verdict changes made here (saves confirmed, undos) are counted, so that a list asked for before one of them cannot undo it on screen. */
  private localChanges = 0;
  private readonly changedAt = new Map<string, number>();

  constructor(private readonly api: HostApi, private readonly view: View) {
    this.cache = new SpectrumCache((id) => api.loadSpectrum({ id }));
    this.queue = new SaveQueue((input) => api.saveVerdict(input), {
      saved: (verdict, input) => this.onSaved(verdict, input),
      changed: (q) => {
        this.s.saves = [...q];
        this.view.panels(this.s);
      },
    });
    this.derivedCall = new LatestOnly(250, (req) => api.derived(req), (res) => {
      this.derived = { key: keyOf(res.req.id, res.req.z), result: res.ok ? res.value : null, error: res.ok ? null : res.error };
      this.view.panels(this.s);
    });
    this.hostCall = new LatestOnly(400, (req) => api.hostAnalysis(req), (res) => {
      this.host = { key: keyOf(res.req.id, res.req.z), result: res.ok ? res.value : null, error: res.ok ? null : res.error };
      this.view.panels(this.s);
    });
    this.overlayCall = new LatestOnly(150, (req) => api.templateModel(req), (res) => {
      if (res.req.id !== this.s.currentId) return;
      if (!res.ok) {
        this.s.overlayProblem = res.error;
        return this.view.panels(this.s);
      }
      this.s.overlayProblem = null;
      this.s.overlay = { key: overlayKey(res.req.template, res.req.z), flux: res.value.flux };
      void this.view.spectrum(this.s);
    });
  }

  // ---- start and worklist ------------------------------------------------------------------

  async start(): Promise<void> {
    this.api.getSettings({}).then((settings) => {
      this.s.settings = settings;
      this.view.panels(this.s);
    }, () => undefined);
    try {
      this.s.worklist = await this.api.listSpectra({});
      performance.mark('zvet:worklist');
    } catch (err) {
      this.s.problem = (err as Error).message;
      this.view.panels(this.s);
      return;
    }
    await this.openFirst();
  }

  /** Opens a worklist folder chosen in the window (when the host started without one, or another). */
  async openWorklist(path: string): Promise<void> {
    try {
      this.s.worklist = await this.api.openWorklist({ path: path.trim() });
      this.s.problem = null;
      this.s.view = null;
      this.s.currentId = null;
    } catch (err) {
      return this.say(`not opened: ${(err as Error).message}`);
    }
    this.s.settings = await this.api.getSettings({}).catch(() => this.s.settings);
    await this.openFirst();
  }

  private async openFirst(): Promise<void> {
    if (!this.s.worklist) return;
    const items = this.s.worklist.items;
    const first = nextPending(items, null) ?? items[0]?.id ?? null;
    this.s.filter = 'all';
    this.view.panels(this.s);
    if (first) await this.show(first);
    this.pollDelayMs = FIRST_POLL_MS;
    this.pollSuggestions();
  }

  /**
   * Refreshes the list now and then: often while the host measures in the background, so that
   * suggestions appear, then every LONGEST_POLL_MS, so that verdicts another window saves to the
   * same journal appear too. A verdict still on its way to the journal from here stays as it is.
   */
  private pollSuggestions(): void {
    if (this.pollTimer) clearTimeout(this.pollTimer);
    if (!this.s.worklist) return;
    this.pollTimer = setTimeout(async () => {
      try {
        const asked = this.localChanges;
        const fresh = await this.api.listSpectra({});
        if (this.s.worklist && this.s.worklist.root === fresh.root) this.adoptList(fresh, asked);
        this.view.panels(this.s);
      } catch {
        // The next poll tries again; a host that is gone shows on the next real call.
      }
      this.pollDelayMs = Math.min(LONGEST_POLL_MS, 1.5 * this.pollDelayMs);
      this.pollSuggestions();
    }, this.pollDelayMs);
  }

  /** Takes the host's list, asked for when `asked` local changes had been made, keeping the verdicts changed here since and those still being saved. */
  private adoptList(fresh: WorklistState, asked: number): void {
    const saving = new Set(this.queue.pending.map((q) => q.input.id));
    const keepLocal = (id: string) => saving.has(id) || (this.changedAt.get(id) ?? 0) > asked;
    // A file rewritten on disk (re-reduced) is read and measured again when next shown; at once if in view.
    const rewritten = fresh.items.filter((it) => { const was = this.itemOf(it.id)?.fileVersion; return was != null && it.fileVersion != null && was !== it.fileVersion; }).map((it) => it.id);
    for (const id of rewritten) this.cache.drop(id);
    if (this.s.currentId && rewritten.includes(this.s.currentId)) {
      const id = this.s.currentId;
      void this.show(id).then(() => this.say(`${id} changed on disk: it is shown and measured again as it is now`));
    }
    this.s.worklist = { ...fresh, items: fresh.items.map((it) => (keepLocal(it.id) ? { ...it, verdict: this.itemOf(it.id)?.verdict ?? null } : it)) };
    const v = this.s.view;
    const now = v && this.itemOf(v.id);
    if (v && now && !keepLocal(v.id) && JSON.stringify(now.verdict) !== JSON.stringify(v.verdict)) this.s.view = { ...v, verdict: now.verdict };
  }

  private changedHere(id: string): void {
    this.changedAt.set(id, ++this.localChanges);
  }

  /** The grade of the latest verdict for `id` still on its way to the journal, if any (so that coming back to it shows what was just decided). */
  private queuedGrade(id: string): AppState['grade'] | null {
    const input = [...this.queue.pending].reverse().find((q) => q.input.id === id)?.input;
    return input ? { confidence: input.confidence, objectClass: input.status === 'pending' ? null : input.objectClass, note: input.note } : null;
  }

  private itemOf(id: string) {
    return this.s.worklist?.items.find((it) => it.id === id) ?? null;
  }

  setFilter(f: WorklistFilter): void {
    this.s.filter = f;
    this.view.panels(this.s);
  }

  // ---- showing a spectrum ------------------------------------------------------------------

  /** Shows a spectrum; with `timed`, marks 'zvet:drawn' once the spectrum and markers are drawn. */
  async show(id: string, timed = false): Promise<void> {
    this.s.currentId = id;
    this.s.message = null;
    this.s.typedZProblem = null;
    this.s.identifying = false;
    // From the prefetch the spectrum draws at once; otherwise say it is on its way.
    this.s.loading = !this.cache.ready(id);
    if (this.s.loading) this.view.panels(this.s);
    let view: SpectrumView;
    try {
      view = await this.cache.get(id);
    } catch (err) {
      view = { id, arrays: null, meta: null, measurement: null, templateModel: null, verdict: this.itemOf(id)?.verdict ?? null, error: `${id}: ${(err as Error).message}`, measuredWith: {} };
    }
    if (this.s.currentId !== id) return;
    if (timed) performance.mark('zvet:loaded');
    const s = this.s;
    s.view = { ...view, verdict: this.itemOf(id)?.verdict ?? view.verdict };
    s.loading = false;
    s.trial = openingTrial(s.view);
    s.grade = this.queuedGrade(id) ?? openingGrade(s.view);
    s.xRange = null;
    s.correlationTemplate = s.trial.template ?? candidates(s.view)[0]?.template ?? null;
    s.overlay = view.templateModel ? { key: overlayKey(view.templateModel.template, view.templateModel.z), flux: view.templateModel.flux } : null;
    await this.view.spectrum(s);
    // The spectrum goes to the screen first; the panels and the correlation follow a frame later.
    await afterPaint();
    if (this.s.currentId !== id) return;
    if (timed) {
      performance.mark('zvet:drawn');
      performance.measure('zvet:next-to-drawn', 'zvet:next', 'zvet:drawn');
      performance.measure('zvet:next-to-loaded', 'zvet:next', 'zvet:loaded');
    }
    this.view.panels(s);
    void this.view.correlation(s);
    this.trialChanged(false);
    const items = s.worklist?.items ?? [];
    this.cache.prefetch(neighbour(items, s.filter, id, 1));
    this.cache.prefetch(nextPending(items, id));
    this.cache.prefetch(neighbour(items, s.filter, id, -1));
  }

  private go(target: string | null, what: string): void {
    if (!target) {
      this.say(`no ${what} spectrum`);
      return;
    }
    performance.mark('zvet:next');
    void this.show(target, true);
  }

  // ---- the trial z and what follows it -----------------------------------------------------

  /** After the trial z moved: redraw markers, follow with the overlay and the live panels. */
  private trialChanged(redraw = true): void {
    const s = this.s;
    s.typedZProblem = null;
    if (redraw) {
      void this.view.spectrum(s);
      void this.view.correlation(s);
      this.view.panels(s);
    }
    const id = s.currentId;
    const z = s.trial.z;
    if (!id || z === null || !s.view?.arrays) return;
    this.derivedCall.request({ id, z, zErr: s.trial.zErr });
    if (s.tab === 'host') this.hostCall.request({ id, z });
    const template = s.trial.template ?? candidates(s.view)[0]?.template;
    if (s.showTemplate && template && s.overlay?.key !== overlayKey(template, z)) this.overlayCall.request({ id, template, z });
  }

  tryCandidate(index: number): void {
    if (!candidates(this.s.view)[index]) return this.say(`there is no candidate ${index + 1}`);
    this.s.trial = candidateTrial(this.s.view, index);
    this.s.correlationTemplate = this.s.trial.template;
    this.trialChanged();
  }

  nudge(kms: number): void {
    if (this.s.trial.z === null) return this.say('no trial z to nudge: try a candidate or type a z');
    this.s.trial = nudgedTrial(this.s.trial, kms);
    this.trialChanged();
  }

  typedZ(text: string): boolean {
    const z = parseTypedZ(text);
    if (typeof z !== 'number') {
      this.s.typedZProblem = z.refused;
      this.view.panels(this.s);
      return false;
    }
    this.s.typedZProblem = null;
    this.s.trial = typedTrial(z);
    this.trialChanged();
    return true;
  }

  featureClicked(clickAngstrom: number): void {
    const s = this.s;
    if (!s.view?.arrays) return;
    const centre = featureCentre(s.view.arrays.waveAngstrom, s.view.arrays.flux, clickAngstrom);
    const waveAngstrom = centre?.waveAngstrom ?? clickAngstrom;
    s.linePick = { waveAngstrom, clickAngstrom, choices: likelyLines(waveAngstrom, s.trial.z, candidates(s.view).map((c) => c.z)) };
    s.modal = 'line-pick';
    s.identifying = false;
    this.view.panels(s);
    void this.view.spectrum(s);
  }

  chooseLine(index: number): void {
    const pick = this.s.linePick;
    const c = pick?.choices[index];
    if (!pick || !c) return;
    this.s.trial = lineTrial(c.z, c.line.label, pick.waveAngstrom, c.line.waveVacuumAngstrom);
    this.closeModal();
    this.trialChanged();
  }

  closeModal(): void {
    const picking = this.s.linePick !== null;
    this.s.modal = 'none';
    this.s.linePick = null;
    this.s.identifying = false;
    this.view.panels(this.s);
    if (picking) void this.view.spectrum(this.s);
  }

  // ---- verdicts ----------------------------------------------------------------------------

  decide(decision: Decision): void {
    const s = this.s;
    if (!s.view) return;
    if (!s.view.arrays && decision.kind !== 'no-redshift' && decision.kind !== 'note') return this.say('this file cannot be read: only "no redshift" (and a note) can be saved for it');
    const input = verdictFor(s.view, decision, s.trial, s.grade);
    if ('refused' in input) return this.say(input.refused);
    // From now on the grade is the one being saved (pressed, no longer a suggestion); a note
    // kept on a spectrum not vetted leaves the rest of the grade being chosen as it is.
    s.grade = decision.kind === 'note' ? { ...s.grade, note: input.note } : { confidence: input.confidence, objectClass: input.objectClass, note: input.note };
    const trialDropped = decision.kind === 'accept-best' && s.trial.z !== null && s.trial.candidateIndex !== 0 && s.trial.source !== 'saved';
    if (decision.kind === 'accept-best') s.trial = candidateTrial(s.view, 0);
    if (decision.kind === 'no-redshift') {
      // Nothing is left to mark or to derive: no trial z, no confidence.
      s.trial = noRedshiftTrial();
    }
    s.message = trialDropped ? 'accepted candidate 1 as measured; the trial z was not saved (Enter saves a trial z)' : null;
    void this.queue.enqueue(input);
    this.trialChanged();
  }

  private onSaved(verdict: Verdict, input: VerdictInput): void {
    const s = this.s;
    const item = this.itemOf(input.id);
    if (item) item.verdict = verdict;
    this.changedHere(input.id);
    this.cache.drop(input.id);
    if (s.currentId === input.id && s.view) s.view = { ...s.view, verdict };
    s.lastSaved = { id: input.id, time: verdict.time.slice(11, 19) };
    this.pollSuggestions();
  }

  private regrade(): void {
    const v = this.s.view?.verdict;
    if (v && v.status !== 'pending') this.decide({ kind: 'regrade', verdict: v });
    else this.view.panels(this.s);
  }

  setConfidence(c: Confidence): void {
    if (this.s.trial.z === null) return this.say('a confidence goes with a z: try a candidate or type a z first');
    this.s.grade = { ...this.s.grade, confidence: c };
    this.regrade();
  }

  setClass(c: ObjectClass): void {
    this.s.grade = { ...this.s.grade, objectClass: c };
    this.regrade();
  }

  /** Keeps the note: with the verdict in force, or on a spectrum not vetted yet as a pending verdict (a note left only in the form was lost on moving on). */
  setNote(text: string): void {
    this.s.grade = { ...this.s.grade, note: text };
    const v = this.s.view?.verdict;
    if (v && v.status !== 'pending') this.decide({ kind: 'regrade', verdict: v });
    else if (text !== (v?.note ?? '')) this.decide({ kind: 'note' });
    else this.view.panels(this.s);
  }

  async undo(): Promise<void> {
    try {
      const { id, verdict } = await this.api.undoLast({});
      if (id === null) return this.say('nothing to undo');
      const item = this.itemOf(id);
      if (item) item.verdict = verdict;
      this.changedHere(id);
      this.cache.drop(id);
      const s = this.s;
      if (s.currentId === id && s.view) {
        s.view = { ...s.view, verdict };
        s.trial = openingTrial(s.view);
        s.grade = openingGrade(s.view);
        this.trialChanged();
      }
      this.say(`undone: ${id} is now ${verdict && verdict.status !== 'pending' ? verdict.status : 'pending'}`);
    } catch (err) {
      this.say(`undo failed: ${(err as Error).message}`);
    }
  }

  /** Measures the spectrum in view again with other options; the host keeps them for it. */
  async remeasure(options: RemeasureOptions): Promise<void> {
    const id = this.s.currentId;
    if (!id) return;
    this.closeModal();
    this.say(`measuring ${id} again…`);
    try {
      await this.api.remeasure({ id, options });
      this.cache.drop(id);
      await this.show(id);
      // A verdict saved on the other reading of the wavelengths holds for that reading only.
      const v = this.s.view?.verdict;
      const savedOnOther = v && v.z !== null && (v.medium ?? null) !== (options.medium ?? null);
      this.say(savedOnOther ? `${id} measured again; its verdict was saved with the wavelengths read ${v.medium ? `as ${v.medium}` : 'as the file says'}: save it again to keep it on this reading` : `${id} measured again`);
    } catch (err) {
      this.say(`not measured again: ${(err as Error).message}`);
    }
  }

  retrySaves(): void {
    void this.queue.retry();
  }

  async exportAs(format: ExportFormat): Promise<void> {
    const r = await this.writeCatalogue(format);
    this.s.exportResult = r.ok ? { ok: true, text: `${format.toUpperCase()}: ${r.rows} rows written to ${r.path}` } : r;
    this.view.panels(this.s);
  }

  private async writeCatalogue(format: ExportFormat): Promise<{ ok: true; rows: number; path: string } | { ok: false; text: string }> {
    this.s.exportResult = { ok: true, text: `writing ${format.toUpperCase()}…` };
    this.view.panels(this.s);
    try {
      return { ok: true, ...(await this.api.exportCatalogue({ format })) };
    } catch (err) {
      return { ok: false, text: `${format.toUpperCase()} not written: ${(err as Error).message}` };
    }
  }

  /** All three formats; one line for the folder they went to, one per failure. */
  private async exportAll(): Promise<void> {
    const results = [];
    for (const f of ['csv', 'ecsv', 'fits'] as const) results.push(await this.writeCatalogue(f));
    const written = results.flatMap((r) => (r.ok ? [r] : []));
    const failed = results.flatMap((r) => (r.ok ? [] : [r.text]));
    const folder = (path: string) => path.slice(0, Math.max(path.lastIndexOf('/'), path.lastIndexOf('\\')) + 1);
    const sameFolder = written.every((r) => folder(r.path) === folder(written[0].path));
    const lines = written.length === 0 ? [] : sameFolder
      ? [`${written[0].rows} rows written to ${folder(written[0].path)}: ${written.map((r) => r.path.slice(folder(r.path).length)).join(', ')}`]
      : written.map((r) => `${r.rows} rows written to ${r.path}`);
    this.s.exportResult = { ok: failed.length === 0, text: [...lines, ...failed].join('\n') };
    this.view.panels(this.s);
  }

  /** What a catalogue written now holds that is not vetted, in one line (or '' when all are). */
  unvettedNote(): string {
    const { vetted, total } = progress(this.s.worklist?.items ?? []);
    return vetted === total ? '' : `${total - vetted} of ${total} not vetted yet: their rows say pending, with no z`;
  }

  // ---- the view of the spectrum ------------------------------------------------------------

  setRange(range: [number, number] | null): void {
    this.s.xRange = range;
    void this.view.spectrum(this.s);
  }

  private panZoom(kind: 'pan' | 'zoom', amount: number): void {
    const full = this.view.fullRange(this.s);
    if (!full) return;
    const [lo, hi] = this.s.xRange ?? full;
    const width = hi - lo;
    if (kind === 'pan') this.setRange([lo + amount * width, hi + amount * width]);
    else {
      const mid = (lo + hi) / 2;
      const half = Math.min((full[1] - full[0]) * 0.75, Math.max(20, (width * amount) / 2));
      this.setRange([mid - half, mid + half]);
    }
  }

  setSmoothing(kernel: SmoothingKernel, widthPx: number): void {
    this.s.smoothing = { kernel, widthPx: Math.max(1, Math.min(51, Math.round(widthPx) || 1)) };
    void this.view.spectrum(this.s);
    this.view.panels(this.s);
  }

  setTemplate(on: boolean): void {
    this.s.showTemplate = on;
    this.trialChanged();
  }

  setSky(on: boolean): void {
    this.s.showSky = on;
    void this.view.spectrum(this.s);
    this.view.panels(this.s);
  }

  /** Distances in another cosmology preset: saved in the settings, then the panel follows. */
  async setCosmology(preset: string): Promise<void> {
    try {
      this.s.settings = await this.api.putSettings({ cosmologyPreset: preset });
    } catch (err) {
      return this.say(`cosmology not changed: ${(err as Error).message}`);
    }
    const { currentId: id, trial } = this.s;
    this.derived = null;
    this.view.panels(this.s);
    if (id && trial.z !== null) this.derivedCall.request({ id, z: trial.z, zErr: trial.zErr });
  }

  setTab(tab: AppState['tab']): void {
    this.s.tab = tab;
    this.view.panels(this.s);
    const { currentId: id, trial } = this.s;
    if (tab === 'host' && id && trial.z !== null && this.host?.key !== keyOf(id, trial.z)) this.hostCall.request({ id, z: trial.z });
  }

  private cycleCorrelation(): void {
    const curves = this.s.view?.measurement?.correlations ?? [];
    if (curves.length === 0) return;
    const at = curves.findIndex((c) => c.template === this.s.correlationTemplate);
    this.s.correlationTemplate = curves[(at + 1) % curves.length].template;
    void this.view.correlation(this.s);
  }

  say(message: string): void {
    this.s.message = message;
    this.view.panels(this.s);
  }

  // ---- keys --------------------------------------------------------------------------------

  act(action: ActionId): void {
    const s = this.s;
    const items = s.worklist?.items ?? [];
    if ((s.modal === 'help' && action !== 'help' && action !== 'escape') || (s.modal === 'remeasure' && action !== 'escape')) return;
    switch (action) {
      case 'accept-best': return this.decide({ kind: 'accept-best' });
      case 'candidate-1': case 'candidate-2': case 'candidate-3': case 'candidate-4': case 'candidate-5':
        return this.tryCandidate(Number(action.slice(-1)) - 1);
      case 'no-redshift': return this.decide({ kind: 'no-redshift' });
      case 'type-z': return this.view.focusTypedZ();
      case 'save-trial-z': return this.decide({ kind: 'trial' });
      case 'identify-line':
        s.identifying = true;
        return this.say('click a feature on the spectrum, then choose its rest line');
      case 'nudge-down-small': return this.nudge(-10);
      case 'nudge-up-small': return this.nudge(10);
      case 'nudge-down-large': return this.nudge(-100);
      case 'nudge-up-large': return this.nudge(100);
      case 'confidence-secure': return this.setConfidence('secure');
      case 'confidence-likely': return this.setConfidence('likely');
      case 'confidence-tentative': return this.setConfidence('tentative');
      case 'class-galaxy': return this.setClass('galaxy');
      case 'class-agn': return this.setClass('agn');
      case 'class-qso': return this.setClass('qso');
      case 'class-star': return this.setClass('star');
      case 'class-unknown': return this.setClass('unknown');
      case 'edit-note': return this.view.focusNote();
      case 'next': return this.go(neighbour(items, s.filter, s.currentId, 1), 'next');
      case 'previous': return this.go(neighbour(items, s.filter, s.currentId, -1), 'previous');
      case 'next-pending': return this.go(nextPending(items, s.currentId), 'pending');
      case 'undo': return void this.undo();
      case 'retry-saves': return this.retrySaves();
      case 'pan-left': return this.panZoom('pan', -0.25);
      case 'pan-right': return this.panZoom('pan', 0.25);
      case 'zoom-in': return this.panZoom('zoom', 1 / 1.6);
      case 'zoom-out': return this.panZoom('zoom', 1.6);
      case 'zoom-reset': return this.setRange(null);
      case 'smooth-less': return this.setSmoothing(s.smoothing.kernel, stepSmoothing(s.smoothing.widthPx, -1));
      case 'smooth-more': return this.setSmoothing(s.smoothing.kernel, stepSmoothing(s.smoothing.widthPx, 1));
      case 'smooth-kernel': return this.setSmoothing(s.smoothing.kernel === 'boxcar' ? 'gaussian' : 'boxcar', s.smoothing.widthPx);
      case 'toggle-template': return this.setTemplate(!s.showTemplate);
      case 'toggle-sky': return this.setSky(!s.showSky);
      case 'cycle-filter': return this.setFilter(nextFilter(s.filter));
      case 'cycle-correlation': return this.cycleCorrelation();
      case 'remeasure':
        if (!s.view?.arrays) return this.say('this file cannot be read, so it cannot be measured');
        s.modal = 'remeasure';
        return this.view.panels(s);
      case 'tab-derived': return this.setTab('derived');
      case 'tab-host': return this.setTab('host');
      case 'export': return void this.exportAll();
      case 'help':
        s.modal = s.modal === 'help' ? 'none' : 'help';
        return this.view.panels(s);
      case 'escape': return this.closeModal();
    }
  }
}

/** Resolves once the browser has painted the current frame (a frame callback, then a task). */
function afterPaint(): Promise<void> {
  return new Promise((done) => requestAnimationFrame(() => setTimeout(done, 0)));
}

/** Identifies a live result by spectrum and trial z. */
export function keyOf(id: string, z: number): string {
  return `${id}@${z.toPrecision(9)}`;
}

function overlayKey(template: string, z: number): string {
  return `${template}@${z.toPrecision(9)}`;
}

/** Everything the window shows, in one place; panels read it, the controller changes it. */
import type { Settings, SpectrumView, WorklistState } from '../../core/api/host-api.js';
import type { Grade, Trial } from '../state/decision.js';
import type { WorklistFilter } from '../state/worklist-view.js';
import type { SmoothingSetting } from '../plot/smoothing.js';
import type { LineChoice } from '../science/line-pick.js';
import type { QueuedSave } from '../state/save-queue.js';

export interface AppState {
  worklist: WorklistState | null;
  filter: WorklistFilter;
  currentId: string | null;
  view: SpectrumView | null;
  /** Set while the spectrum in view is being fetched. */
  loading: boolean;
  /** One line when the host could not be reached or refused a call. */
  problem: string | null;
  trial: Trial;
  grade: Grade;
  smoothing: SmoothingSetting;
  showTemplate: boolean;
  showSky: boolean;
  xRange: [number, number] | null;
  /** Template whose correlation curve is shown. */
  correlationTemplate: string | null;
  /** Template overlay flux for the trial z (fetched), keyed by template and z. */
  overlay: { key: string; flux: (number | null)[] } | null;
  /** Why the host could not give the template overlay, when it could not. */
  overlayProblem: string | null;
  tab: 'derived' | 'host';
  modal: 'none' | 'help' | 'line-pick' | 'remeasure';
  identifying: boolean;
  /** The feature's centre (snapped from the click) and the click itself, vacuum Å. */
  linePick: { waveAngstrom: number; clickAngstrom: number; choices: LineChoice[] } | null;
  saves: readonly QueuedSave[];
  lastSaved: { id: string; time: string } | null;
  exportResult: { ok: boolean; text: string } | null;
  /** The host's settings (cosmology preset, recent worklists), once read. */
  settings: Settings | null;
  message: string | null;
  /** Why the typed z was refused, shown beside the field. */
  typedZProblem: string | null;
}

export const NO_TRIAL: Trial = { z: null, zErr: null, template: null, candidateIndex: null, source: 'none', detail: '', nudgedKmS: 0 };

export function initialState(): AppState {
  return {
    worklist: null,
    filter: 'all',
    currentId: null,
    view: null,
    loading: false,
    problem: null,
    trial: NO_TRIAL,
    grade: { confidence: null, objectClass: 'unknown', note: '' },
    smoothing: { kernel: 'boxcar', widthPx: 1 },
    showTemplate: true,
    showSky: false,
    xRange: null,
    correlationTemplate: null,
    overlay: null,
    overlayProblem: null,
    tab: 'derived',
    modal: 'none',
    identifying: false,
    linePick: null,
    saves: [],
    lastSaved: null,
    exportResult: null,
    settings: null,
    message: null,
    typedZProblem: null,
  };
}

/**
 * zvet's own keyboard scheme: one table, used both to dispatch keys and to draw the help overlay,
 * so the overlay can never list a key that does not work (or miss one that does).
 */

export const ACTION_IDS = [
  'accept-best',
  'candidate-1',
  'candidate-2',
  'candidate-3',
  'candidate-4',
  'candidate-5',
  'no-redshift',
  'type-z',
  'save-trial-z',
  'identify-line',
  'nudge-down-small',
  'nudge-up-small',
  'nudge-down-large',
  'nudge-up-large',
  'confidence-secure',
  'confidence-likely',
  'confidence-tentative',
  'class-galaxy',
  'class-agn',
  'class-qso',
  'class-star',
  'class-unknown',
  'edit-note',
  'next',
  'previous',
  'next-pending',
  'undo',
  'retry-saves',
  'pan-left',
  'pan-right',
  'zoom-in',
  'zoom-out',
  'zoom-reset',
  'smooth-less',
  'smooth-more',
  'smooth-kernel',
  'toggle-template',
  'toggle-sky',
  'cycle-filter',
  'tab-derived',
  'tab-host',
  'export',
  'cycle-correlation',
  'remeasure',
  'help',
  'escape',
] as const;
export type ActionId = (typeof ACTION_IDS)[number];

export interface Binding {
  action: ActionId;
  keys: string[];
  group: 'Decide' | 'Grade' | 'Move' | 'View' | 'Panels';
  label: string;
}

export const KEYMAP: readonly Binding[] = [
  { action: 'accept-best', keys: ['a'], group: 'Decide', label: 'Accept the best candidate' },
  { action: 'candidate-1', keys: ['1'], group: 'Decide', label: 'Try candidate 1 (Enter saves it)' },
  { action: 'candidate-2', keys: ['2'], group: 'Decide', label: 'Try candidate 2 (Enter saves it)' },
  { action: 'candidate-3', keys: ['3'], group: 'Decide', label: 'Try candidate 3 (Enter saves it)' },
  { action: 'candidate-4', keys: ['4'], group: 'Decide', label: 'Try candidate 4 (Enter saves it)' },
  { action: 'candidate-5', keys: ['5'], group: 'Decide', label: 'Try candidate 5 (Enter saves it)' },
  { action: 'no-redshift', keys: ['x'], group: 'Decide', label: 'No redshift can be measured' },
  { action: 'type-z', keys: ['z'], group: 'Decide', label: 'Type a redshift' },
  { action: 'save-trial-z', keys: ['Enter'], group: 'Decide', label: 'Save the trial z (after nudging or typing)' },
  { action: 'identify-line', keys: ['i'], group: 'Decide', label: 'Identify a line: then click a feature and choose its rest line' },
  { action: 'nudge-down-small', keys: [','], group: 'Decide', label: 'Trial z −10 km/s' },
  { action: 'nudge-up-small', keys: ['.'], group: 'Decide', label: 'Trial z +10 km/s' },
  { action: 'nudge-down-large', keys: ['<'], group: 'Decide', label: 'Trial z −100 km/s' },
  { action: 'nudge-up-large', keys: ['>'], group: 'Decide', label: 'Trial z +100 km/s' },
  { action: 'undo', keys: ['u'], group: 'Decide', label: 'Undo the last saved verdict' },
  { action: 'retry-saves', keys: ['Shift+R'], group: 'Decide', label: 'Retry verdicts that failed to save' },
  { action: 'confidence-secure', keys: ['s'], group: 'Grade', label: 'Confidence: secure' },
  { action: 'confidence-likely', keys: ['l'], group: 'Grade', label: 'Confidence: likely' },
  { action: 'confidence-tentative', keys: ['t'], group: 'Grade', label: 'Confidence: tentative' },
  { action: 'class-galaxy', keys: ['Shift+G'], group: 'Grade', label: 'Class: galaxy' },
  { action: 'class-agn', keys: ['Shift+A'], group: 'Grade', label: 'Class: agn' },
  { action: 'class-qso', keys: ['Shift+Q'], group: 'Grade', label: 'Class: qso' },
  { action: 'class-star', keys: ['Shift+S'], group: 'Grade', label: 'Class: star' },
  { action: 'class-unknown', keys: ['Shift+U'], group: 'Grade', label: 'Class: unknown' },
  { action: 'edit-note', keys: ['m'], group: 'Grade', label: 'Write a note (Enter saves it, Esc leaves)' },
  { action: 'next', keys: ['n', 'ArrowDown'], group: 'Move', label: 'Next spectrum' },
  { action: 'previous', keys: ['p', 'ArrowUp'], group: 'Move', label: 'Previous spectrum' },
  { action: 'next-pending', keys: ['Shift+N'], group: 'Move', label: 'Next pending spectrum' },
  { action: 'cycle-filter', keys: ['f'], group: 'Move', label: 'Worklist filter: pending → all → secure → likely → tentative' },
  { action: 'pan-left', keys: ['ArrowLeft'], group: 'View', label: 'Pan towards blue' },
  { action: 'pan-right', keys: ['ArrowRight'], group: 'View', label: 'Pan towards red' },
  { action: 'zoom-in', keys: ['=', '+'], group: 'View', label: 'Zoom in (wavelength)' },
  { action: 'zoom-out', keys: ['-'], group: 'View', label: 'Zoom out (wavelength)' },
  { action: 'zoom-reset', keys: ['0'], group: 'View', label: 'Show the whole spectrum' },
  { action: 'smooth-less', keys: ['['], group: 'View', label: 'Less smoothing' },
  { action: 'smooth-more', keys: [']'], group: 'View', label: 'More smoothing' },
  { action: 'smooth-kernel', keys: ['k'], group: 'View', label: 'Smoothing kernel: boxcar ↔ Gaussian' },
  { action: 'toggle-template', keys: ['o'], group: 'View', label: 'Best template overlay on/off' },
  { action: 'toggle-sky', keys: ['y'], group: 'View', label: 'Sky spectrum on/off' },
  { action: 'tab-derived', keys: ['d'], group: 'Panels', label: 'Show derived quantities' },
  { action: 'tab-host', keys: ['h'], group: 'Panels', label: 'Show host galaxy lines and diagram' },
  { action: 'export', keys: ['Shift+E'], group: 'Panels', label: 'Export the catalogue (CSV, ECSV, FITS)' },
  { action: 'cycle-correlation', keys: ['c'], group: 'View', label: 'Correlation curve: next template' },
  { action: 'remeasure', keys: ['Shift+M'], group: 'View', label: 'Measure again: z range, templates, masks, air or vacuum wavelengths' },
  { action: 'help', keys: ['?'], group: 'Panels', label: 'This list of keys' },
  { action: 'escape', keys: ['Escape'], group: 'Panels', label: 'Close a panel, cancel identifying a line' },
];

const byKey = new Map<string, ActionId>(KEYMAP.flatMap((b) => b.keys.map((k) => [k, b.action] as [string, ActionId])));

/** The key as written in KEYMAP: letters with Shift as "Shift+X"; symbols as typed. */
export function keyName(e: { key: string; shiftKey: boolean }): string {
  if (/^[a-z]$/i.test(e.key)) return e.shiftKey ? `Shift+${e.key.toUpperCase()}` : e.key.toLowerCase();
  return e.key;
}

/** The action bound to a key press, or null. Keys held with Ctrl, Alt or Meta belong to the system. */
export function actionFor(e: { key: string; shiftKey: boolean; ctrlKey: boolean; altKey: boolean; metaKey: boolean }): ActionId | null {
  if (e.ctrlKey || e.altKey || e.metaKey) return null;
  return byKey.get(keyName(e)) ?? null;
}

/** How a key is shown in the help overlay. */
export function keyLabel(key: string): string {
  const names: Record<string, string> = { ArrowDown: '↓', ArrowUp: '↑', ArrowLeft: '←', ArrowRight: '→', Escape: 'Esc', Enter: 'Enter' };
  return names[key] ?? key;
}

/**
 * Line markers: which rest lines fall in the plotted range at a redshift, where they go, and how
 * their labels are stacked so that close lines stay readable. Pure; the figure turns these into
 * plotly shapes and annotations.
 */
import { REST_LINES, type LineKind, type RestLine } from '../../core/redshift/line-list.js';
import { observedWave } from '../science/z-math.js';

/** How each kind of line is drawn: never by colour alone (dash pattern, glyph and label side). */
export const MARKER_STYLE: Record<LineKind, { dash: 'solid' | 'dash' | 'dashdot'; glyph: string; side: 'top' | 'bottom' }> = {
  emission: { dash: 'solid', glyph: '▲', side: 'top' },
  absorption: { dash: 'dash', glyph: '▼', side: 'bottom' },
  both: { dash: 'dashdot', glyph: '◆', side: 'top' },
};

export interface LineMarker {
  /** One label for a close group of same-named lines (a doublet, the Mg b triplet). */
  label: string;
  kind: LineKind;
  ids: string[];
  /** Observed wavelength of each member line, Å. */
  observedWaveAngstrom: number[];
  /** Where the label sits: the mean of its members, Å. */
  labelWaveAngstrom: number;
  /** Stacking row of the label, 0 nearest the plot edge. */
  row: number;
  /** False when no row had room: the label shows only its glyph (the name is in the hover text). */
  named: boolean;
}

/** Same-named lines closer than this in the rest frame share one label (Å, common practice). */
const GROUP_REST_ANGSTROM = 12;

/** Groups lines that share a label and lie close together; lines are taken in wavelength order. */
export function groupLines(lines: readonly RestLine[]): RestLine[][] {
  const sorted = [...lines].sort((a, b) => a.waveVacuumAngstrom - b.waveVacuumAngstrom);
  const groups: RestLine[][] = [];
  for (const line of sorted) {
    const last = groups[groups.length - 1];
    const prev = last?.[last.length - 1];
    if (prev && prev.label === line.label && prev.kind === line.kind && line.waveVacuumAngstrom - prev.waveVacuumAngstrom < GROUP_REST_ANGSTROM) last.push(line);
    else groups.push([line]);
  }
  return groups;
}

export interface LabelGeometry {
  /** Plot width in CSS pixels. */
  widthPx: number;
  /** Width of one label character in CSS pixels. */
  charPx: number;
  /** Most rows of labels per side; a label with no room left shows only its glyph. */
  maxRows: number;
}

/** Markers for the lines inside [loAngstrom, hiAngstrom] at redshift z, labels stacked in rows. */
export function markersInRange(z: number, loAngstrom: number, hiAngstrom: number, geometry: LabelGeometry, lines: readonly RestLine[] = REST_LINES): LineMarker[] {
  const markers: LineMarker[] = [];
  for (const group of groupLines(lines)) {
    const obs = group.map((l) => observedWave(l.waveVacuumAngstrom, z)).filter((w) => w >= loAngstrom && w <= hiAngstrom);
    if (obs.length === 0) continue;
    markers.push({
      label: group[0].label,
      kind: group[0].kind,
      ids: group.map((l) => l.id),
      observedWaveAngstrom: obs,
      labelWaveAngstrom: obs.reduce((s, w) => s + w, 0) / obs.length,
      row: 0,
      named: true,
    });
  }
  const pxPerAngstrom = geometry.widthPx / (hiAngstrom - loAngstrom);
  for (const side of ['top', 'bottom'] as const) {
    const rowEnds: number[] = [];
    for (const m of markers.filter((mk) => MARKER_STYLE[mk.kind].side === side)) {
      const halfWidth = ((m.label.length + 2) * geometry.charPx) / 2;
      // A label near an edge moves inward so that it is not cut off; its line stays where it is.
      const centre = Math.min(Math.max((m.labelWaveAngstrom - loAngstrom) * pxPerAngstrom, halfWidth), Math.max(halfWidth, geometry.widthPx - halfWidth));
      m.labelWaveAngstrom = loAngstrom + centre / pxPerAngstrom;
      let row = rowEnds.findIndex((end) => end + geometry.charPx <= centre - halfWidth);
      if (row < 0 && rowEnds.length < geometry.maxRows) row = rowEnds.length;
      if (row < 0) {
        m.named = false;
        m.row = geometry.maxRows;
        continue;
      }
      rowEnds[row] = centre + halfWidth;
      m.row = row;
    }
  }
  return markers;
}

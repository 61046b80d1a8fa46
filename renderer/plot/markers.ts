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
  /** Stacking row of the label, 0 nearest the plot edge; maxRows for a glyph alone. */
  row: number;
  /**
   * What is drawn besides the line: glyph and name; the glyph alone, in the row past the last
   * when no row had room for the name; or only the line when not even the glyph fits (zooming
   * in gives the labels room).
   */
  shows: 'name' | 'glyph' | 'line';
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
  /** Most rows of named labels per side; a label with no room left shows only its glyph, in one row past them. */
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
      shows: 'name',
    });
  }
  const pxPerAngstrom = geometry.widthPx / (hiAngstrom - loAngstrom);
  const gap = geometry.charPx;
  for (const side of ['top', 'bottom'] as const) {
    const rows: Span[][] = [];
    const glyphRow: Span[] = [];
    // Named first where a redshift is usually read from; the others in wavelength order.
    const bySide = markers.filter((mk) => MARKER_STYLE[mk.kind].side === side);
    for (const m of [...bySide].sort((a, b) => labelPriority(a) - labelPriority(b))) {
      const wavePx = (m.labelWaveAngstrom - loAngstrom) * pxPerAngstrom;
      const halfWidth = ((m.label.length + 2) * geometry.charPx) / 2;
      // A label near an edge moves inward so that it is not cut off; its line stays where it is.
      const centre = inward(wavePx, halfWidth, geometry.widthPx);
      let row = rows.findIndex((r) => clear(r, centre - halfWidth, centre + halfWidth, gap));
      if (row < 0 && rows.length < geometry.maxRows) row = rows.push([]) - 1;
      if (row >= 0) {
        rows[row].push([centre - halfWidth, centre + halfWidth]);
        m.row = row;
        m.labelWaveAngstrom = loAngstrom + centre / pxPerAngstrom;
        continue;
      }
      // The glyph alone, with half a character's space on either side.
      const glyphHalf = GLYPH_HALF_CHARS * geometry.charPx;
      const glyphCentre = inward(wavePx, glyphHalf, geometry.widthPx);
      m.row = geometry.maxRows;
      m.labelWaveAngstrom = loAngstrom + glyphCentre / pxPerAngstrom;
      m.shows = clear(glyphRow, glyphCentre - glyphHalf, glyphCentre + glyphHalf, 0) ? 'glyph' : 'line';
      if (m.shows === 'glyph') glyphRow.push([glyphCentre - glyphHalf, glyphCentre + glyphHalf]);
    }
  }
  return markers;
}

/**
 * Lines whose labels are placed first, so that a crowded plot still names them: the strong
 * lines a redshift is usually recognised by (common practice, no source).
 */
const KEY_LINES = ['Halpha', 'Hbeta', '[OIII]5008', '[OII]3727', 'Lya', 'CIV', 'CIII]', 'MgII', 'CaK', 'CaH', 'NaD2', 'Mgb5169', '[NII]6585', '[SII]6718', 'Gband'];

function labelPriority(m: LineMarker): number {
  const i = m.ids.reduce((best, id) => Math.min(best, KEY_LINES.includes(id) ? KEY_LINES.indexOf(id) : Infinity), Infinity);
  return Number.isFinite(i) ? i - KEY_LINES.length : 0;
}

/** A label's extent in a row, px. */
type Span = [number, number];

/** Whether [a, b] keeps at least `gap` px from every span of the row. */
function clear(row: readonly Span[], a: number, b: number, gap: number): boolean {
  return row.every(([lo, hi]) => b + gap <= lo || a >= hi + gap);
}

/** Half the width of a glyph drawn alone, in characters. */
const GLYPH_HALF_CHARS = 1;

/** A label's centre, px: at its line, moved inward just enough to stay inside [0, widthPx]. */
function inward(centrePx: number, halfWidthPx: number, widthPx: number): number {
  return Math.min(Math.max(centrePx, halfWidthPx), Math.max(halfWidthPx, widthPx - halfWidthPx));
}

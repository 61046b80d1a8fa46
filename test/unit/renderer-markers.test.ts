import { describe, expect, it } from 'vitest';
import { groupLines, MARKER_STYLE, markersInRange } from '../../renderer/plot/markers.js';
import { REST_LINES, restLine } from '../../core/redshift/line-list.js';

const geometry = { widthPx: 1000, charPx: 7.5, maxRows: 3 };

describe('line markers', () => {
  it('places each line at λ_rest·(1+z) and only inside the range', () => {
    const z = 0.1;
    const ms = markersInRange(z, 3600, 9400, geometry);
    const ha = ms.find((m) => m.ids.includes('Halpha'));
    expect(ha?.observedWaveAngstrom[0]).toBeCloseTo(6564.61 * 1.1, 6);
    for (const m of ms) for (const w of m.observedWaveAngstrom) {
      expect(w).toBeGreaterThanOrEqual(3600);
      expect(w).toBeLessThanOrEqual(9400);
    }
    // Lyα at z = 0.1 is at 1337 Å: out of range.
    expect(ms.some((m) => m.ids.includes('Lya'))).toBe(false);
  });
  it('groups the [O II] doublet and Mg b triplet under one label, keeps the [O III] pair apart', () => {
    const groups = groupLines(REST_LINES).map((g) => g.map((l) => l.id));
    expect(groups).toContainEqual(['[OII]3727', '[OII]3730']);
    expect(groups).toContainEqual(['Mgb5169', 'Mgb5174', 'Mgb5185']);
    expect(groups).toContainEqual(['[OIII]4960']);
  });
  it('tells emission from absorption by dash, glyph and label side, not colour', () => {
    expect(MARKER_STYLE.emission.dash).not.toBe(MARKER_STYLE.absorption.dash);
    expect(MARKER_STYLE.emission.glyph).not.toBe(MARKER_STYLE.absorption.glyph);
    expect(MARKER_STYLE.emission.side).not.toBe(MARKER_STYLE.absorption.side);
    expect(restLine('CaK').kind).toBe('absorption');
  });
  it('stacks close labels in different rows: [N II], Hα, [N II] at z = 0.05', () => {
    const ms = markersInRange(0.05, 6700, 7100, { widthPx: 300, charPx: 7.5, maxRows: 3 });
    const rows = ['[NII]6550', 'Halpha', '[NII]6585'].map((id) => ms.find((m) => m.ids.includes(id))?.row);
    expect(new Set(rows).size).toBe(3);
  });
  it('labels far apart share the first row', () => {
    const ms = markersInRange(0, 4800, 6000, geometry).filter((m) => ['Hbeta', 'HeI5877'].includes(m.ids[0]));
    expect(ms.map((m) => m.row)).toEqual([0, 0]);
  });
});

describe('labels at the edges', () => {
  it('move inward so that they are not cut off, while their lines stay at λ_rest·(1+z)', () => {
    // [Ne V] 3427 at z = 0.06818 is at 3660.7 Å, 8 px from the left edge of a 1000 px plot.
    const ms = markersInRange(0.06818, 3655, 9400, geometry);
    const neV = ms.find((m) => m.label === '[Ne V]')!;
    expect(neV.observedWaveAngstrom[0]).toBeCloseTo(3426.85 * 1.06818, 0);
    const pxPerA = geometry.widthPx / (9400 - 3655);
    expect((neV.labelWaveAngstrom - 3655) * pxPerA).toBeGreaterThanOrEqual(((neV.label.length + 2) * geometry.charPx) / 2 - 1e-9);
    for (const m of ms) expect((9400 - m.labelWaveAngstrom) * pxPerA).toBeGreaterThanOrEqual(((m.label.length + 2) * geometry.charPx) / 2 - 1e-9);
  });
});

describe('crowded labels', () => {
  it('a label with no room left in any row keeps its line and glyph but drops its name', () => {
    const ms = markersInRange(0.05, 3900, 4400, { widthPx: 120, charPx: 7.5, maxRows: 2 });
    const top = ms.filter((m) => MARKER_STYLE[m.kind].side === 'top');
    expect(top.some((m) => m.shows === 'glyph')).toBe(true);
    for (const m of top) expect(m.shows === 'name' ? m.row < 2 : m.row === 2 && m.observedWaveAngstrom.length > 0).toBe(true);
  });
  it('glyphs drawn alone keep apart; a line with no room even for its glyph is drawn bare', () => {
    const charPx = 7.5;
    const ms = markersInRange(0.05, 3600, 9400, { widthPx: 300, charPx, maxRows: 1 });
    const pxPerA = 300 / (9400 - 3600);
    for (const side of ['top', 'bottom'] as const) {
      const glyphs = ms.filter((m) => MARKER_STYLE[m.kind].side === side && m.shows === 'glyph').map((m) => (m.labelWaveAngstrom - 3600) * pxPerA);
      for (let i = 1; i < glyphs.length; i++) expect(glyphs[i] - glyphs[i - 1]).toBeGreaterThanOrEqual(2 * charPx - 1e-9);
    }
    expect(ms.some((m) => m.shows === 'line')).toBe(true);
  });
});

describe('which labels keep their names', () => {
  it('on a crowded plot the strong lines are named first: Hα, Hβ, [O III], [O II], Ca II H and K, Na D', () => {
    // The demo's z = 0.068 host on a laptop-sized plot: 2 rows per side, 836 px wide.
    const ms = markersInRange(0.06818, 3600, 9400, { widthPx: 836, charPx: 7.5, maxRows: 2 });
    const shows = (id: string) => ms.find((m) => m.ids.includes(id))?.shows;
    for (const id of ['Halpha', 'Hbeta', '[OIII]5008', '[OII]3727', 'CaK', 'CaH', 'NaD2']) expect(shows(id), id).toBe('name');
    // and some weaker ones had to give way
    expect(ms.some((m) => m.shows !== 'name')).toBe(true);
  });
  it('no two named labels of one row overlap, whatever order they were placed in', () => {
    const charPx = 7.5;
    const ms = markersInRange(0.06818, 3600, 9400, { widthPx: 836, charPx, maxRows: 2 });
    const pxPerA = 836 / (9400 - 3600);
    const span = (m: (typeof ms)[number]) => {
      const c = (m.labelWaveAngstrom - 3600) * pxPerA, h = ((m.label.length + 2) * charPx) / 2;
      return [c - h, c + h];
    };
    for (const a of ms) for (const b of ms) {
      if (a === b || a.shows !== 'name' || b.shows !== 'name' || a.row !== b.row || MARKER_STYLE[a.kind].side !== MARKER_STYLE[b.kind].side) continue;
      const [a0, a1] = span(a), [b0, b1] = span(b);
      expect(a1 <= b0 || b1 <= a0, `${a.label} and ${b.label} in row ${a.row}`).toBe(true);
    }
  });
});

describe('label rows on plots of different heights', () => {
  it('keeps rows a fixed height in px, so a short plot gets fewer rows, not overlapping ones', async () => {
    const { labelRows } = await import('../../renderer/plot/spectrum-figure.js');
    // 449 px: the plot area in a 1600 × 1000 window; 186 px: in a 1366 × 768 one (measured in Chromium).
    expect(labelRows(449).maxRows).toBe(4);
    expect(labelRows(186).maxRows).toBe(2);
    expect(labelRows(60).maxRows).toBe(1);
    for (const h of [60, 120, 186, 300, 449, 800]) {
      const r = labelRows(h);
      expect(r.rowStep * h, `row height at ${h} px`).toBeGreaterThanOrEqual(17 - 1e-9);
      // The named rows and the glyph row stay within the top and bottom 30 % (a short plot keeps one row).
      if (r.maxRows > 1) expect(0.015 + (r.maxRows + 1) * r.rowStep).toBeLessThanOrEqual(0.3 + 0.015 + 1e-9);
      // The marker lines start past the last row on each side.
      expect(r.lineBand[0]).toBeGreaterThanOrEqual(Math.min(0.5, 0.015 + (r.maxRows + 1) * r.rowStep) - 1e-9);
      expect(r.lineBand[1]).toBeCloseTo(1 - r.lineBand[0], 12);
    }
  });
});

describe('marker traces in the figure', () => {
  it('draws each kind in its own dash pattern and puts emission labels on top, absorption below', async () => {
    const { markerTraces } = await import('../../renderer/plot/spectrum-figure.js');
    const { labelRows } = await import('../../renderer/plot/spectrum-figure.js');
    const traces = markerTraces(markersInRange(0.1, 3600, 9400, geometry), labelRows(449)) as { mode: string; name: string; line?: { dash: string }; y: number[]; text?: string[] }[];
    const dashOf = (word: string) => traces.find((t) => t.mode === 'lines' && t.name.includes(word))?.line?.dash;
    expect(dashOf('emission')).toBe('solid');
    expect(dashOf('absorption')).toBe('dash');
    const top = traces.find((t) => t.name === 'labels top')!;
    const bottom = traces.find((t) => t.name === 'labels bottom')!;
    expect(top.text!.every((t) => !t.startsWith('▼'))).toBe(true);
    expect(bottom.text!.every((t) => t.startsWith('▼'))).toBe(true);
    expect(Math.min(...top.y)).toBeGreaterThan(Math.max(...bottom.y));
  });
});

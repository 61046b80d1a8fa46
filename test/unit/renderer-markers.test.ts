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
    expect(top.some((m) => !m.named)).toBe(true);
    for (const m of top) expect(m.named ? m.row < 2 : m.observedWaveAngstrom.length > 0).toBe(true);
  });
});

describe('marker traces in the figure', () => {
  it('draws each kind in its own dash pattern and puts emission labels on top, absorption below', async () => {
    const { markerTraces } = await import('../../renderer/plot/spectrum-figure.js');
    const traces = markerTraces(markersInRange(0.1, 3600, 9400, geometry)) as { mode: string; name: string; line?: { dash: string }; y: number[]; text?: string[] }[];
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

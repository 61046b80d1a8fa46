import { describe, expect, it } from 'vitest';
import { nudgeZ, observedWave, velocityBetweenKmS, zFromFeature, zStepFor } from '../../renderer/science/z-math.js';
import { likelyLines } from '../../renderer/science/line-pick.js';
import { restLine } from '../../core/redshift/line-list.js';

describe('click to z', () => {
  it('Hα (vacuum 6564.61 Å, DESIGN.md check value) clicked at 7221.07 Å is z = 0.1', () => {
    expect(zFromFeature(7221.071, 6564.61)).toBeCloseTo(0.1, 6);
  });
  it('is the inverse of λ_rest·(1+z)', () => {
    for (const z of [0, 0.05, 0.7, 2.3]) expect(zFromFeature(observedWave(5008.24, z), 5008.24)).toBeCloseTo(z, 12);
  });
});

describe('velocity nudge (1+z′) = (1+z)(1+v/c)', () => {
  it('at z = 0 a +100 km/s step is Δz = 100/299792.458 (c exact, SI)', () => {
    expect(nudgeZ(0, 100)).toBeCloseTo(100 / 299792.458, 12);
  });
  it('at z = 1 the same step is twice as large in z, and still 100 km/s in the object frame', () => {
    const z2 = nudgeZ(1, 100);
    expect(z2 - 1).toBeCloseTo(2 * (100 / 299792.458), 12);
    expect(velocityBetweenKmS(1, z2)).toBeCloseTo(100, 9);
    expect(zStepFor(1, 100)).toBeCloseTo(z2 - 1, 12);
  });
  const beta = 10 / 299792.458;
  it('+10 then −10 km/s comes back short by exactly (1+z)·β², second order in v/c', () => {
    expect(nudgeZ(nudgeZ(0.3, 10), -10) - 0.3).toBeCloseTo(-1.3 * beta * beta, 15);
    expect(1.3 * beta * beta).toBeLessThan(2e-9);
  });
  it('ten 10 km/s steps exceed one 100 km/s step by (1+z)·((1+β)¹⁰ − 1 − 10β) ≈ 45β²(1+z)', () => {
    let z = 0.5;
    for (let i = 0; i < 10; i++) z = nudgeZ(z, 10);
    expect(z - nudgeZ(0.5, 100)).toBeCloseTo(1.5 * ((1 + beta) ** 10 - 1 - 10 * beta), 14);
  });
});

describe('the short list of rest lines for a clicked feature', () => {
  it('puts the line that matches the current z first and computes z from the click', () => {
    const click = observedWave(restLine('[OIII]5008').waveVacuumAngstrom, 0.25);
    const list = likelyLines(click, 0.25, []);
    expect(list[0].line.id).toBe('[OIII]5008');
    expect(list[0].z).toBeCloseTo(0.25, 9);
    expect(list[0].hint).toBe('near current z');
  });
  it('offers strong lines with a physical z and no more than eight', () => {
    const list = likelyLines(6000, null, []);
    expect(list.length).toBeLessThanOrEqual(8);
    expect(list.map((c) => c.line.id)).toContain('Hbeta');
    for (const c of list) expect(c.z).toBeGreaterThan(-0.01);
    // Hα at 6000 Å would be a blueshift of −0.086: not offered.
    expect(list.map((c) => c.line.id)).not.toContain('Halpha');
  });
  it('marks a line near another candidate', () => {
    const click = observedWave(restLine('MgII').waveVacuumAngstrom, 1.1);
    const list = likelyLines(click, 0.3, [0.3, 1.1]);
    expect(list.find((c) => c.line.id === 'MgII')?.hint).toBe('near a candidate');
  });
});

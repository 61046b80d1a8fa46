import { describe, expect, it } from 'vitest';
import type { SpectrumListItem, SpectrumView, VerdictInput } from '../../core/api/host-api.js';
import type { Verdict } from '../../core/catalogue/verdict.js';
import type { Candidate } from '../../core/redshift/types.js';
import { candidates, candidateTrial, lineTrial, noRedshiftTrial, nudgedTrial, openingGrade, openingTrial, parseTypedZ, suggestedGrade, typedTrial, verdictFor } from '../../renderer/state/decision.js';
import { fmtZErr } from '../../renderer/ui/format.js';
import { neighbour, nextPending, passesFilter, progress } from '../../renderer/state/worklist-view.js';
import { SaveQueue } from '../../renderer/state/save-queue.js';
import { nudgeZ } from '../../renderer/science/z-math.js';

const cand = (z: number, template: string, templateClass: Candidate['templateClass']): Candidate => ({ z, zErr: 1e-4, r: 8, template, templateClass, overlap: 0.9, lines: [] });
const view = (verdict: Verdict | null = null): SpectrumView => ({
  id: 'a.fits', arrays: null, meta: null, templateModel: null, verdict, error: null, measuredWith: {},
  measurement: { candidates: [cand(0.1, 'sf', 'star-forming'), cand(0.35, 'qso', 'qso')], best: cand(0.1001, 'sf', 'star-forming'), refinement: { method: 'line-fit', chi2Red: 1, nLinesFitted: 4 }, confidence: 'likely', nLines: 4, notes: [] },
});
const savedVerdict = (over: Partial<Verdict>): Verdict => ({ spectrum: 'a.fits', hdu: 0, status: 'revised', z: 0.35, zErr: null, confidence: 'secure', objectClass: 'qso', template: 'qso', note: 'n', time: '2026-03-15T03:00:00Z', user: 'obs', ...over });

describe('decisions', () => {
  it('opens on the refined best: the z shown is the z that accepting saves', () => {
    const t = openingTrial(view());
    expect(t.z).toBe(0.1001);
    expect(candidates(view()).map((c) => c.z)).toEqual([0.1001, 0.35]);
    const saved = verdictFor(view(), { kind: 'accept-best' }, t, openingGrade(view())) as VerdictInput;
    expect(saved.z).toBe(t.z);
    expect(saved.zErr).toBe(t.zErr);
  });
  it('suggests galaxy, not agn, when the narrow-line AGN template fits best (a star-forming dwarf fits it too)', () => {
    const v: SpectrumView = { ...view(), measurement: { ...view().measurement!, candidates: [cand(0.03, 'agn-narrow', 'agn')], best: cand(0.03, 'agn-narrow', 'agn') } };
    expect(suggestedGrade(v, openingTrial(v)).objectClass).toBe('galaxy');
  });
  it('opens with no grade chosen; the suggestion is shown and saved for the best only', () => {
    expect(openingGrade(view())).toEqual({ confidence: null, objectClass: null, note: '' });
    expect(suggestedGrade(view(), openingTrial(view()))).toEqual({ confidence: 'likely', objectClass: 'galaxy' });
    // Another candidate's z is not what the suggestion was made for: tentative, and its own class.
    expect(suggestedGrade(view(), candidateTrial(view(), 1))).toEqual({ confidence: 'tentative', objectClass: 'qso' });
    expect(verdictFor(view(), { kind: 'accept-best' }, openingTrial(view()), openingGrade(view()))).toMatchObject({ confidence: 'likely', objectClass: 'galaxy' });
    expect(verdictFor(view(), { kind: 'candidate', index: 1 }, openingTrial(view()), openingGrade(view()))).toMatchObject({ confidence: 'tentative', objectClass: 'qso' });
  });
  it('keeps a note on a spectrum not vetted as a pending verdict, and opens on it again', () => {
    const input = verdictFor(view(), { kind: 'note' }, openingTrial(view()), { ...openingGrade(view()), note: 'blend?' }) as VerdictInput;
    expect(input).toMatchObject({ status: 'pending', z: null, zErr: null, confidence: null, objectClass: 'unknown', template: null, note: 'blend?' });
    const pending: Verdict = { ...input, spectrum: 'a.fits', hdu: null, time: '2026-03-14T03:00:00.000Z', user: 'observer' } as Verdict;
    expect(openingGrade(view(pending))).toEqual({ confidence: null, objectClass: null, note: 'blend?' });
  });
  it('"none credible" suggests no confidence: accepting asks for one first', () => {
    const hopeless = view();
    hopeless.measurement!.confidence = 'none';
    const t = openingTrial(hopeless);
    expect(suggestedGrade(hopeless, t).confidence).toBeNull();
    expect(verdictFor(hopeless, { kind: 'accept-best' }, t, openingGrade(hopeless))).toEqual({ refused: expect.stringMatching(/nothing credible: choose a confidence first/) });
    expect(verdictFor(hopeless, { kind: 'trial' }, t, openingGrade(hopeless))).toHaveProperty('refused');
    expect(verdictFor(hopeless, { kind: 'accept-best' }, t, { ...openingGrade(hopeless), confidence: 'tentative' })).toMatchObject({ status: 'accepted', confidence: 'tentative' });
    expect(verdictFor(hopeless, { kind: 'no-redshift' }, t, openingGrade(hopeless))).toMatchObject({ status: 'no-redshift' });
  });
  it('a nudged z shows and saves no σz: the fit\'s σ belongs to the fitted z', () => {
    const t = nudgedTrial(candidateTrial(view(), 0), 10);
    expect(t.zErr).toBeNull();
    expect(verdictFor(view(), { kind: 'trial' }, t, openingGrade(view()))).toMatchObject({ status: 'revised', zErr: null });
  });
  it('a chosen grade is saved whatever the suggestion', () => {
    const chosen = { confidence: 'secure' as const, objectClass: 'star' as const, note: '' };
    expect(verdictFor(view(), { kind: 'candidate', index: 1 }, openingTrial(view()), chosen)).toMatchObject({ confidence: 'secure', objectClass: 'star' });
  });
  it('a saved "no redshift" reopens with no trial z and no confidence; unchosen class is unknown', () => {
    const v = view(savedVerdict({ status: 'no-redshift', z: null, confidence: null, objectClass: 'unknown', template: null }));
    expect(openingTrial(v)).toEqual(noRedshiftTrial());
    expect(openingTrial(v).z).toBeNull();
    expect(openingGrade(v).confidence).toBeNull();
    expect(suggestedGrade(v, openingTrial(v)).confidence).toBeNull();
    expect(verdictFor(view(), { kind: 'no-redshift' }, openingTrial(view()), openingGrade(view()))).toMatchObject({ objectClass: 'unknown', confidence: null });
  });
  it('reads a typed z as a decimal number only', () => {
    expect(parseTypedZ(' 0.1234 ')).toBe(0.1234);
    expect(parseTypedZ('−0.0004')).toBe(-0.0004);
    expect(parseTypedZ('2.5e-1')).toBe(0.25);
    for (const bad of ['', 'abc', '0x10', 'Infinity', '1,2', '12.5', '-0.02']) expect(parseTypedZ(bad)).toHaveProperty('refused');
  });
  it('writes z to the last decimal of its σz', () => {
    expect(fmtZErr(0.068182, 2.6e-5)).toBe('0.068182 ± 0.000026');
    expect(fmtZErr(0.41272, 1.2e-4)).toBe('0.41272 ± 0.00012');
    expect(fmtZErr(2.8, 0.004)).toBe('2.80000 ± 0.0040');
    expect(fmtZErr(0.1, null)).toBe('0.10000 (no σ)');
  });
  it('opens on the saved verdict when there is one', () => {
    const v = view(savedVerdict({}));
    expect(openingTrial(v)).toMatchObject({ z: 0.35, candidateIndex: 1, source: 'saved' });
    expect(openingGrade(v)).toEqual({ confidence: 'secure', objectClass: 'qso', note: 'n' });
  });
  it('accepting takes the refined best, another candidate is "revised"', () => {
    const g = { ...openingGrade(view()), confidence: 'likely' as const };
    expect(verdictFor(view(), { kind: 'accept-best' }, openingTrial(view()), g)).toMatchObject({ status: 'accepted', z: 0.1001, template: 'sf' });
    const t = candidateTrial(view(), 1);
    expect(verdictFor(view(), { kind: 'trial' }, t, g)).toMatchObject({ status: 'revised', z: 0.35, template: 'qso', confidence: 'likely' });
  });
  it('a typed, identified or nudged z is saved as revised without a σz', () => {
    const g = openingGrade(view());
    for (const t of [typedTrial(0.2), lineTrial(0.2, 'Hα', 7877.5, 6564.61), nudgedTrial(candidateTrial(view(), 0), 10)]) {
      const v = verdictFor(view(), { kind: 'trial' }, t, g) as VerdictInput;
      expect(v.status).toBe('revised');
      expect(v.zErr).toBeNull();
    }
  });
  it('nudges accumulate and say how far they moved', () => {
    const t = nudgedTrial(nudgedTrial(candidateTrial(view(), 0), 100), -10);
    expect(t.z).toBeCloseTo(nudgeZ(nudgeZ(0.1001, 100), -10), 15);
    expect(t.detail).toBe('+90 km/s from candidate 1, sf');
  });
  it('saving the trial z of a reopened verdict keeps its status', () => {
    const v = view(savedVerdict({ status: 'accepted', z: 0.1001, template: 'sf' }));
    expect(verdictFor(v, { kind: 'trial' }, openingTrial(v), { ...openingGrade(v), confidence: 'likely' })).toMatchObject({ status: 'accepted', z: 0.1001, confidence: 'likely' });
  });
  it('no-redshift carries no z and no confidence; a missing candidate is refused', () => {
    const g = openingGrade(view());
    expect(verdictFor(view(), { kind: 'no-redshift' }, openingTrial(view()), g)).toMatchObject({ status: 'no-redshift', z: null, confidence: null });
    expect(verdictFor(view(), { kind: 'candidate', index: 4 }, openingTrial(view()), g)).toEqual({ refused: 'there is no candidate 5' });
  });
});

const item = (id: string, verdict: Partial<Verdict> | null): SpectrumListItem => ({ id, verdict: verdict ? savedVerdict({ spectrum: id, ...verdict }) : null, suggestion: null, error: null, fileVersion: null });

describe('worklist view', () => {
  const items = [item('a', null), item('b', { status: 'accepted', confidence: 'secure' }), item('c', null), item('d', { status: 'revised', confidence: 'tentative' })];
  it('counts progress and filters by status and confidence', () => {
    expect(progress(items)).toEqual({ vetted: 2, total: 4 });
    expect(items.filter((i) => passesFilter(i, 'pending')).map((i) => i.id)).toEqual(['a', 'c']);
    expect(items.filter((i) => passesFilter(i, 'tentative')).map((i) => i.id)).toEqual(['d']);
  });
  it('moves within the filter, also from a spectrum the filter now hides', () => {
    expect(neighbour(items, 'all', 'a', 1)).toBe('b');
    expect(neighbour(items, 'pending', 'b', 1)).toBe('c');
    expect(neighbour(items, 'pending', 'c', 1)).toBeNull();
    expect(nextPending(items, 'c')).toBe('a');
  });
});

describe('save queue', () => {
  const input = (id: string): VerdictInput => ({ id, status: 'accepted', z: 0.1, zErr: 1e-4, confidence: 'secure', objectClass: 'galaxy', template: 'sf', note: '' });
  it('keeps a failed write (and later ones) queued with the reason, and writes them in order on retry', async () => {
    const written: string[] = [];
    let failNext = true;
    const saved: string[] = [];
    const q = new SaveQueue(async (inp) => {
      if (failNext) {
        failNext = false;
        throw new Error('disk full');
      }
      written.push(inp.id);
      return { verdict: savedVerdict({ spectrum: inp.id }) };
    }, { saved: (v) => saved.push(v.spectrum), changed: () => undefined });
    await q.enqueue(input('a'));
    await q.enqueue(input('b'));
    expect(q.failed?.reason).toBe('disk full');
    expect(q.pending.map((p) => p.input.id)).toEqual(['a', 'b']);
    expect(saved).toEqual([]);
    await q.retry();
    expect(written).toEqual(['a', 'b']);
    expect(saved).toEqual(['a', 'b']);
    expect(q.pending).toEqual([]);
  });
});

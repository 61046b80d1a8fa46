// The shape check every host call passes at the transport boundary (HTTP and IPC alike).
// The expected reasons are our own wording; what matters is that each names the field.
import { describe, expect, it } from 'vitest';
import { HOST_METHODS } from '../../core/api/host-api';
import { isHostMethod, validateRequest } from '../../core/node/host/request-shapes';

const verdict = { id: 'a.fits', status: 'accepted', z: 0.1, zErr: 0.0001, confidence: 'secure', objectClass: 'galaxy', template: 'passive', note: '' };

function reason(method: Parameters<typeof validateRequest>[0], body: unknown): string {
  const r = validateRequest(method, body);
  if (r.ok) throw new Error(`expected ${JSON.stringify(body)} to be refused`);
  return r.reason;
}

describe('request shapes', () => {
  it('knows exactly the host methods, and nothing inherited from Object', () => {
    for (const m of HOST_METHODS) expect(isHostMethod(m)).toBe(true);
    for (const m of ['__proto__', 'constructor', 'toString', 'hasOwnProperty', 'listspectra', '', 42, null]) expect(isHostMethod(m)).toBe(false);
  });

  it('accepts well-formed requests of every method', () => {
    const good: Record<string, unknown> = {
      openWorklist: { path: '/data/night' },
      listSpectra: {},
      loadSpectrum: { id: 'a.fits' },
      remeasure: { id: 'a.fits', options: { zmin: 0, zmax: 1.5, templates: ['passive'], maskTelluric: false, maskSky: true, medium: 'vacuum' } },
      templateModel: { id: 'a.fits', template: 'passive', z: 0.3 },
      derived: { id: 'a.fits', z: 0.3, zErr: null },
      hostAnalysis: { id: 'a.fits', z: 0.3 },
      saveVerdict: verdict,
      undoLast: {},
      exportCatalogue: { format: 'fits', path: '/data/out.fits' },
      getSettings: {},
      putSettings: { user: 'observer', sites: [{ name: 'Kestrel Ridge', latitudeDeg: 36.1843, longitudeDeg: -105.721, heightM: 2840 }], customCosmology: null },
    };
    for (const m of HOST_METHODS) expect(validateRequest(m, good[m]).ok, m).toBe(true);
    expect(validateRequest('openWorklist', { files: ['/a.fits', '/b.fits'] }).ok).toBe(true);
  });

  it.each([
    ['loadSpectrum', null, /^request: expected an object, got null/],
    ['loadSpectrum', [], /^request: expected an object, got an array/],
    ['loadSpectrum', {}, /^id: missing/],
    ['loadSpectrum', { id: 3 }, /^id: expected a string, got a number/],
    ['loadSpectrum', { id: '' }, /^id: must not be empty/],
    ['loadSpectrum', { id: 'a\u0000b' }, /^id: contains a NUL/],
    ['loadSpectrum', { id: 'a', path: '/etc/passwd' }, /^path: unknown field/],
    ['listSpectra', { x: 1 }, /^x: unknown field/],
    ['openWorklist', { path: ['/a'] }, /^path: expected a string/],
    ['openWorklist', { files: [] }, /^files: needs at least 1 entry/],
    ['openWorklist', { files: ['/a', 7] }, /^files\[1\]: expected a string/],
    ['templateModel', { id: 'a', template: 'p', z: -1 }, /^z: a redshift must be greater than −1/],
    ['templateModel', { id: 'a', template: 'p', z: 'NaN' }, /^z: expected a finite number, got a string/],
    ['remeasure', { id: 'a', options: { zmin: 1, zmax: 0.5 } }, /zmin must be below zmax/],
    ['remeasure', { id: 'a', options: { maskSky: 'yes' } }, /^options\.maskSky: expected true or false/],
    ['remeasure', { id: 'a', options: { medium: 'glass' } }, /^options\.medium: expected one of air, vacuum/],
    ['remeasure', { id: 'a', options: { zmax: 1e9 } }, /^options\.zmax: 1000000000 is outside/],
    ['derived', { id: 'a', z: 0.1 }, /^zErr: missing/],
    ['derived', { id: 'a', z: 0.1, zErr: -1 }, /^zErr: -1 is outside/],
    ['saveVerdict', { ...verdict, status: 'good' }, /^status: expected one of accepted, revised, no-redshift, pending/],
    ['saveVerdict', { ...verdict, confidence: 3 }, /^confidence: expected one of secure, likely, tentative/],
    ['saveVerdict', { ...verdict, objectClass: 'galaxy ' }, /^objectClass: expected one of/],
    ['saveVerdict', { ...verdict, z: null }, /^z: a verdict "accepted" needs a redshift/],
    ['saveVerdict', { ...verdict, status: 'no-redshift' }, /^z: a verdict "no-redshift" carries no redshift/],
    ['saveVerdict', { ...verdict, time: '2020-01-01' }, /^time: unknown field/],
    ['saveVerdict', { ...verdict, note: 'x'.repeat(10_001) }, /^note: longer than 10000/],
    ['exportCatalogue', { format: 'xlsx' }, /^format: expected one of csv, ecsv, fits/],
    ['putSettings', { sites: [{ name: 'X', latitudeDeg: 91, longitudeDeg: 0, heightM: 0 }] }, /^sites\[0\]\.latitudeDeg: 91 is outside/],
    ['putSettings', { customCosmology: { h0: 70, omegaM: 0.3 } }, /^customCosmology\.omegaL: missing/],
    ['putSettings', { user: '' }, /^user: must not be empty/],
  ] as const)('%s %j is refused: %s', (method, body, expected) => {
    const r = reason(method, body);
    expect(r).toMatch(expected);
    expect(r).not.toContain('\n');
  });
});

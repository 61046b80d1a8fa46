/**
 * The shape of every host call's request, checked at the transport boundary (HTTP and IPC alike)
 * before a handler sees it. A failed check gives one line naming the field and what is wrong.
 * Unknown fields are refused too, so a typo never passes silently.
 */
import { CONFIDENCES, OBJECT_CLASSES, VERDICT_STATUSES, WAVELENGTH_MEDIA } from '../../catalogue/verdict.js';
import { HOST_METHODS, type HostApi, type HostMethod } from '../../api/host-api.js';

export type HostRequest<M extends HostMethod> = Parameters<HostApi[M]>[0];

/** Returns null when `value` fits, else the reason (starting with the field path). */
type Check = (value: unknown, at: string) => string | null;

const MAX_STRING = 4096;
const MAX_NOTE = 10_000;
const MAX_LIST = 100_000;

function typeName(v: unknown): string {
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'an array';
  return typeof v === 'object' ? 'an object' : `a ${typeof v}`;
}

function label(at: string): string {
  return at === '' ? 'request' : at;
}

const string =
  (maxLength = MAX_STRING, allowEmpty = false): Check =>
  (v, at) => {
    if (typeof v !== 'string') return `${label(at)}: expected a string, got ${typeName(v)}`;
    if (!allowEmpty && v.length === 0) return `${label(at)}: must not be empty`;
    if (v.length > maxLength) return `${label(at)}: longer than ${maxLength} characters`;
    if (v.includes('\u0000')) return `${label(at)}: contains a NUL character`;
    return null;
  };

const boolean: Check = (v, at) => (typeof v === 'boolean' ? null : `${label(at)}: expected true or false, got ${typeName(v)}`);

const number =
  (min = -Infinity, max = Infinity, what = ''): Check =>
  (v, at) => {
    if (typeof v !== 'number' || !Number.isFinite(v)) return `${label(at)}: expected a finite number, got ${typeName(v)}`;
    if (v < min || v > max) return `${label(at)}: ${v} is outside ${what || `[${min}, ${max}]`}`;
    return null;
  };

/** A redshift: finite and above −1 (1+z must be positive). */
const redshift: Check = (v, at) => {
  const r = number()(v, at);
  if (r) return r;
  return (v as number) > -1 ? null : `${label(at)}: a redshift must be greater than −1`;
};

const oneOf =
  (values: readonly string[]): Check =>
  (v, at) =>
    typeof v === 'string' && values.includes(v) ? null : `${label(at)}: expected one of ${values.join(', ')}`;

const nullable =
  (inner: Check): Check =>
  (v, at) =>
    v === null ? null : inner(v, at);

const arrayOf =
  (inner: Check, minLength = 0): Check =>
  (v, at) => {
    if (!Array.isArray(v)) return `${label(at)}: expected an array, got ${typeName(v)}`;
    if (v.length < minLength) return `${label(at)}: needs at least ${minLength} entr${minLength === 1 ? 'y' : 'ies'}`;
    if (v.length > MAX_LIST) return `${label(at)}: more than ${MAX_LIST} entries`;
    for (let i = 0; i < v.length; i++) {
      const r = inner(v[i], `${at}[${i}]`);
      if (r) return r;
    }
    return null;
  };

interface Field {
  check: Check;
  optional?: boolean;
}

const req = (check: Check): Field => ({ check });
const opt = (check: Check): Field => ({ check, optional: true });

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

const object =
  (fields: Record<string, Field>, extra?: (v: Record<string, unknown>, at: string) => string | null): Check =>
  (v, at) => {
    if (!isPlainObject(v)) return `${label(at)}: expected an object, got ${typeName(v)}`;
    const prefix = at === '' ? '' : `${at}.`;
    for (const key of Object.keys(v)) {
      if (!Object.hasOwn(fields, key)) return `${prefix}${key}: unknown field`;
    }
    for (const [key, field] of Object.entries(fields)) {
      if (!Object.hasOwn(v, key) || v[key] === undefined) {
        if (field.optional) continue;
        return `${prefix}${key}: missing`;
      }
      const r = field.check(v[key], `${prefix}${key}`);
      if (r) return r;
    }
    return extra ? extra(v, at) : null;
  };

const empty = object({});
const id = string(1024);

const remeasureOptions = object(
  {
    zmin: opt(number(-0.1, 20, '[−0.1, 20]')),
    zmax: opt(number(-0.1, 20, '[−0.1, 20]')),
    templates: opt(arrayOf(string(200), 1)),
    maskTelluric: opt(boolean),
    maskSky: opt(boolean),
    medium: opt(oneOf(WAVELENGTH_MEDIA)),
  },
  (v, at) =>
    typeof v.zmin === 'number' && typeof v.zmax === 'number' && v.zmin >= v.zmax ? `${at}: zmin must be below zmax` : null,
);

const verdictInput = object(
  {
    id: req(id),
    status: req(oneOf(VERDICT_STATUSES)),
    z: req(nullable(redshift)),
    zErr: req(nullable(number(0))),
    confidence: req(nullable(oneOf(CONFIDENCES))),
    objectClass: req(oneOf(OBJECT_CLASSES)),
    template: req(nullable(string(200))),
    note: req(string(MAX_NOTE, true)),
  },
  (v) => {
    const needsZ = v.status === 'accepted' || v.status === 'revised';
    if (needsZ && v.z === null) return `z: a verdict "${v.status}" needs a redshift`;
    if (!needsZ && v.z !== null) return `z: a verdict "${v.status}" carries no redshift (send null)`;
    return null;
  },
);

const site = object({
  name: req(string(200)),
  latitudeDeg: req(number(-90, 90)),
  longitudeDeg: req(number(-180, 360)),
  heightM: req(number(-500, 10_000)),
});

const settingsPatch = object({
  recentWorklists: opt(arrayOf(string())),
  sites: opt(arrayOf(site)),
  cosmologyPreset: opt(string(100)),
  customCosmology: opt(
    nullable(object({ h0: req(number(1, 1000)), omegaM: req(number(0, 10)), omegaL: req(number(-10, 10)) })),
  ),
  user: opt(string(200)),
});

const SHAPES: Record<HostMethod, Check> = {
  openWorklist: (v, at) =>
    isPlainObject(v) && Object.hasOwn(v, 'files')
      ? object({ files: req(arrayOf(string(), 1)) })(v, at)
      : object({ path: req(string()) })(v, at),
  listSpectra: empty,
  loadSpectrum: object({ id: req(id) }),
  remeasure: object({ id: req(id), options: req(remeasureOptions) }),
  templateModel: object({ id: req(id), template: req(string(200)), z: req(redshift) }),
  derived: object({ id: req(id), z: req(redshift), zErr: req(nullable(number(0))) }),
  hostAnalysis: object({ id: req(id), z: req(redshift) }),
  saveVerdict: verdictInput,
  undoLast: empty,
  exportCatalogue: object({ format: req(oneOf(['csv', 'ecsv', 'fits'])), path: opt(string()) }),
  getSettings: empty,
  putSettings: settingsPatch,
};

export function isHostMethod(name: unknown): name is HostMethod {
  return typeof name === 'string' && (HOST_METHODS as readonly string[]).includes(name);
}

export type Validation<M extends HostMethod> = { ok: true; value: HostRequest<M> } | { ok: false; reason: string };

/** Checks one request body against its method's shape. */
export function validateRequest<M extends HostMethod>(method: M, body: unknown): Validation<M> {
  const reason = SHAPES[method](body, '');
  return reason === null ? { ok: true, value: body as HostRequest<M> } : { ok: false, reason };
}

/**
 * A user line list as JSON: either an array of lines or an object
 *   { "name": "my-lines", "sigma_km_s": 150, "z_min": 0, "z_max": 1.5,
 *     "lines": [ { "id": "HeI6680", "wave_vacuum_angstrom": 6680.0, "kind": "emission", "strength": 1 } ] }
 * Wavelengths are rest-frame vacuum Å; kind is "emission" or "absorption"; strength is
 * relative (default 1). Problems are reported as one line naming the source and the entry.
 */
import type { UserLine, UserLineTemplate } from './types.js';

export class LineListError extends Error {}

export function parseUserLineList(text: string, sourceName: string): UserLineTemplate {
  let doc: unknown;
  try {
    doc = JSON.parse(text);
  } catch (err) {
    throw new LineListError(`${sourceName}: not valid JSON (${(err as Error).message.split('\n')[0]})`);
  }
  const obj = (Array.isArray(doc) ? { lines: doc } : doc) as Record<string, unknown>;
  if (!obj || typeof obj !== 'object' || !Array.isArray(obj.lines)) throw new LineListError(`${sourceName}: expected an array of lines or an object with "lines"`);
  const num = (v: unknown, what: string): number | undefined => {
    if (v === undefined) return undefined;
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new LineListError(`${sourceName}: ${what} must be a number`);
    return v;
  };
  const lines: UserLine[] = obj.lines.map((raw, i) => {
    const l = raw as Record<string, unknown>;
    const where = `line ${i + 1}`;
    const wave = num(l.wave_vacuum_angstrom ?? l.waveVacuumAngstrom, `${where}: wave_vacuum_angstrom`);
    if (wave === undefined || wave <= 0) throw new LineListError(`${sourceName}: ${where}: wave_vacuum_angstrom must be a positive number (rest-frame vacuum Å)`);
    const kind = l.kind ?? 'emission';
    if (kind !== 'emission' && kind !== 'absorption') throw new LineListError(`${sourceName}: ${where}: kind must be "emission" or "absorption"`);
    const id = typeof l.id === 'string' && l.id ? l.id : `user${i + 1}`;
    return { id, label: typeof l.label === 'string' ? l.label : id, waveVacuumAngstrom: wave, kind, strength: num(l.strength, `${where}: strength`) ?? 1 };
  });
  if (lines.length === 0) throw new LineListError(`${sourceName}: the line list is empty`);
  return {
    name: typeof obj.name === 'string' && obj.name ? obj.name : 'user-lines',
    sigmaKmS: num(obj.sigma_km_s, 'sigma_km_s'),
    zMin: num(obj.z_min, 'z_min'),
    zMax: num(obj.z_max, 'z_max'),
    lines,
  };
}

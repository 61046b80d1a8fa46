/**
 * Reads a flux-density unit string (BUNIT and its variants) as scale × erg s⁻¹ cm⁻² Å⁻¹, so that
 * a line flux (density × Å) converts to erg s⁻¹ cm⁻².
 */

export type FluxDensityUnit =
  | { ok: true; /** erg s⁻¹ cm⁻² Å⁻¹ per file unit. */ scale: number; text: string }
  | { ok: false; text: string; reason: string };

const SCALE = /^\s*(?:([0-9.]+)\s*[e]\s*([+-]?\d+)|10\s*(?:\^|\*\*)\s*\(?\s*([+-]?\d+)\s*\)?)\s*[*x×]?\s*/i;
const WAVE_TOKENS = new Set(['a', 'aa', 'ang', 'angs', 'angstrom', 'angstroms', 'å']);

export function parseFluxDensityUnit(text: string): FluxDensityUnit {
  const t = text.trim();
  if (!t) return { ok: false, text, reason: 'the file names no flux unit (BUNIT or equivalent)' };
  const m = SCALE.exec(t);
  const scale = m ? (m[3] !== undefined ? 10 ** Number(m[3]) : Number(m[1]) * 10 ** Number(m[2])) : 1;
  const rest = (m ? t.slice(m[0].length) : t).toLowerCase();
  const tokens = rest.split(/[^a-zå]+/).filter(Boolean);
  const kinds = new Set(tokens.map((tok) => (WAVE_TOKENS.has(tok) ? 'wave' : tok === 'sec' ? 's' : tok)));
  // Any order and notation (erg/s/cm^2/A, erg s-1 cm-2 Angstrom-1, …): exactly erg, s, cm, Å.
  const cgs = kinds.size === 4 && ['erg', 's', 'cm', 'wave'].every((k) => kinds.has(k)) && tokens.length === 4;
  if (!cgs || !(scale > 0) || !Number.isFinite(scale)) {
    return { ok: false, text, reason: `flux unit "${text}" is not a recognised erg s⁻¹ cm⁻² Å⁻¹ density, so no luminosity` };
  }
  return { ok: true, scale, text };
}

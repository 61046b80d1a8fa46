/**
 * Wavelength units as written in CUNITn, TUNITn, IRAF WAT strings or text headers, and their
 * factor to Å (1 Å = 0.1 nm = 1e-4 µm = 1e-10 m).
 */

export interface WaveUnit {
  /** Name shown to the user ('Å', 'nm', 'µm', 'm', 'cm', 'mm'). */
  name: string;
  toAngstrom: number;
  /** True when the file named no unit and zvet inferred it from the values. */
  assumed: boolean;
  /** When the values would fit another unit as well: which, and how to say so in the file. */
  doubt?: string;
}

const UNITS: Array<[RegExp, string, number]> = [
  [/^(a|aa|å|ang|angs|angstrom|angstroms|ångström|ångströms|0\.1 ?nm|1e-10 ?m)$/, 'Å', 1],
  [/^(nm|nanometer|nanometers|nanometre|nanometres)$/, 'nm', 10],
  [/^(um|µm|μm|micron|microns|micrometer|micrometers|micrometre|micrometres)$/, 'µm', 1e4],
  [/^(mm|millimeter|millimeters)$/, 'mm', 1e7],
  [/^(cm|centimeter|centimeters)$/, 'cm', 1e8],
  [/^(m|meter|meters|metre|metres)$/, 'm', 1e10],
];

/** The unit a text names, or undefined when it names no wavelength unit zvet knows. */
export function parseWaveUnit(text: string): WaveUnit | undefined {
  const t = text.trim().toLowerCase().replace(/^\[|\]$|^\(|\)$/g, '');
  for (const [re, name, toAngstrom] of UNITS) if (re.test(t)) return { name, toAngstrom, assumed: false };
  return undefined;
}

/**
 * Infers the unit of unlabelled wavelengths from their size (common practice, no source):
 * below 1e-4 metres, below 100 µm (0.1–30 µm covers UV to mid-IR), then nm where Å would mean
 * an extreme-ultraviolet spectrum (below), else Å; a doubt is given where another unit fits too.
 */
export function guessWaveUnit(wave: ArrayLike<number>): WaveUnit {
  let max = 0, min = Infinity;
  for (let i = 0; i < wave.length; i++) {
    const w = Math.abs(wave[i]);
    if (w > max) max = w;
    if (w > 0 && w < min) min = w;
  }
  if (max > 0 && max < 1e-4) return { name: 'm', toAngstrom: 1e10, assumed: true };
  // Values between 3 and 4.5 are also what log10 λ/Å of an optical spectrum looks like.
  if (max > 0 && max < 100) return { name: 'µm', toAngstrom: 1e4, assumed: true, ...(min >= 3 && max <= 4.5 ? { doubt: `the wavelengths (${min} – ${max}) are taken as µm; they look like log10 of Å too: if so, the file should say so (DC-FLAG = 1, a -LOG axis or a loglam column)` } : {}) };
  // An optical or near-infrared spectrum in nm ends between about 300 and 2500; in Å only an
  // ultraviolet one does, and one ending below 1000 Å, or reaching from below 900 Å past
  // 1000 Å, would be extreme-ultraviolet work, which no redshift survey does (our judgement, no
  // source): those are nm.
  const nmDoubt = (unit: string, other: string) => `the wavelengths (${min} – ${max}) are taken as ${unit}; if they are ${other}, name the unit in the file, as in wavelength[${other === 'Å' ? 'A' : 'nm'}]`;
  if (max >= 100 && (max < 1000 || (max < 2500 && min < 900))) return { name: 'nm', toAngstrom: 10, assumed: true, doubt: nmDoubt('nm', 'Å') };
  if (max >= 1000 && max < 2500) return { name: 'Å', toAngstrom: 1, assumed: true, doubt: nmDoubt('Å', 'nm') };
  return { name: 'Å', toAngstrom: 1, assumed: true };
}

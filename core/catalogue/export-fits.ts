/**
 * Catalogue as a FITS binary table (one row per spectrum) in the first extension,
 * EXTNAME = 'CATALOGUE': float64 → D, int64 → K, bool → L, text → A (TUNITn units, each
 * column's description in the comment of its TTYPEn card, table meta as header keywords, the
 * table's comments as COMMENT cards wrapped at word boundaries).
 * FITS text is printable ASCII (FITS Standard 4.0, binary-table character fields; from memory), so Greek letters are spelled out
 * (Hα → Halpha), accents dropped, ±, −, Å, ″ and line breaks written in ASCII, and only what is
 * left outside ASCII as '?'; the CSV and ECSV exports keep the full text.
 */
import { writeFits, type ColumnFormat } from '../fits/write.js';
import { checkTable, type ColumnType, type Table } from './table.js';

const COMMENT_WIDTH = 72;
const FORMATS: Record<ColumnType, ColumnFormat> = { float64: 'D', int64: 'K', bool: 'L', string: 'A' };

const GREEK: Record<string, string> = {
  α: 'alpha', β: 'beta', γ: 'gamma', δ: 'delta', ε: 'epsilon', ζ: 'zeta', η: 'eta', θ: 'theta', ι: 'iota', κ: 'kappa',
  λ: 'lambda', μ: 'mu', ν: 'nu', ξ: 'xi', ο: 'omicron', π: 'pi', ρ: 'rho', σ: 'sigma', τ: 'tau', υ: 'upsilon', φ: 'phi',
  χ: 'chi', ψ: 'psi', ω: 'omega', Δ: 'Delta', Λ: 'Lambda', Σ: 'Sigma', Ω: 'Omega', Φ: 'Phi', Ψ: 'Psi', Γ: 'Gamma', Θ: 'Theta',
};
const SYMBOLS: Record<string, string> = { '±': '+/-', '−': '-', '–': '-', '—': '-', '×': 'x', 'Å': 'A', '″': '"', '′': "'", '°': ' deg', '…': '...', '“': '"', '”': '"', '‘': "'", '’': "'", '☉': 'sun' };

function asciiOnly(text: string): string {
  return text
    .replace(/\r?\n/g, ' / ')
    .replace(/[α-ωΑ-Ω]/g, (c) => GREEK[c] ?? c)
    .replace(/[±−–—×Å″′°…“”‘’☉]/g, (c) => SYMBOLS[c])
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^\x20-\x7e]/g, '?');
}

/** COMMENT card texts (at most 72 characters, FITS Standard 4.0 §4.4.2.4), broken between words. */
function commentLines(text: string): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of asciiOnly(text).split(/\s+/).filter(Boolean)) {
    if (line && line.length + 1 + word.length > COMMENT_WIDTH) {
      lines.push(line);
      line = '';
    }
    line = line ? `${line} ${word}` : word;
  }
  if (line) lines.push(line);
  return lines;
}

export function tableToFits(table: Table): Uint8Array {
  checkTable(table);
  return writeFits([
    { type: 'image', axes: [] },
    {
      type: 'bintable',
      cards: [
        { key: 'EXTNAME', value: 'CATALOGUE' },
        ...Object.entries(table.meta).map(([key, value]) => ({ key: key.toUpperCase(), value: asciiOnly(value) })),
        ...(table.comments ?? []).flatMap(commentLines).map((comment) => ({ key: 'COMMENT', comment })),
      ],
      columns: table.columns.map((c, i) => ({
        name: c.name,
        format: FORMATS[c.type],
        unit: c.unit ?? undefined,
        description: asciiOnly(c.description),
        values: table.rows.map((row) => {
          const cell = row[i];
          return typeof cell === 'string' ? asciiOnly(cell) : cell;
        }),
      })),
    },
  ]);
}

// Reads a table file with Debian's astropy (Table.read) and returns it as plain JSON, for the
// catalogue tests: masked, NaN and empty-text cells come back as null.
import { astropyJson } from '../support/tools.js';

export type AstropyCell = string | number | boolean | null;

export interface AstropyTable {
  names: string[];
  units: Record<string, string | null>;
  descriptions: Record<string, string | null>;
  meta: Record<string, string>;
  rows: Record<string, AstropyCell>[];
}

/** format: 'ascii.csv', 'ascii.ecsv' or 'fits' (first extension). */
export function readTableWithAstropy(path: string, format: 'ascii.csv' | 'ascii.ecsv' | 'fits'): AstropyTable {
  return astropyJson<AstropyTable>(
    `
import sys, json, math
import numpy as np
from astropy.table import Table
t = Table.read(sys.argv[1], hdu=1) if sys.argv[2] == 'fits' else Table.read(sys.argv[1], format=sys.argv[2])
def cell(col, i):
    if getattr(col, 'mask', None) is not None and np.ma.getmaskarray(col)[i]:
        return None
    v = col[i]
    if isinstance(v, (bytes, np.bytes_)): v = v.decode()
    if isinstance(v, np.generic): v = v.item()
    if isinstance(v, float) and math.isnan(v): return None
    if isinstance(v, str) and v == '': return None
    return v
print(json.dumps(dict(
    names=t.colnames,
    units={n: (None if t[n].unit is None else t[n].unit.to_string()) for n in t.colnames},
    descriptions={n: t[n].description for n in t.colnames},
    meta={k: str(v) for k, v in t.meta.items()},
    rows=[{n: cell(t[n], i) for n in t.colnames} for i in range(len(t))])))
`,
    [path, format],
  );
}

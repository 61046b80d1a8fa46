import { resolve } from 'node:path';

/** Project root. */
export const ROOT = resolve(__dirname, '../..');
/** The open survey spectra with published redshifts, kept beside the project. */
export const OPEN_SPECTRA = resolve(ROOT, '../shared/spectra-open');
/** The invented demo worklist. */
export const DEMO_WORKLIST = resolve(ROOT, 'sample-spectra');
/** The built command-line program. */
export const ZVET_BIN = resolve(ROOT, 'bin/zvet.js');

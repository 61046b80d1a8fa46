import { resolve } from 'node:path';

/** Project root. */
export const ROOT = resolve(__dirname, '../..');
/** The open survey spectra with published redshifts, kept beside the project. */
export const OPEN_SPECTRA = resolve(ROOT, '../shared/spectra-open');
/** The invented demo worklist (one night of the fictional Kestrel Ridge telescope). */
export const DEMO_WORKLIST = resolve(ROOT, 'sample-spectra/kestrel-2026-03-14');
/** The built command-line program. */
export const ZVET_BIN = resolve(ROOT, 'bin/zvet.js');

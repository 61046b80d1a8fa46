/** The real modules behind the handlers (see services.ts). */
import type { HostServices } from './services.js';

export function defaultServices(): HostServices {
  return {
    openWorklist: null,
    measureFile: null,
    templateModelFlux: null,
    correctFrames: null,
    analyseHost: null,
    writeCatalogue: null,
    close: async () => undefined,
  };
}

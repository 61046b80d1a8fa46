/** The real modules behind the handlers (see services.ts). */
import { Worklist } from '../worklist.js';
import type { HostServices } from './services.js';

export function defaultServices(): HostServices {
  return {
    openWorklist: (target) => Worklist.open(target),
    measureFile: null,
    writeCatalogue: null,
    close: async () => undefined,
  };
}

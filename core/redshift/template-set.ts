/** Which templates a measurement uses, with their z ranges after the options' overrides. */
import { builtInTemplates, fromUserLines, fromUserSpectrum, type Template } from './templates.js';
import type { MeasureOptions } from './types.js';

export interface TemplateUse {
  template: Template;
  zMin: number;
  zMax: number;
}

/** Thrown for an unknown template name or an empty z range (a usage error). */
export class TemplateChoiceError extends Error {}

export function availableTemplates(options: MeasureOptions): Template[] {
  return [
    ...builtInTemplates(),
    ...(options.userLineTemplates ?? []).map(fromUserLines),
    ...(options.userSpectrumTemplates ?? []).map(fromUserSpectrum),
  ];
}

export function resolveTemplates(options: MeasureOptions): TemplateUse[] {
  const all = availableTemplates(options);
  let chosen = all;
  if (options.templates && options.templates.length) {
    chosen = options.templates.map((name) => {
      const t = all.find((x) => x.name === name);
      if (!t) throw new TemplateChoiceError(`unknown template "${name}" (known: ${all.map((x) => x.name).join(', ')})`);
      return t;
    });
  }
  const uses = chosen.map((template) => (template.templateClass === 'star' ? starRange(template, options) : { template, zMin: Math.max(options.zmin ?? template.zMin, -0.5), zMax: options.zmax ?? template.zMax }));
  const usable = uses.filter((u): u is TemplateUse => u !== null && u.zMax > u.zMin);
  if (usable.length === 0) throw new TemplateChoiceError(`empty redshift range ${options.zmin ?? ''}…${options.zmax ?? ''} for every template`);
  return usable;
}

/**
 * --zmin/--zmax replace the galaxy and QSO ranges. A star is at z = 0 plus its own motion, so
 * its window (±0.005, ±1500 km/s) is searched only when the requested range includes z = 0, and
 * only a bound inside the window on its own side of zero (−0.005 < zmin < 0, 0 < zmax < 0.005)
 * narrows it: `--zmin 0` meant for galaxies does not cut off the blueshifted stars.
 */
function starRange(template: Template, options: MeasureOptions): TemplateUse | null {
  const { zmin = -Infinity, zmax = Infinity } = options;
  if (!(zmin <= 0 && zmax >= 0)) return null;
  return { template, zMin: zmin < 0 ? Math.max(template.zMin, zmin) : template.zMin, zMax: zmax > 0 ? Math.min(template.zMax, zmax) : template.zMax };
}

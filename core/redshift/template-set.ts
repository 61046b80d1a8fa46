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
  // Overrides replace the galaxy and QSO ranges; a star's range is only narrowed by them.
  const uses = chosen.map((template) =>
    template.templateClass === 'star'
      ? { template, zMin: Math.max(template.zMin, options.zmin ?? -Infinity), zMax: Math.min(template.zMax, options.zmax ?? Infinity) }
      : { template, zMin: Math.max(options.zmin ?? template.zMin, -0.5), zMax: options.zmax ?? template.zMax },
  );
  const usable = uses.filter((u) => u.zMax > u.zMin);
  if (usable.length === 0) throw new TemplateChoiceError(`empty redshift range ${options.zmin ?? ''}…${options.zmax ?? ''} for every template`);
  return usable;
}

/** `--air` / `--vacuum`: the medium of the wavelengths, overriding what a file says or what zvet assumes for it. */
import type { Command } from 'commander';
import { UsageError } from './usage-error.js';

export interface MediumFlags {
  air?: boolean;
  vacuum?: boolean;
}

/** Adds the two flags; `whose` names the wavelengths meant ("the file's", "every file's"). */
export function withMediumOptions(command: Command, whose: string): Command {
  return command
    .option('--air', `treat ${whose} wavelengths as air, whatever it says`)
    .option('--vacuum', `treat ${whose} wavelengths as vacuum, whatever it says`);
}

export function mediumOption(opts: MediumFlags): 'air' | 'vacuum' | undefined {
  if (opts.air && opts.vacuum) throw new UsageError('--air and --vacuum exclude each other');
  return opts.air ? 'air' : opts.vacuum ? 'vacuum' : undefined;
}

import { Command } from 'commander';
import { registerInspect } from './inspect.js';
import { registerMeasure } from './measure.js';
import { registerServe } from './serve.js';
import { registerCosmo } from './cosmo.js';
import { registerBary } from './bary.js';
import { registerExport } from './export.js';
import { registerLines } from './lines.js';
import { describeFailure, EXIT_USAGE_OR_UNREADABLE, isClosedPipe } from './run-action.js';

// Output piped into a reader that stops early (| head): the failed write itself says so
// (run-action.ts). Any other failure of standard output (redirected to a full disk) is one line.
process.stdout.on('error', (err: NodeJS.ErrnoException) => {
  if (isClosedPipe(err)) return;
  process.stderr.write(`zvet: ${describeFailure(Object.assign(err, { path: err.path ?? 'standard output' }))}\n`);
  process.exit(EXIT_USAGE_OR_UNREADABLE);
});

const program = new Command('zvet')
  .description('Measure and vet redshifts of 1-D spectra. Automatic redshifts are suggestions until a person vets them.')
  .version('0.1.0')
  .exitOverride((err) => {
    process.exit(err.exitCode === 0 ? 0 : EXIT_USAGE_OR_UNREADABLE);
  });

registerInspect(program);
registerMeasure(program);
registerServe(program);
registerCosmo(program);
registerBary(program);
registerExport(program);
registerLines(program);

await program.parseAsync(process.argv);

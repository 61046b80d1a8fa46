// Child process for the crash-safety trials: appends verdicts through the real journal code
// and prints `ack <n>` only after each append has resolved (i.e. after fsync). The parent
// kills it with SIGKILL at a random moment.
import { VerdictJournal } from '../../core/node/journal.js';

const [journalPath, trial, count] = process.argv.slice(2);
const journal = await VerdictJournal.open(journalPath);
for (let i = 0; i < Number(count); i++) {
  await journal.append({
    spectrum: `trial-${trial}/spec-${i}`,
    hdu: 0,
    status: 'revised',
    z: Number(trial) + i / 1000,
    zErr: 1e-4,
    confidence: 'likely',
    objectClass: 'galaxy',
    template: null,
    note: 'x'.repeat(i % 300),
    time: new Date().toISOString(),
    user: 'trial',
  });
  process.stdout.write(`ack ${i}\n`);
}

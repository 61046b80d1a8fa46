/**
 * Verdicts on their way to the journal. A verdict counts as saved only when the host confirms
 * the journal write; until then it is queued. Saves go one at a time, in the order they were
 * made, so the journal's "last one wins" matches what the person did. A failed write stops the
 * queue, keeps the verdict (and everything after it) queued with the reason, and waits for a retry.
 */
import type { VerdictInput } from '../../core/api/host-api.js';
import type { Verdict } from '../../core/catalogue/verdict.js';

export interface QueuedSave {
  input: VerdictInput;
  state: 'queued' | 'saving' | 'failed';
  reason: string | null;
}

export interface SaveQueueEvents {
  /** The host confirmed the journal write of this verdict. */
  saved(verdict: Verdict, input: VerdictInput): void;
  /** Anything in the queue changed (for the save-state display). */
  changed(queue: readonly QueuedSave[]): void;
}

export class SaveQueue {
  private readonly items: QueuedSave[] = [];
  private running = false;

  constructor(
    private readonly write: (input: VerdictInput) => Promise<{ verdict: Verdict }>,
    private readonly events: SaveQueueEvents,
  ) {}

  get pending(): readonly QueuedSave[] {
    return this.items;
  }

  get failed(): QueuedSave | null {
    return this.items.find((q) => q.state === 'failed') ?? null;
  }

  /** Queues a verdict and starts writing unless an earlier write failed. */
  enqueue(input: VerdictInput): Promise<void> {
    this.items.push({ input, state: 'queued', reason: null });
    this.events.changed(this.items);
    return this.failed ? Promise.resolve() : this.run();
  }

  /** Tries the failed write (and the ones behind it) again. */
  retry(): Promise<void> {
    for (const q of this.items) if (q.state === 'failed') {
      q.state = 'queued';
      q.reason = null;
    }
    this.events.changed(this.items);
    return this.run();
  }

  private async run(): Promise<void> {
    if (this.running) return;
    this.running = true;
    try {
      while (this.items.length > 0) {
        const head = this.items[0];
        head.state = 'saving';
        this.events.changed(this.items);
        try {
          const { verdict } = await this.write(head.input);
          this.items.shift();
          this.events.saved(verdict, head.input);
          this.events.changed(this.items);
        } catch (err) {
          head.state = 'failed';
          head.reason = (err as Error).message;
          this.events.changed(this.items);
          return;
        }
      }
    } finally {
      this.running = false;
    }
  }
}

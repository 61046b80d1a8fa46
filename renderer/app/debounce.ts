/**
 * Runs the latest request after a quiet spell and drops answers that arrive for an older one,
 * so live panels follow z without flooding the host or showing a stale result.
 */
export class LatestOnly<Req, Res> {
  private timer: ReturnType<typeof setTimeout> | null = null;
  private generation = 0;

  constructor(
    private readonly delayMs: number,
    private readonly call: (req: Req) => Promise<Res>,
    private readonly deliver: (res: { ok: true; value: Res; req: Req } | { ok: false; error: string; req: Req }) => void,
  ) {}

  request(req: Req): void {
    if (this.timer) clearTimeout(this.timer);
    const gen = ++this.generation;
    this.timer = setTimeout(() => {
      this.timer = null;
      this.call(req).then(
        (value) => gen === this.generation && this.deliver({ ok: true, value, req }),
        (err: Error) => gen === this.generation && this.deliver({ ok: false, error: err.message, req }),
      );
    }, this.delayMs);
  }

  cancel(): void {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    this.generation++;
  }
}

export interface LanePumpOptions {
  /** One pass: claims and handles the lane's jobs until there is nothing (or no room) left. */
  drain: () => Promise<void>;
  /** True once the owner shuts down: no pass starts, and no pass is repeated. */
  stopping: () => boolean;
  /** A pass that threw (the pump itself stays usable). */
  onError: (error: unknown) => void;
}

/**
 * Runs a queue lane's passes one at a time. A `run()` while a pass is under way asks for one
 * more pass after it, since a job queued meanwhile may have come after the pass last looked;
 * so a burst of "job queued" events costs at most one extra pass and no job waits for the next.
 */
export class LanePump {
  private pass: Promise<void> | null = null;
  private again = false;

  constructor(private readonly options: LanePumpOptions) {}

  run(): void {
    if (this.options.stopping()) return;
    if (this.pass !== null) {
      this.again = true;
      return;
    }
    this.pass = (async () => {
      do {
        this.again = false;
        await this.options.drain();
      } while (this.again && !this.options.stopping());
    })()
      .catch(this.options.onError)
      .finally(() => {
        this.pass = null;
      });
  }

  /** Resolves when the pass under way (if any) has ended. */
  async settled(): Promise<void> {
    await this.pass;
  }
}

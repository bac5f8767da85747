/**
 * At most `limit` holders at once; the rest wait in order. A waiter gives up after `waitMs` (the
 * caller answers "busy, try again" rather than queue without end). Pure: no I/O, one per process.
 */
export class Semaphore {
  private active = 0;
  private readonly waiting: { grant: () => void; timer: ReturnType<typeof setTimeout> }[] = [];

  constructor(readonly limit: number) {}

  get inUse() {
    return this.active;
  }

  get queued() {
    return this.waiting.length;
  }

  /** Resolves with a release function, or with undefined when the wait ran out. */
  acquire(waitMs: number): Promise<(() => void) | undefined> {
    if (this.active < this.limit) {
      this.active++;
      return Promise.resolve(this.releaser());
    }
    return new Promise((resolve) => {
      const entry = {
        grant: () => resolve(this.releaser()),
        timer: setTimeout(() => {
          const i = this.waiting.indexOf(entry);
          if (i >= 0) this.waiting.splice(i, 1);
          resolve(undefined);
        }, waitMs),
      };
      this.waiting.push(entry);
    });
  }

  private releaser() {
    let released = false;
    return () => {
      if (released) return;
      released = true;
      const next = this.waiting.shift();
      if (next) {
        clearTimeout(next.timer);
        next.grant(); // the slot passes straight to the next waiter
      } else {
        this.active--;
      }
    };
  }
}

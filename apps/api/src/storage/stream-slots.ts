import { Inject, Injectable } from '@nestjs/common';
import { ENV, type Env } from '../config/env.js';

/** At most `size` holders at a time; the others wait in arrival order. */
export class Slots {
  private free: number;
  private readonly waiting: (() => void)[] = [];

  constructor(size: number) {
    this.free = size;
  }

  /** Resolves with the slot's release (idempotent) once a slot is free. */
  async acquire(): Promise<() => void> {
    if (this.free > 0) this.free -= 1;
    else await new Promise<void>((resolve) => this.waiting.push(resolve));
    let released = false;
    return () => {
      if (released) return;
      released = true;
      const next = this.waiting.shift();
      if (next) next();
      else this.free += 1;
    };
  }
}

/**
 * The slots of the work that streams a whole file through the API: an upload (a radiograph, a
 * scan file) while it reads the body and sends it to S3 (a 5 MB part buffer), a radiograph preview
 * job while it reads the stored file and decodes it (up to about 15 MB). One set for the process:
 * the slots, not the number of clients or kinds of file, bound the memory this takes; a waiting
 * upload reads nothing (its body waits in the socket: TCP back-pressure) and a waiting preview job
 * just waits.
 */
@Injectable()
export class StreamSlots extends Slots {
  constructor(@Inject(ENV) env: Env) {
    super(env.RADIOGRAPH_STREAM_SLOTS);
  }
}

import { Injectable } from '@nestjs/common';

/**
 * "Today" for the recall module (future-date checks, overdue days, the reminder scan), as a
 * UTC calendar date. Injectable so tests can pin the day: `app.get(RecallClock).pin('2026-05-01')`.
 */
@Injectable()
export class RecallClock {
  private pinned: string | null = null;

  today(): string {
    return this.pinned ?? new Date().toISOString().slice(0, 10);
  }

  /** Pins "today" (null un-pins). For tests and demos only. */
  pin(day: string | null): void {
    this.pinned = day;
  }
}
